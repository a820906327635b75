namespace BatchReconcile.Analysis.Trends;

/// <summary>An individuals and moving-range (I-MR) control chart over values in production order.</summary>
/// <remarks>
/// <para>
/// Limits come from a baseline, values[baselineStart .. baselineStart + baselineCount - 1]:
/// centre line X̄ = mean of the baseline values; moving ranges MR_i = |x_i - x_{i-1}| for consecutive
/// baseline values (baselineCount - 1 of them); MRbar = their mean; sigma = MRbar / d2 with d2 = 1.128;
/// UCL, LCL = X̄ ± 3 sigma; moving-range UCL = D4 · MRbar with D4 = 3.267 (and LCL 0, D3 = 0). The
/// constants are those for samples of n = 2 (a moving range spans two values) in NIST/SEMATECH
/// e-Handbook of Statistical Methods, section 6.3.2 "What are Variables Control Charts?" and the
/// worked example of section 6.3.2.2 "Individuals Control Charts".
/// </para>
/// <para>
/// Every point, inside the baseline or after it, is judged against these limits by <see cref="RunRules"/>.
/// A baseline of all-equal values has MRbar = 0 and so sigma = 0 and UCL = LCL = X̄; the zone rules are
/// then not applied (see <see cref="RunRules.Evaluate"/>), so a flat baseline never yields NaN or a
/// signal on every later point.
/// </para>
/// </remarks>
public sealed record IndividualsChart(ControlLimits Limits, IReadOnlyList<ChartPoint> Points)
{
    /// <summary>d2 for n = 2: the expected range of two standard normal values, 2/√π ≈ 1.128 (NIST e-Handbook 6.3.2).</summary>
    public const double D2 = 1.128;

    /// <summary>D4 for n = 2, the moving-range chart's upper limit factor (NIST e-Handbook 6.3.2).</summary>
    public const double D4 = 3.267;

    /// <summary>Builds the chart; the baseline needs at least two values.</summary>
    /// <exception cref="ArgumentException">A value that is not a finite number.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A baseline shorter than 2 or outside the values.</exception>
    public static IndividualsChart Build(IReadOnlyList<double> values, int baselineStart, int baselineCount)
    {
        ArgumentNullException.ThrowIfNull(values);
        if (baselineCount < 2)
            throw new ArgumentOutOfRangeException(nameof(baselineCount), baselineCount, "the baseline needs at least 2 values");
        if (baselineStart < 0 || baselineStart > values.Count - baselineCount)
            throw new ArgumentOutOfRangeException(nameof(baselineStart), baselineStart,
                FormattableString.Invariant($"a baseline of {baselineCount} values from {baselineStart} does not fit in {values.Count} values"));
        for (var i = 0; i < values.Count; i++)
        {
            if (!double.IsFinite(values[i]))
                throw new ArgumentException(FormattableString.Invariant($"value {i} is {values[i]:R}, not a finite number"), nameof(values));
        }

        double sum = 0, rangeSum = 0;
        for (int i = baselineStart; i < baselineStart + baselineCount; i++)
        {
            sum += values[i];
            if (i > baselineStart) rangeSum += Math.Abs(values[i] - values[i - 1]);
        }

        double mean = sum / baselineCount;
        double mrBar = rangeSum / (baselineCount - 1);
        double sigma = mrBar / D2;
        var limits = new ControlLimits(mean, sigma, mean + 3 * sigma, mean - 3 * sigma, mrBar, D4 * mrBar, baselineStart, baselineCount);

        var signals = RunRules.Evaluate(values, mean, sigma);
        var points = new ChartPoint[values.Count];
        for (var i = 0; i < values.Count; i++)
        {
            double? range = i == 0 ? null : Math.Abs(values[i] - values[i - 1]);
            points[i] = new ChartPoint(i, values[i], range, signals[i]);
        }

        return new IndividualsChart(limits, points);
    }
}
