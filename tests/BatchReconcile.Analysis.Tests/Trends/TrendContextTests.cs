using BatchReconcile.Analysis.Trends;

namespace BatchReconcile.Analysis.Tests.Trends;

public class TrendContextTests
{
    public static TheoryData<double[], string> Lines() => new()
    {
        // The contract's example: 3 of the last 5 below, not all in one run.
        { [91, 89, 92, 88, 89.5], "3rd of the last 5 batches below the centre line" },
        { [91, 92, 89, 88, 89.5], "3rd batch in a row below the centre line" },
        { [89, 89, 89, 89, 89, 89, 89], "7th batch in a row below the centre line" },
        { [89, 91], "1st of the last 2 batches above the centre line" },
        { [91, 91], "2nd batch in a row above the centre line" },
        { [91, 89, 91, 89, 91, 89], "3rd of the last 5 batches below the centre line" },
        { [91, 91, 91, 91, 89], "1st of the last 5 batches below the centre line" },
        { [89, 90], "the latest batch is on the centre line" },
    };

    [Theory]
    [MemberData(nameof(Lines))]
    public void Describes_the_latest_value_in_its_recent_run(double[] values, string expected) =>
        Assert.Equal(expected, TrendContext.Describe(values, centre: 90));

    [Fact]
    public void The_window_sets_how_far_back_it_counts()
    {
        double[] values = [89, 91, 89, 91, 89, 89];

        Assert.Equal("4th of the last 6 batches below the centre line", TrendContext.Describe(values, 90, window: 10));
        Assert.Equal("2nd batch in a row below the centre line", TrendContext.Describe(values, 90, window: 3));
    }

    [Fact]
    public void Fewer_than_two_values_say_nothing()
    {
        Assert.Null(TrendContext.Describe([], 90));
        Assert.Null(TrendContext.Describe([85], 90));
    }

    [Theory]
    [InlineData(1, "1st")]
    [InlineData(2, "2nd")]
    [InlineData(3, "3rd")]
    [InlineData(4, "4th")]
    [InlineData(11, "11th")]
    [InlineData(12, "12th")]
    [InlineData(13, "13th")]
    [InlineData(21, "21st")]
    [InlineData(102, "102nd")]
    [InlineData(111, "111th")]
    public void Ordinals_follow_English_usage(int number, string expected) =>
        Assert.Equal(expected, TrendContext.Ordinal(number));

    [Fact]
    public void Bad_arguments_are_refused()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => TrendContext.Describe([1, 2], 0, window: 1));
        Assert.Throws<ArgumentOutOfRangeException>(() => TrendContext.Describe([1, 2], double.NaN));
        Assert.Throws<ArgumentException>(() => TrendContext.Describe([1, double.NaN], 0));
    }
}
