namespace BatchReconcile.Storage.Ingest;

/// <summary>What became of one export file (the <c>outcome</c> of <c>ingest --json</c>).</summary>
public enum IngestOutcome
{
    /// <summary>Its batches were stored, none of them a re-export of a stored batch with changes.</summary>
    Stored,

    /// <summary>At least one of its batches was stored as a new revision of a batch already stored.</summary>
    Revision,

    /// <summary>Nothing new: the same file was seen before, or every batch in it equals its stored revision.</summary>
    Duplicate,

    /// <summary>The file broke the export contract; only the ingest log entry was stored.</summary>
    Quarantined,
}
