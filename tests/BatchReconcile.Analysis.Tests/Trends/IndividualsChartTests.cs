using BatchReconcile.Analysis.Trends;

namespace BatchReconcile.Analysis.Tests.Trends;

public class IndividualsChartTests
{
    // NIST/SEMATECH e-Handbook of Statistical Methods, section 6.3.2.2 "Individuals Control Charts": flow
    // rate of the first ten batches of a new process. The ten values are from memory; they reproduce the
    // section's published results, which were read in a stored secondary copy: X̄ = 50.81, MRbar = 1.8778,
    // UCL = 55.8041, LCL = 45.8159. d2 = 1.128 and D4 = 3.267 are the n = 2 constants of section 6.3.2.
    private static readonly double[] FlowRate = [49.6, 47.6, 49.9, 51.3, 47.8, 51.2, 52.6, 52.4, 53.6, 52.1];

    [Fact]
    public void Limits_match_the_NIST_flow_rate_example()
    {
        var chart = IndividualsChart.Build(FlowRate, 0, 10);
        var limits = chart.Limits;

        Assert.Equal(50.81, Math.Round(limits.Mean, 2));
        Assert.Equal(1.8778, Math.Round(limits.MeanMovingRange, 4));
        Assert.Equal(55.8041, Math.Round(limits.Ucl, 4));
        Assert.Equal(45.8159, Math.Round(limits.Lcl, 4));
        Assert.Equal(3.267 * limits.MeanMovingRange, limits.MovingRangeUcl, 12);
        Assert.Equal(6.1347, Math.Round(limits.MovingRangeUcl, 4));
        Assert.Equal(limits.MeanMovingRange / 1.128, limits.Sigma, 14);
        Assert.Equal((0, 10), (limits.BaselineStart, limits.BaselineCount));
        Assert.All(chart.Points, p => Assert.Empty(p.Signals));
    }

    [Fact]
    public void Points_carry_their_moving_ranges()
    {
        var chart = IndividualsChart.Build(FlowRate, 0, 10);

        Assert.Null(chart.Points[0].MovingRange);
        Assert.Equal(2.0, chart.Points[1].MovingRange!.Value, 12);
        Assert.Equal(3.5, chart.Points[4].MovingRange!.Value, 12);
        Assert.Equal(Enumerable.Range(0, 10), chart.Points.Select(p => p.Index));
    }

    [Fact]
    public void Baseline_limits_judge_the_points_after_it()
    {
        double[] values = [.. FlowRate, 50.9, 58.0];

        var chart = IndividualsChart.Build(values, 0, 10);

        Assert.Equal(55.8041, Math.Round(chart.Limits.Ucl, 4));
        Assert.Equal(["rule-1"], chart.Points[11].Signals);
        Assert.Empty(chart.Points[10].Signals);
    }

    [Fact]
    public void A_baseline_inside_the_series_uses_only_its_own_values()
    {
        double[] values = [500, 49.6, 47.6, 49.9, -300];

        var chart = IndividualsChart.Build(values, 1, 3);

        // mean (49.6 + 47.6 + 49.9)/3, moving ranges 2.0 and 2.3.
        Assert.Equal((49.6 + 47.6 + 49.9) / 3, chart.Limits.Mean, 12);
        Assert.Equal(2.15, chart.Limits.MeanMovingRange, 12);
        Assert.Equal(["rule-1"], chart.Points[0].Signals);
        Assert.Equal(["rule-1"], chart.Points[4].Signals);
    }

    [Fact]
    public void A_flat_baseline_gives_zero_sigma_and_no_NaN_or_zone_signals()
    {
        double[] values = [92, 92, 92, 92, 92, 93.5, 90];

        var chart = IndividualsChart.Build(values, 0, 5);

        Assert.Equal(0, chart.Limits.Sigma);
        Assert.Equal(92, chart.Limits.Ucl);
        Assert.Equal(92, chart.Limits.Lcl);
        Assert.Equal(0, chart.Limits.MovingRangeUcl);
        Assert.All(chart.Points, p => Assert.Empty(p.Signals));
        Assert.False(double.IsNaN(chart.Limits.Sigma));
    }

    [Theory]
    [InlineData(0, 1)]
    [InlineData(-1, 3)]
    [InlineData(8, 3)]
    [InlineData(0, 11)]
    public void A_baseline_that_is_too_short_or_outside_the_values_is_refused(int start, int count) =>
        Assert.Throws<ArgumentOutOfRangeException>(() => IndividualsChart.Build(FlowRate, start, count));

    [Fact]
    public void A_value_that_is_not_finite_is_refused_with_its_position()
    {
        var error = Assert.Throws<ArgumentException>(() => IndividualsChart.Build([1, 2, double.PositiveInfinity], 0, 2));
        Assert.Contains("value 2", error.Message, StringComparison.Ordinal);
    }
}
