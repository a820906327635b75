using BatchReconcile.Records.Exports;
using BatchReconcile.Storage.Ingest;

namespace BatchReconcile.Pipeline;

/// <summary>What became of one file: the entry of <c>ingest --json</c>, plus where the file went.</summary>
/// <param name="Outcome">stored, revision, duplicate or quarantined.</param>
/// <param name="MovedTo">Where the original file now is (archive or quarantine).</param>
/// <param name="ReportPath">The quarantine report, for a quarantined file.</param>
public sealed record FileOutcome(
    string File,
    string Sha256,
    IngestOutcome Outcome,
    IReadOnlyList<BatchCommitResult> Batches,
    IReadOnlyList<ExportError> Errors,
    string MovedTo,
    string? ReportPath);
