namespace BatchReconcile.Digest.Model;

/// <summary>Where a flag stands in QA review (text forms: open, in-review, closed).</summary>
public enum ReviewState
{
    Open,
    InReview,
    Closed,
}
