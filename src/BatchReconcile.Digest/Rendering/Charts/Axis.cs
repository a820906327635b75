namespace BatchReconcile.Digest.Rendering.Charts;

/// <summary>A linear axis: maps values to pixels and picks round tick values (1, 2 or 5 times a power of ten).</summary>
internal sealed class Axis
{
    private Axis(double min, double max, double from, double to, double step)
    {
        Min = min;
        Max = max;
        From = from;
        To = to;
        Step = step;
    }

    public double Min { get; }

    public double Max { get; }

    public double From { get; }

    public double To { get; }

    public double Step { get; }

    /// <summary>An axis over at least [<paramref name="low"/>, <paramref name="high"/>], widened to whole ticks.</summary>
    public static Axis Over(double low, double high, double from, double to, int ticks = 5)
    {
        if (!double.IsFinite(low) || !double.IsFinite(high))
        {
            throw new ArgumentException("Axis bounds must be finite.");
        }

        if (high - low < 1e-9)
        {
            var pad = Math.Max(Math.Abs(high) * 0.05, 1);
            low -= pad;
            high += pad;
        }

        var step = NiceStep((high - low) / ticks);
        var min = Math.Floor(low / step) * step;
        var max = Math.Ceiling(high / step) * step;
        return new Axis(min, max, from, to, step);
    }

    public double Map(double value) => From + ((value - Min) / (Max - Min) * (To - From));

    public IEnumerable<double> Ticks()
    {
        var count = (int)Math.Round((Max - Min) / Step);
        for (var i = 0; i <= count; i++)
        {
            yield return Min + (i * Step);
        }
    }

    /// <summary>Decimals that show the tick step exactly (0 for 5, 1 for 0.5, 2 for 0.05).</summary>
    public int Decimals => Step >= 1 ? 0 : (int)Math.Ceiling(-Math.Log10(Step) - 1e-9);

    private static double NiceStep(double raw)
    {
        var power = Math.Pow(10, Math.Floor(Math.Log10(raw)));
        var fraction = raw / power;
        var nice = fraction <= 1 ? 1 : fraction <= 2 ? 2 : fraction <= 5 ? 5 : 10;
        return nice * power;
    }
}
