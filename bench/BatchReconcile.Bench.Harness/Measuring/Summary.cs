namespace BatchReconcile.Bench.Harness.Measuring;

/// <summary>Median, minimum and maximum of repeated measurements (never a single timing on its own).</summary>
internal sealed record Summary(double Median, double Min, double Max, int Runs)
{
    public static Summary Of(IReadOnlyCollection<double> values)
    {
        if (values.Count == 0)
        {
            throw new InvalidOperationException("no measurements to summarise");
        }

        var sorted = values.Order().ToArray();
        var mid = sorted.Length / 2;
        var median = sorted.Length % 2 == 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
        return new Summary(median, sorted[0], sorted[^1], sorted.Length);
    }

    /// <summary>The p-th percentile by nearest rank (p in 0..100).</summary>
    public static double Percentile(IReadOnlyCollection<double> values, double p)
    {
        var sorted = values.Order().ToArray();
        var rank = (int)Math.Ceiling(p / 100.0 * sorted.Length);
        return sorted[Math.Clamp(rank - 1, 0, sorted.Length - 1)];
    }
}
