namespace BatchReconcile.Storage.Digests;

/// <summary>Every write of one day's digest, oldest first (the first is never a rewrite).</summary>
public sealed record DigestRecord(DateOnly Day, IReadOnlyList<DigestWrite> Writes)
{
    public DigestWrite First => Writes[0];

    public DigestWrite Latest => Writes[^1];

    public int RewriteCount => Writes.Count - 1;
}
