using BatchReconcile.Storage.Audit;

namespace BatchReconcile.Storage.Queries;

/// <summary>
/// One flag with what decided it (<c>flags show</c>): the flag, its step's figures and the limits stored with them,
/// the batch revision it belongs to, and its review history from the audit trail.
/// </summary>
/// <param name="Step">The step as stored; its <see cref="StoredStep.Flags"/> are every flag of that step, this one included.</param>
/// <param name="SupersededByRevision">The revision that replaced the flag's revision; null while it is current.</param>
/// <param name="History">The audit entries about the flag (<c>flag:ID</c>), oldest first: every review change, the system's included.</param>
public sealed record FlagDetail(
    StoredFlag Flag,
    string BatchId,
    int Revision,
    string Recipe,
    int RecipeVersion,
    DateOnly ProductionDay,
    int? SupersededByRevision,
    StoredStep Step,
    IReadOnlyList<AuditEntry> History);
