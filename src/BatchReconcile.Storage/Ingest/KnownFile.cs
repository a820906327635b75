namespace BatchReconcile.Storage.Ingest;

/// <summary>The first ingest log entry of a file's content: what was done with it, and when.</summary>
public sealed record KnownFile(long IngestId, string FileName, string Sha256, IngestOutcome Outcome, int ErrorCount, DateTimeOffset ProcessedAt);
