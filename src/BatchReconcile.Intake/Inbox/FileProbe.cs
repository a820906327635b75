namespace BatchReconcile.Intake.Inbox;

/// <summary>The real file system behind <see cref="IFileProbe"/>.</summary>
internal sealed class FileProbe : IFileProbe
{
    public static readonly FileProbe Instance = new();

    private FileProbe()
    {
    }

    public bool TryStat(string path, out long size, out DateTimeOffset lastWriteUtc)
    {
        var info = new FileInfo(path);
        // Exists is false for folders; symbolic links are skipped because moving one would archive the link, not the data.
        if (!info.Exists || (info.Attributes & FileAttributes.ReparsePoint) != 0)
        {
            size = 0;
            lastWriteUtc = default;
            return false;
        }

        size = info.Length;
        lastWriteUtc = new DateTimeOffset(info.LastWriteTimeUtc, TimeSpan.Zero);
        return true;
    }

    public bool CanOpenExclusively(string path)
    {
        // FileShare.None: on Windows a real share-mode lock. On Linux and macOS .NET emulates it with an
        // advisory flock, which only other .NET processes (and programs that use flock) respect; a plain
        // writer is not stopped by it. The settle rule is what really protects against a slow writer.
        try
        {
            using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.None, bufferSize: 1);
            return true;
        }
        catch (IOException)
        {
            return false;
        }
        catch (UnauthorizedAccessException)
        {
            return false;
        }
    }
}
