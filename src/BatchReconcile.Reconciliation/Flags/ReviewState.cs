namespace BatchReconcile.Reconciliation.Flags;

/// <summary>Where a flag stands in QA review (text forms <c>open</c>, <c>in-review</c>, <c>closed</c>).</summary>
public enum ReviewState
{
    Open,
    InReview,
    Closed,
}
