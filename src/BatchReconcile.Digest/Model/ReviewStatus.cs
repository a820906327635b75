using BatchReconcile.Reconciliation.Flags;
namespace BatchReconcile.Digest.Model;

/// <summary>A flag's review state, with the outcome when it is closed, the deviation reference and who decided.</summary>
/// <param name="DeviationRef">The deviation's reference while closed as a deviation; null otherwise.</param>
/// <param name="By">Who made the last review decision (free text as typed, or <c>system</c>); null while never reviewed.</param>
public sealed record ReviewStatus(ReviewState State, CloseOutcome? Outcome = null, string? DeviationRef = null, string? By = null)
{
    public CloseOutcome? Outcome { get; } = (State == ReviewState.Closed) == (Outcome is not null)
        ? Outcome
        : throw new ArgumentException("A closed flag has an outcome; an open or in-review flag has none.", nameof(Outcome));

    public string? DeviationRef { get; } = string.IsNullOrWhiteSpace(DeviationRef) ? null : DeviationRef.Trim();

    public string? By { get; } = string.IsNullOrWhiteSpace(By) ? null : By.Trim();

    public static ReviewStatus Open { get; } = new(ReviewState.Open);

    public static ReviewStatus InReview { get; } = new(ReviewState.InReview);

    public static ReviewStatus Closed(CloseOutcome outcome) => new(ReviewState.Closed, outcome);

    /// <summary>"open", "in-review" or "closed: explained" (the outcome after the state).</summary>
    public string ToText() => Outcome is { } outcome ? $"{State.ToText()}: {outcome.ToText()}" : State.ToText();

    /// <summary>
    /// The review column of the digest: the state, the deviation reference and who decided, e.g.
    /// "closed: deviation DEV-2026-0142, by A. Chen" or "in-review, by B. Okafor"; "open" while never reviewed.
    /// </summary>
    public string Describe()
    {
        var text = ToText();
        if (DeviationRef is { } reference)
        {
            text += " " + reference;
        }

        return By is { } by ? $"{text}, by {by}" : text;
    }
}
