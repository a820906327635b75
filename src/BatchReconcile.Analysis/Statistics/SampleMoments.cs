namespace BatchReconcile.Analysis.Statistics;

/// <summary>Count, mean and sample variance of a list of values, computed in two passes.</summary>
/// <remarks>
/// The mean is refined by the mean of the residuals, and the variance uses the corrected two-pass
/// formula s² = (Σ(x - m)² - (Σ(x - m))²/n) / (n - 1) (Chan, Golub and LeVeque (1983), "Algorithms for
/// Computing the Sample Variance", The American Statistician 37(3): 242-247), so yields near 95 % with
/// spreads of 0.01 % lose no digits to cancellation.
/// </remarks>
internal readonly record struct SampleMoments(int N, double Mean, double Variance)
{
    public static SampleMoments Of(IReadOnlyList<double> values, string parameterName)
    {
        ArgumentNullException.ThrowIfNull(values, parameterName);
        int n = values.Count;
        if (n == 0) throw new ArgumentException("at least one value is needed", parameterName);

        double sum = 0;
        for (var i = 0; i < n; i++)
        {
            double v = values[i];
            if (!double.IsFinite(v))
                throw new ArgumentException(FormattableString.Invariant($"value {i} is {v:R}, not a finite number"), parameterName);
            sum += v;
        }

        double mean = sum / n;
        double residualSum = 0, squares = 0;
        for (var i = 0; i < n; i++)
        {
            double d = values[i] - mean;
            residualSum += d;
            squares += d * d;
        }

        double variance = n < 2 ? double.NaN : Math.Max(0, (squares - residualSum * residualSum / n) / (n - 1));
        return new SampleMoments(n, mean + residualSum / n, variance);
    }
}
