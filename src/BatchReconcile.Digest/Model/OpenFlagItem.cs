using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Digest.Model;

/// <summary>A flag raised on an earlier production day that is still waiting for a decision.</summary>
/// <param name="Day">The production day the flag was raised for.</param>
/// <param name="AgeDays">Whole production days between <paramref name="Day"/> and the digest's day.</param>
public sealed record OpenFlagItem(
    long FlagId,
    string BatchId,
    string Step,
    FlagCode Code,
    FlagSeverity Severity,
    DateOnly Day,
    int AgeDays,
    ReviewStatus Review)
{
    public int AgeDays { get; } = AgeDays >= 1
        ? AgeDays
        : throw new ArgumentOutOfRangeException(nameof(AgeDays), AgeDays, "A flag from an earlier day is at least one day old.");

    public ReviewStatus Review { get; } = Review.State != ReviewState.Closed
        ? Review
        : throw new ArgumentException("A closed flag is not an open item.", nameof(Review));
}
