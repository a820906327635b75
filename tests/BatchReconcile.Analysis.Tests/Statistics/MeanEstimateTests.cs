using BatchReconcile.Analysis.Statistics;

namespace BatchReconcile.Analysis.Tests.Statistics;

public class MeanEstimateTests
{
    [Fact]
    public void Interval_matches_the_NIST_heat_flow_meter_example()
    {
        // NIST/SEMATECH e-Handbook of Statistical Methods, section 1.3.5.2 "Confidence Limits for the Mean",
        // data set ZARR13.DAT: N = 195, mean 9.261460, s 0.022789, t(0.975, 194) = 1.9723, 95 % limits
        // (9.258242, 9.264679). Values as quoted from the section in a stored secondary copy; they agree with
        // the section as remembered.
        var estimate = MeanEstimate.FromSummary(195, 9.261460, 0.022789, 0.95);

        Assert.Equal(1.9723, Math.Round(StudentT.Quantile(0.975, 194), 4));
        // The section computed its limits from the unrounded mean and s; from the printed (rounded) summaries
        // the lower limit is 9.2582413, so the limits agree to within one unit of the sixth decimal.
        Assert.InRange(estimate.Low!.Value, 9.258242 - 1e-6, 9.258242 + 1e-6);
        Assert.InRange(estimate.High!.Value, 9.264679 - 1e-6, 9.264679 + 1e-6);
        Assert.Equal(195, estimate.N);
        Assert.Equal(0.022789, estimate.StandardDeviation);
    }

    [Fact]
    public void Mean_and_sample_standard_deviation_are_computed_from_the_values()
    {
        // Hand-worked: values 2, 4, 4, 4, 5, 5, 7, 9 have mean 5, squared deviations summing to 32, so
        // s = √(32/7); t(0.975, 7) = 2.365 (NIST 1.3.6.7.2 table).
        var estimate = MeanEstimate.Of([2, 4, 4, 4, 5, 5, 7, 9]);

        Assert.Equal(5, estimate.Mean, 14);
        Assert.Equal(Math.Sqrt(32.0 / 7), estimate.StandardDeviation!.Value, 14);
        double half = StudentT.Quantile(0.975, 7) * Math.Sqrt(32.0 / 7) / Math.Sqrt(8);
        Assert.Equal(2.365, Math.Round(StudentT.Quantile(0.975, 7), 3));
        Assert.Equal(5 - half, estimate.Low!.Value, 12);
        Assert.Equal(5 + half, estimate.High!.Value, 12);
    }

    [Fact]
    public void A_single_value_has_a_mean_but_no_interval()
    {
        var estimate = MeanEstimate.Of([87.5]);

        Assert.Equal(new MeanEstimate(1, 87.5, null, null, null), estimate);
    }

    [Fact]
    public void Equal_values_give_a_zero_width_interval_not_NaN()
    {
        var estimate = MeanEstimate.Of([91.2, 91.2, 91.2, 91.2]);

        Assert.Equal(0, estimate.StandardDeviation);
        Assert.Equal(estimate.Mean, estimate.Low);
        Assert.Equal(estimate.Mean, estimate.High);
    }

    [Fact]
    public void A_small_spread_on_a_large_value_keeps_its_digits()
    {
        // 1e6 + {0.001, 0.002, 0.003}: s = 0.001 exactly in real arithmetic; the one-pass sum-of-squares
        // formula would lose every digit here.
        var estimate = MeanEstimate.Of([1e6 + 0.001, 1e6 + 0.002, 1e6 + 0.003]);

        Assert.Equal(0.001, estimate.StandardDeviation!.Value, 9);
    }

    [Fact]
    public void Bad_input_is_refused_with_its_position()
    {
        Assert.Throws<ArgumentException>(() => MeanEstimate.Of([]));
        var notFinite = Assert.Throws<ArgumentException>(() => MeanEstimate.Of([1, double.NaN]));
        Assert.Contains("value 1", notFinite.Message, StringComparison.Ordinal);
        Assert.Throws<ArgumentOutOfRangeException>(() => MeanEstimate.Of([1, 2], confidence: 1));
        Assert.Throws<ArgumentOutOfRangeException>(() => MeanEstimate.Of([1, 2], confidence: 0));
    }
}
