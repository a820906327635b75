using BatchReconcile.Analysis.Statistics;

namespace BatchReconcile.Analysis.Tests.Statistics;

public class StudentTTests
{
    // NIST/SEMATECH e-Handbook of Statistical Methods, section 1.3.6.7.2 "Critical Values of the Student's t
    // Distribution": upper critical values t such that P(T > t) = α, printed to 3 decimals. Rows copied from
    // the table as stored (a reprint credited to the handbook). Two entries of its α = 0.001 column are left
    // out because they do not round from the exact value: ν = 1 prints 318.313 where tan(0.499π) = 318.3088,
    // and ν = 10 prints 4.143 where the quantile is 4.1437 (other published tables print 318.309 and 4.144).
    public static TheoryData<double, double, double> NistTable() => new()
    {
        { 1, 0.10, 3.078 }, { 1, 0.05, 6.314 }, { 1, 0.025, 12.706 }, { 1, 0.01, 31.821 }, { 1, 0.005, 63.657 },
        { 2, 0.10, 1.886 }, { 2, 0.05, 2.920 }, { 2, 0.025, 4.303 }, { 2, 0.01, 6.965 }, { 2, 0.005, 9.925 }, { 2, 0.001, 22.327 },
        { 5, 0.10, 1.476 }, { 5, 0.05, 2.015 }, { 5, 0.025, 2.571 }, { 5, 0.01, 3.365 }, { 5, 0.005, 4.032 }, { 5, 0.001, 5.893 },
        { 10, 0.10, 1.372 }, { 10, 0.05, 1.812 }, { 10, 0.025, 2.228 }, { 10, 0.01, 2.764 }, { 10, 0.005, 3.169 },
        { 20, 0.10, 1.325 }, { 20, 0.05, 1.725 }, { 20, 0.025, 2.086 }, { 20, 0.01, 2.528 }, { 20, 0.005, 2.845 }, { 20, 0.001, 3.552 },
        { 30, 0.10, 1.310 }, { 30, 0.05, 1.697 }, { 30, 0.025, 2.042 }, { 30, 0.01, 2.457 }, { 30, 0.005, 2.750 }, { 30, 0.001, 3.385 },
        { 60, 0.10, 1.296 }, { 60, 0.05, 1.671 }, { 60, 0.025, 2.000 }, { 60, 0.01, 2.390 }, { 60, 0.005, 2.660 }, { 60, 0.001, 3.232 },
        { 100, 0.10, 1.290 }, { 100, 0.05, 1.660 }, { 100, 0.025, 1.984 }, { 100, 0.01, 2.364 }, { 100, 0.005, 2.626 }, { 100, 0.001, 3.174 },
    };

    [Theory]
    [MemberData(nameof(NistTable))]
    public void Quantile_matches_the_NIST_table_to_its_printed_decimals(double df, double alpha, double printed)
    {
        double t = StudentT.Quantile(1 - alpha, df);

        Assert.Equal(printed, Math.Round(t, 3, MidpointRounding.AwayFromZero));
        Assert.Equal(-printed, Math.Round(StudentT.Quantile(alpha, df), 3, MidpointRounding.AwayFromZero));
    }

    // Exact closed forms (Johnson, Kotz and Balakrishnan (1995), Continuous Univariate Distributions vol. 2,
    // ch. 28), each written for the lower tail F(t), t < 0, without cancellation (F(-t) = 1 - F(t)):
    // ν = 1 (Cauchy) F(t) = atan(-1/t)/π; ν = 2 F(t) = ½(1 - |t|/√(2+t²)) = 1/(√(2+t²)(√(2+t²)+|t|));
    // ν = 3 F(t) = (atan(1/x) - x/(1+x²))/π with x = |t|/√3 (kept to |t| ≤ 9, where that difference keeps
    // its digits).
    public static TheoryData<double> Ts() => new() { -40, -7.5, -2, -0.75, -0.01, 0.3, 1, 2.5, 9, 150 };

    [Theory]
    [MemberData(nameof(Ts))]
    public void Cdf_matches_the_closed_forms_for_one_two_and_three_degrees_of_freedom(double t)
    {
        double a = Math.Abs(t);
        double cauchyLower = Math.Atan(1 / a) / Math.PI;
        double r = Math.Sqrt(2 + a * a);
        double twoLower = 1 / (r * (r + a));
        AssertRelative(t < 0 ? cauchyLower : 1 - cauchyLower, StudentT.Cdf(t, 1), 1e-12);
        AssertRelative(t < 0 ? twoLower : 1 - twoLower, StudentT.Cdf(t, 2), 1e-12);
        AssertRelative(cauchyLower, StudentT.UpperTail(a, 1), 1e-12);
        AssertRelative(twoLower, StudentT.UpperTail(a, 2), 1e-12);
        if (a <= 9)
        {
            double x = a / Math.Sqrt(3);
            double threeLower = (Math.Atan(1 / x) - x / (1 + x * x)) / Math.PI;
            AssertRelative(threeLower, StudentT.UpperTail(a, 3), 1e-12);
            AssertRelative(t < 0 ? threeLower : 1 - threeLower, StudentT.Cdf(t, 3), 1e-12);
        }
    }

    // The brief's closed forms, t = tan(π(p - ½)) for ν = 1 and t = (2p - 1)/√(2p(1 - p)) for ν = 2. For
    // p = 1e-9 the ν = 1 reference is written as -cot(πp), the same value without the rounding of π(p - ½)
    // next to the pole.
    public static TheoryData<double> Ps() => new() { 1e-9, 0.001, 0.025, 0.1, 0.3, 0.5001, 0.6, 0.75, 0.9, 0.95, 0.975, 0.99, 0.999 };

    [Theory]
    [MemberData(nameof(Ps))]
    public void Quantile_is_exact_for_one_and_two_degrees_of_freedom(double p)
    {
        double cauchy = p < 1e-6 ? -1 / Math.Tan(Math.PI * p) : Math.Tan(Math.PI * (p - 0.5));
        AssertRelative(cauchy, StudentT.Quantile(p, 1), 1e-12);
        AssertRelative((2 * p - 1) / Math.Sqrt(2 * p * (1 - p)), StudentT.Quantile(p, 2), 1e-12);
    }

    public static TheoryData<double, double> QuantileCases()
    {
        var data = new TheoryData<double, double>();
        foreach (double df in new[] { 1.0, 1.37, 2.0, 2.5, 3, 4.2, 9, 30, 136.87, 1000, 1e5 })
        {
            foreach (double p in new[] { 1e-12, 1e-6, 0.01, 0.2, 0.45, 0.55, 0.8, 0.975, 0.999999 })
                data.Add(df, p);
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(QuantileCases))]
    public void Quantile_inverts_the_cdf_to_1e_12(double df, double p)
    {
        double t = StudentT.Quantile(p, df);
        // Compare in the smaller tail so that a p of 1e-12 is checked relative to itself.
        double back = p < 0.5 ? StudentT.Cdf(t, df) : StudentT.UpperTail(t, df);
        double expected = p < 0.5 ? p : 1 - p;

        AssertRelative(expected, back, 1e-12);
    }

    [Fact]
    public void Quantile_of_the_NIST_two_sample_example_matches_its_critical_values()
    {
        // NIST e-Handbook 1.3.5.3 "Two-Sample t-Test for Equal Means" (AUTO83B, ν = 326): critical values
        // 1.9673 (two-sided, α = 0.05) and 1.6495 (one-sided), printed to 4 decimals. The handbook's R
        // script for the same section prints qt(.025, 326) = -1.967268 and qt(.05, 326) = -1.649541.
        Assert.Equal(1.9673, Math.Round(StudentT.Quantile(0.975, 326), 4));
        Assert.Equal(1.6495, Math.Round(StudentT.Quantile(0.95, 326), 4));
        Assert.Equal(-1.967268, Math.Round(StudentT.Quantile(0.025, 326), 6));
        Assert.Equal(-1.649541, Math.Round(StudentT.Quantile(0.05, 326), 6));
    }

    [Fact]
    public void Upper_tail_keeps_its_relative_precision_far_out()
    {
        // ν = 1: P(T > t) = atan(1/t)/π exactly; at t = 1e8 that is 3.18e-9, lost entirely by 1 - Cdf.
        AssertRelative(Math.Atan(1e-8) / Math.PI, StudentT.UpperTail(1e8, 1), 1e-12);
        Assert.True(StudentT.UpperTail(60, 30) is > 0 and < 1e-30);
        Assert.Equal(1, StudentT.UpperTail(double.NegativeInfinity, 5));
    }

    [Fact]
    public void Cdf_and_quantile_are_symmetric_about_zero()
    {
        Assert.Equal(0.5, StudentT.Cdf(0, 7));
        Assert.Equal(0, StudentT.Quantile(0.5, 7));
        AssertRelative(1 - StudentT.Cdf(1.3, 4.5), StudentT.Cdf(-1.3, 4.5), 1e-14);
        AssertRelative(-StudentT.Quantile(0.9, 12.5), StudentT.Quantile(0.1, 12.5), 1e-13);
    }

    [Theory]
    [InlineData(0.0, 5.0)]
    [InlineData(1.0, 5.0)]
    [InlineData(-0.1, 5.0)]
    [InlineData(double.NaN, 5.0)]
    [InlineData(0.5, 0.0)]
    [InlineData(0.5, -3.0)]
    [InlineData(0.5, double.NaN)]
    [InlineData(0.5, double.PositiveInfinity)]
    public void Quantile_rejects_probabilities_and_degrees_of_freedom_outside_the_domain(double p, double df) =>
        Assert.Throws<ArgumentOutOfRangeException>(() => StudentT.Quantile(p, df));

    internal static void AssertRelative(double expected, double actual, double tolerance)
    {
        double scale = Math.Max(Math.Abs(expected), double.Epsilon);
        Assert.True(Math.Abs(actual - expected) <= tolerance * scale,
            FormattableString.Invariant($"expected {expected:R}, got {actual:R} (relative difference {Math.Abs(actual - expected) / scale:E3}, allowed {tolerance:E1})"));
    }
}
