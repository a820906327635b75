namespace BatchReconcile.Storage.Audit;

/// <summary>Why an audit entry does not verify.</summary>
public enum AuditProblem
{
    /// <summary>The entry's content no longer gives its stored hash: it was changed after it was written.</summary>
    ContentHashMismatch,

    /// <summary>The entry's previous-hash is not the hash of the entry before it.</summary>
    PreviousHashLinkBroken,

    /// <summary>Ids jump: entries before this one are missing.</summary>
    GapInIds,

    /// <summary>The id sequence went further than the last entry: entries at the end are missing.</summary>
    MissingAtEnd,

    /// <summary>The chain verifies, but a live table (a flag's review, a batch's current revision) is not what the chain implies.</summary>
    LiveStateDiffers,
}
