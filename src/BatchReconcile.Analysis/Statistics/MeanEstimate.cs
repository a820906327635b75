namespace BatchReconcile.Analysis.Statistics;

/// <summary>A sample mean with its Student t confidence interval.</summary>
/// <param name="N">Number of values.</param>
/// <param name="Mean">Arithmetic mean.</param>
/// <param name="StandardDeviation">Sample standard deviation s (divisor n - 1); null when N &lt; 2.</param>
/// <param name="Low">Lower confidence limit; null when N &lt; 2.</param>
/// <param name="High">Upper confidence limit; null when N &lt; 2.</param>
/// <remarks>
/// The interval is Ȳ ± t(1 - α/2, N - 1) · s / √N (NIST/SEMATECH e-Handbook of Statistical Methods,
/// section 1.3.5.2 "Confidence Limits for the Mean"), with α = 1 - confidence. It assumes the values are
/// independent draws from one roughly normal population: batches from a drifting process are not, and
/// the interval then understates the uncertainty. All values equal give s = 0 and a zero-width interval
/// at the mean.
/// </remarks>
public sealed record MeanEstimate(int N, double Mean, double? StandardDeviation, double? Low, double? High)
{
    /// <summary>The mean of <paramref name="values"/> and its two-sided interval at <paramref name="confidence"/>.</summary>
    /// <exception cref="ArgumentException">No values, or a value that is not a finite number.</exception>
    public static MeanEstimate Of(IReadOnlyList<double> values, double confidence = 0.95)
    {
        CheckConfidence(confidence);
        var m = SampleMoments.Of(values, nameof(values));
        return m.N < 2
            ? new MeanEstimate(m.N, m.Mean, null, null, null)
            : FromSummary(m.N, m.Mean, Math.Sqrt(m.Variance), confidence);
    }

    /// <summary>The interval from published summary statistics (n, mean, s), e.g. a handbook example.</summary>
    public static MeanEstimate FromSummary(int n, double mean, double standardDeviation, double confidence = 0.95)
    {
        CheckConfidence(confidence);
        if (n < 1) throw new ArgumentOutOfRangeException(nameof(n), n, "n must be at least 1");
        if (!double.IsFinite(mean)) throw new ArgumentOutOfRangeException(nameof(mean), mean, "mean must be finite");
        if (n < 2) return new MeanEstimate(n, mean, null, null, null);
        if (!(standardDeviation >= 0) || double.IsInfinity(standardDeviation))
            throw new ArgumentOutOfRangeException(nameof(standardDeviation), standardDeviation, "standard deviation must be finite and >= 0");

        double halfWidth = StudentT.Quantile((1 + confidence) / 2, n - 1) * standardDeviation / Math.Sqrt(n);
        return new MeanEstimate(n, mean, standardDeviation, mean - halfWidth, mean + halfWidth);
    }

    internal static void CheckConfidence(double confidence)
    {
        if (!(confidence > 0 && confidence < 1))
            throw new ArgumentOutOfRangeException(nameof(confidence), confidence, "confidence must be strictly between 0 and 1");
    }
}
