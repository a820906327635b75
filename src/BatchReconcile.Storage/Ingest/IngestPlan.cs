namespace BatchReconcile.Storage.Ingest;

/// <summary>
/// What committing a file would do, judged against the store as it is now. A preview: the commit
/// judges again inside its transaction (other files may be committed in between).
/// </summary>
/// <param name="KnownAs">The file's first ingest entry when the same content was seen before; then <paramref name="Batches"/> is empty.</param>
public sealed record IngestPlan(KnownFile? KnownAs, IReadOnlyList<BatchPlan> Batches)
{
    /// <summary>True when committing would store nothing: the file was seen, or every batch is unchanged.</summary>
    public bool IsDuplicate =>
        KnownAs is not null || (Batches.Count > 0 && Batches.All(b => b.Disposition == BatchDisposition.Unchanged));
}
