using BatchReconcile.Reconciliation.Flags;
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

    /// <summary>"open", "in-review" or "closed: explained" (the outcome after the state).</summary>
    public string ToText() => Outcome is { } outcome ? $"{State.ToText()}: {outcome.ToText()}" : State.ToText();
}
