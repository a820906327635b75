using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Storage.Review;

namespace BatchReconcile.Storage.Queries;

/// <summary>One line of <c>flags list</c> (and of the digest's exception list).</summary>
public sealed record FlagListItem(
    long Id,
    string BatchId,
    int Revision,
    string Step,
    FlagCode Code,
    FlagSeverity Severity,
    FlagReview Review,
    DateOnly ProductionDay,
    string Message,
    double? Measured,
    double? Limit,
    string Unit,
    string? Subject,
    bool IsCurrent,
    string Recipe)
{
    /// <summary>The review state as text: <c>open</c>, <c>in-review</c> or <c>closed</c> (the <c>state</c> of <c>flags list --json</c>).</summary>
    public string State => Review.State.ToText();
}
