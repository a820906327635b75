using BatchReconcile.Analysis.Statistics;

namespace BatchReconcile.Analysis.Tests.Statistics;

public class WelchTestTests
{
    // NIST/SEMATECH e-Handbook of Statistical Methods, section 1.3.5.3 "Two-Sample t-Test for Equal Means",
    // data set AUTO83B.DAT (miles per gallon): U.S. cars N = 249, mean 20.14458, s 6.41470; Japanese cars
    // N = 79, mean 30.48101, s 6.10771 (read from stored copies of the section). The section works the
    // equal-variance case (T = -12.62059, ν = 326) and gives the unequal-variance formulas; the Welch
    // values below are those formulas applied to its printed summaries by hand (T = -12.9463,
    // ν = 136.875), not numbers printed in the section. The figure ν ≈ 136.87 is also remembered from
    // the handbook's unequal-variance output, which was not found in a stored source.
    [Fact]
    public void Welch_statistics_follow_the_NIST_section_formulas_on_its_car_mileage_example()
    {
        var test = WelchTest.FromSummaries(79, 30.48101, 6.10771, 249, 20.14458, 6.41470)!;

        Assert.Equal(-10.33643, test.Difference, 10);
        Assert.Equal(-12.9463, Math.Round(test.T, 4));
        Assert.Equal(136.87, Math.Round(test.DegreesOfFreedom, 2));
        Assert.Equal(Math.Sqrt(6.41470 * 6.41470 / 249 + 6.10771 * 6.10771 / 79), test.StandardError, 14);
        Assert.True(test.PValue < 1e-20, "two-sided p-value should be far below 1e-20");
        double half = StudentT.Quantile(0.975, test.DegreesOfFreedom) * test.StandardError;
        Assert.Equal(test.Difference - half, test.Low, 12);
        Assert.Equal(test.Difference + half, test.High, 12);
    }

    [Fact]
    public void Difference_is_b_minus_a()
    {
        var test = WelchTest.Compare([10, 11, 12], [20, 22, 24])!;

        Assert.Equal(11, test.Difference, 12);
        Assert.True(test.T > 0);
        Assert.True(test.Low < test.Difference && test.Difference < test.High);
    }

    [Fact]
    public void Hand_worked_small_samples()
    {
        // a = 1, 2, 3 (mean 2, s² = 1); b = 2, 4, 6, 8 (mean 5, s² = 20/3).
        // SE² = 1/3 + 5/3 = 2; ν = 4 / ((1/3)²/2 + (5/3)²/3) = 4 / (1/18 + 25/27) = 216/53.
        var test = WelchTest.Compare([1, 2, 3], [2, 4, 6, 8])!;

        Assert.Equal(3, test.Difference, 13);
        Assert.Equal(Math.Sqrt(2), test.StandardError, 13);
        Assert.Equal(3 / Math.Sqrt(2), test.T, 12);
        Assert.Equal(216.0 / 53, test.DegreesOfFreedom, 12);
        Assert.Equal(2 * StudentT.UpperTail(3 / Math.Sqrt(2), 216.0 / 53), test.PValue, 14);
    }

    [Fact]
    public void One_group_without_spread_leaves_the_other_groups_degrees_of_freedom()
    {
        var test = WelchTest.Compare([90, 90, 90], [88, 89, 91, 92])!;

        Assert.Equal(3, test.DegreesOfFreedom, 12);
        Assert.False(double.IsNaN(test.PValue));
    }

    [Fact]
    public void No_test_when_a_group_is_too_small_or_neither_has_spread()
    {
        Assert.Null(WelchTest.Compare([1], [1, 2, 3]));
        Assert.Null(WelchTest.Compare([1, 2, 3], [4]));
        Assert.Null(WelchTest.Compare([5, 5, 5], [7, 7]));
        Assert.Null(WelchTest.FromSummaries(1, 2, 0.5, 10, 3, 0.5));
    }

    [Fact]
    public void Identical_groups_give_p_of_one()
    {
        var test = WelchTest.Compare([1, 2, 3, 4], [1, 2, 3, 4])!;

        Assert.Equal(0, test.T);
        Assert.Equal(1, test.PValue, 14);
    }
}
