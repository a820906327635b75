using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Digest.Model;
using BatchReconcile.Digest.Tests.Support;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Digest.Tests.Model;

/// <summary>The model is filled by the host; contradictory data is a bug there and throws here.</summary>
public class ModelValidationTests
{
    private static readonly DateTimeOffset Start = new(2026, 11, 25, 6, 0, 0, TimeSpan.FromHours(1));

    [Fact]
    public void A_day_that_ends_before_it_starts_is_refused() =>
        Assert.Throws<ArgumentException>(() => new DigestDay(new DateOnly(2026, 11, 25), "Europe/Berlin", Start, Start));

    [Fact]
    public void A_day_without_a_time_zone_is_refused() =>
        Assert.Throws<ArgumentException>(() => new DigestDay(new DateOnly(2026, 11, 25), " ", Start, Start.AddHours(24)));

    [Fact]
    public void Fewer_open_flags_counted_than_listed_is_refused()
    {
        var data = SeededDigest.Create();
        Assert.Throws<ArgumentException>(() => new DigestData(data.SiteName, data.Day, data.GeneratedAt, 1, 1, 2, data.OpenEarlier, [], [], []));
    }

    [Theory]
    [InlineData(ReviewState.Closed, null)]
    [InlineData(ReviewState.Open, CloseOutcome.Explained)]
    [InlineData(ReviewState.InReview, CloseOutcome.Superseded)]
    public void A_review_status_has_an_outcome_exactly_when_closed(ReviewState state, CloseOutcome? outcome) =>
        Assert.Throws<ArgumentException>(() => new ReviewStatus(state, outcome));

    [Theory]
    [InlineData(ReviewState.Open, null, "open")]
    [InlineData(ReviewState.InReview, null, "in-review")]
    [InlineData(ReviewState.Closed, CloseOutcome.Deviation, "closed: deviation")]
    [InlineData(ReviewState.Closed, CloseOutcome.Superseded, "closed: superseded")]
    public void Review_text_uses_our_state_names(ReviewState state, CloseOutcome? outcome, string expected) =>
        Assert.Equal(expected, new ReviewStatus(state, outcome).ToText());

    [Fact]
    public void More_than_thirty_batches_of_history_is_refused()
    {
        var history = Enumerable.Range(0, 31).Select(i => new YieldPoint("B" + i, new DateOnly(2026, 11, 1), 90, false)).ToList();
        Assert.Throws<ArgumentException>(() => new RecipeStepYields("PX-204", "S1", "Amide coupling", 85, 96, history));
    }

    [Fact]
    public void Reversed_yield_limits_are_refused() =>
        Assert.Throws<ArgumentException>(() => new RecipeStepYields("PX-204", "S1", "Amide coupling", 96, 85, []));

    [Fact]
    public void An_open_item_from_an_earlier_day_is_at_least_a_day_old_and_not_closed()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() =>
            new OpenFlagItem(1, "B1", "S1", FlagCode.YieldLow, FlagSeverity.Major, new DateOnly(2026, 11, 25), 0, ReviewStatus.Open));
        Assert.Throws<ArgumentException>(() =>
            new OpenFlagItem(1, "B1", "S1", FlagCode.YieldLow, FlagSeverity.Major, new DateOnly(2026, 11, 20), 5, ReviewStatus.Closed(CloseOutcome.Corrected)));
    }
}
