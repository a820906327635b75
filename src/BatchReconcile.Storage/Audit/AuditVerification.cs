namespace BatchReconcile.Storage.Audit;

/// <summary>The result of walking the audit chain (<c>audit verify</c>).</summary>
/// <param name="EntriesChecked">Entries that verified before the walk stopped (all of them when intact).</param>
/// <param name="FirstBadId">The first entry that does not verify; null when intact. With <see cref="AuditProblem.LiveStateDiffers"/>, the
/// entry that implies the first differing value (null when the value should be the one stored at ingest and no entry changed it).</param>
/// <param name="LastHash">The hash of the last entry that verified (64 zeros when none): worth noting outside the database, since
/// entries cut off the end together with the id sequence cannot be seen from inside it.</param>
/// <param name="Message">One line for people: success with the count, or the entry and what is wrong with it.</param>
public sealed record AuditVerification(bool Intact, long EntriesChecked, long? FirstBadId, AuditProblem? Problem, string LastHash, string Message)
{
    /// <summary>Every live value that differs from what the trail implies (only when the chain itself verifies).</summary>
    public IReadOnlyList<LiveStateDifference> Differences { get; init; } = [];
}
