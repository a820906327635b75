namespace BatchReconcile.Storage.Ingest;

/// <summary>What committing one batch would do.</summary>
/// <param name="Revision">The revision it would become, or for <see cref="BatchDisposition.Unchanged"/> the stored revision it equals.</param>
/// <param name="ContentSha256">Its <see cref="BatchContentHash"/>.</param>
public sealed record BatchPlan(string BatchId, BatchDisposition Disposition, int Revision, string ContentSha256);
