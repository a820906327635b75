namespace BatchReconcile.Storage.Ingest;

/// <summary>The text forms of <see cref="IngestOutcome"/>, as stored and as printed ("stored", "revision" ...).</summary>
public static class IngestOutcomeText
{
    public static string ToText(this IngestOutcome outcome) => outcome switch
    {
        IngestOutcome.Stored => "stored",
        IngestOutcome.Revision => "revision",
        IngestOutcome.Duplicate => "duplicate",
        IngestOutcome.Quarantined => "quarantined",
        _ => throw new ArgumentOutOfRangeException(nameof(outcome), outcome, null),
    };

    /// <summary>"new", "revision", "unchanged": as the audit trail lists a file's batches and the log names them.</summary>
    public static string ToText(this BatchDisposition disposition) => disposition switch
    {
        BatchDisposition.New => "new",
        BatchDisposition.Revision => "revision",
        BatchDisposition.Unchanged => "unchanged",
        _ => throw new ArgumentOutOfRangeException(nameof(disposition), disposition, null),
    };

    public static IngestOutcome Parse(string text) => text switch
    {
        "stored" => IngestOutcome.Stored,
        "revision" => IngestOutcome.Revision,
        "duplicate" => IngestOutcome.Duplicate,
        "quarantined" => IngestOutcome.Quarantined,
        _ => throw new InvalidDataException($"Unknown ingest outcome '{text}' in the database."),
    };
}
