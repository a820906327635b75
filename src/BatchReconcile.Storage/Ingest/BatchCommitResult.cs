namespace BatchReconcile.Storage.Ingest;

/// <summary>What was stored for one batch of a committed file.</summary>
/// <param name="Revision">The batch's current revision after the commit.</param>
/// <param name="FlagIds">Ids of the flags stored with a new revision (empty when unchanged).</param>
public sealed record BatchCommitResult(string BatchId, BatchDisposition Disposition, int Revision, IReadOnlyList<long> FlagIds);
