namespace BatchReconcile.Analysis.Statistics;

/// <summary>Welch's unequal-variance t test of two means, with the interval for their difference.</summary>
/// <param name="Difference">Mean of b minus mean of a.</param>
/// <param name="StandardError">√(s_a²/n_a + s_b²/n_b).</param>
/// <param name="T">Difference / StandardError.</param>
/// <param name="DegreesOfFreedom">Welch-Satterthwaite ν (not a whole number in general).</param>
/// <param name="PValue">Two-sided p-value 2 P(T_ν &gt; |T|).</param>
/// <param name="Low">Lower limit of the interval for the difference.</param>
/// <param name="High">Upper limit of the interval for the difference.</param>
/// <remarks>
/// <para>
/// T = (Ȳ_b - Ȳ_a) / √(s_a²/N_a + s_b²/N_b) and
/// ν = (s_a²/N_a + s_b²/N_b)² / ((s_a²/N_a)²/(N_a - 1) + (s_b²/N_b)²/(N_b - 1)), the unequal-variance case of
/// NIST/SEMATECH e-Handbook of Statistical Methods, section 1.3.5.3 "Two-Sample t-Test for Equal Means"
/// (Welch, B. L. (1947), Biometrika 34: 28-35; Satterthwaite, F. E. (1946), Biometrics Bulletin 2: 110-114).
/// The interval is Difference ± t(1 - α/2, ν) · StandardError. The sign convention (b - a) reads as "how
/// much the second group (e.g. the newer recipe version) differs from the first".
/// </para>
/// <para>
/// When one group has zero variance (all its values equal) the test still stands on the other group's
/// variance (ν = its N - 1). When both have zero variance there is no spread to test against and
/// <see cref="Compare"/> returns null, as it does when a group has fewer than two values.
/// </para>
/// </remarks>
public sealed record WelchTest(
    double Difference, double StandardError, double T, double DegreesOfFreedom, double PValue, double Low, double High)
{
    /// <summary>Compares the means of <paramref name="a"/> and <paramref name="b"/>; null when it cannot.</summary>
    public static WelchTest? Compare(IReadOnlyList<double> a, IReadOnlyList<double> b, double confidence = 0.95)
    {
        MeanEstimate.CheckConfidence(confidence);
        ArgumentNullException.ThrowIfNull(a);
        ArgumentNullException.ThrowIfNull(b);
        if (a.Count < 2 || b.Count < 2) return null;
        var ma = SampleMoments.Of(a, nameof(a));
        var mb = SampleMoments.Of(b, nameof(b));
        return FromMoments(ma.N, ma.Mean, ma.Variance, mb.N, mb.Mean, mb.Variance, confidence);
    }

    /// <summary>The test from published summary statistics (n, mean, s of each group).</summary>
    public static WelchTest? FromSummaries(
        int nA, double meanA, double sdA, int nB, double meanB, double sdB, double confidence = 0.95)
    {
        MeanEstimate.CheckConfidence(confidence);
        if (nA < 2 || nB < 2) return null;
        return FromMoments(nA, meanA, sdA * sdA, nB, meanB, sdB * sdB, confidence);
    }

    private static WelchTest? FromMoments(int nA, double meanA, double varA, int nB, double meanB, double varB, double confidence)
    {
        if (varA == 0 && varB == 0) return null;
        double ua = varA / nA, ub = varB / nB;
        double se2 = ua + ub;
        double se = Math.Sqrt(se2);
        double df = se2 * se2 / (ua * ua / (nA - 1) + ub * ub / (nB - 1));
        double diff = meanB - meanA;
        double t = diff / se;
        double p = Math.Min(1, 2 * StudentT.UpperTail(Math.Abs(t), df));
        double half = StudentT.Quantile((1 + confidence) / 2, df) * se;
        return new WelchTest(diff, se, t, df, p, diff - half, diff + half);
    }
}
