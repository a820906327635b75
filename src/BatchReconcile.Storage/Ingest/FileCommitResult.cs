namespace BatchReconcile.Storage.Ingest;

/// <summary>What became of one file of a group commit.</summary>
/// <param name="Outcome">Null when the file failed: nothing of it was stored and <paramref name="Failure"/> says why.</param>
/// <param name="IngestId">The ingest log entry written for it; null when it failed.</param>
public sealed record FileCommitResult(
    string FileName,
    string Sha256,
    IngestOutcome? Outcome,
    long? IngestId,
    IReadOnlyList<BatchCommitResult> Batches,
    int ErrorCount,
    Exception? Failure)
{
    public bool Committed => Outcome is not null;
}
