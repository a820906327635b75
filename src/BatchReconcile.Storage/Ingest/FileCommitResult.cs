using BatchReconcile.Records.Exports;

namespace BatchReconcile.Storage.Ingest;

/// <summary>What became of one file of a group commit.</summary>
/// <param name="Outcome">Null when the file failed: nothing of it was stored and <paramref name="Failure"/> says why.</param>
/// <param name="IngestId">The ingest log entry written for it; null when it failed.</param>
/// <param name="Batches">Per batch only its id, disposition, revision and flag ids, so that a large
/// file's result stays small.</param>
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

    /// <summary>The file's contract errors: those it was given as quarantined, or those a streamed
    /// file's producer found (then nothing of it was stored and it is quarantined). Empty otherwise.</summary>
    public IReadOnlyList<ExportError> Errors { get; init; } = [];

    /// <summary>The quarantine report that goes with <see cref="Errors"/>, when there is one.</summary>
    public string? Report { get; init; }

    /// <summary>
    /// Set when another instance on the same store and inbox stored this very file (same name, same bytes) after
    /// this one had picked it up: nothing was recorded for it here, not even a duplicate sighting, and the file is
    /// left to the instance that stored it (which archives it).
    /// </summary>
    public KnownFile? TakenBy { get; init; }
}
