namespace BatchReconcile.Digest.Model;

/// <summary>A flag's review state, with the outcome when it is closed.</summary>
public sealed record ReviewStatus(ReviewState State, CloseOutcome? Outcome = null)
{
    public CloseOutcome? Outcome { get; } = (State == ReviewState.Closed) == (Outcome is not null)
        ? Outcome
        : throw new ArgumentException("A closed flag has an outcome; an open or in-review flag has none.", nameof(Outcome));

    public static ReviewStatus Open { get; } = new(ReviewState.Open);

    public static ReviewStatus InReview { get; } = new(ReviewState.InReview);

    public static ReviewStatus Closed(CloseOutcome outcome) => new(ReviewState.Closed, outcome);

    /// <summary>The text shown in the digest, e.g. "open", "in-review", "closed: deviation".</summary>
    public string ToText() => State switch
    {
        ReviewState.Open => "open",
        ReviewState.InReview => "in-review",
        ReviewState.Closed => "closed: " + Outcome switch
        {
            CloseOutcome.Explained => "explained",
            CloseOutcome.Deviation => "deviation",
            CloseOutcome.Corrected => "corrected",
            CloseOutcome.Superseded => "superseded",
            _ => throw new InvalidOperationException($"Unknown close outcome {Outcome}."),
        },
        _ => throw new InvalidOperationException($"Unknown review state {State}."),
    };
}
