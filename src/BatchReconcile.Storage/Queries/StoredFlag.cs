using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Storage.Review;

namespace BatchReconcile.Storage.Queries;

/// <summary>A flag as stored: the finding, its id (shown to people) and its review.</summary>
/// <param name="IsCurrent">False once its revision has been superseded by a re-export.</param>
public sealed record StoredFlag(long Id, Flag Flag, FlagReview Review, DateOnly ProductionDay, bool IsCurrent, DateTimeOffset CreatedAt)
{
    /// <summary>The review state as text: <c>open</c>, <c>in-review</c> or <c>closed</c>.</summary>
    public string State => Review.State.ToText();
}
