namespace BatchReconcile.Storage.Review;

/// <summary>What became of a review change: done (the flag's new review and its audit entry) or refused with the reason.</summary>
public sealed record ReviewResult
{
    private ReviewResult(long flagId, FlagReview? review, long? auditId, ReviewRefusal? refusal, string? reason)
    {
        FlagId = flagId;
        Review = review;
        AuditId = auditId;
        Refusal = refusal;
        Reason = reason;
    }

    public long FlagId { get; }

    /// <summary>The flag's review after the change; null when refused.</summary>
    public FlagReview? Review { get; }

    /// <summary>The audit entry written for the change; null when refused.</summary>
    public long? AuditId { get; }

    public ReviewRefusal? Refusal { get; }

    /// <summary>One sentence for people saying why the change was refused, naming the flag once (the CLI prints it as it is and exits 2).</summary>
    public string? Reason { get; }

    public bool Accepted => Refusal is null;

    public static ReviewResult Done(long flagId, FlagReview review, long auditId) => new(flagId, review, auditId, null, null);

    public static ReviewResult Refused(long flagId, ReviewRefusal refusal, string reason) => new(flagId, null, null, refusal, reason);
}
