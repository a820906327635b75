using BatchReconcile.Reconciliation.Flags;
namespace BatchReconcile.Storage.Review;

/// <summary>A flag's review as it stands (its history is in the audit trail).</summary>
/// <param name="Outcome">Set while closed; null otherwise.</param>
/// <param name="Note">The note of the last change.</param>
/// <param name="DeviationRef">The deviation's reference while closed with <see cref="CloseOutcome.Deviation"/>.</param>
/// <param name="By">Who made the last change, as typed (free text, no login), or <c>system</c>.</param>
/// <param name="At">When the last change was made; null while the flag was never reviewed.</param>
public sealed record FlagReview(ReviewState State, CloseOutcome? Outcome, string? Note, string? DeviationRef, string? By, DateTimeOffset? At)
{
    public static FlagReview Unreviewed { get; } = new(ReviewState.Open, null, null, null, null, null);
}
