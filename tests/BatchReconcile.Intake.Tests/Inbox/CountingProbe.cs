using BatchReconcile.Intake.Inbox;

namespace BatchReconcile.Intake.Tests.Inbox;

/// <summary>The real file system, counting every stat and exclusive-open attempt.</summary>
internal sealed class CountingProbe : IFileProbe
{
    private readonly IFileProbe _inner = FileProbe.Instance;
    private int _looks;

    public int Looks => Volatile.Read(ref _looks);

    public void Reset() => Interlocked.Exchange(ref _looks, 0);

    public bool TryStat(string path, out long size, out DateTimeOffset lastWriteUtc)
    {
        Interlocked.Increment(ref _looks);
        return _inner.TryStat(path, out size, out lastWriteUtc);
    }

    public bool CanOpenExclusively(string path)
    {
        Interlocked.Increment(ref _looks);
        return _inner.CanOpenExclusively(path);
    }
}
