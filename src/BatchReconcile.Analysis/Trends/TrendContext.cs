using System.Globalization;

namespace BatchReconcile.Analysis.Trends;

/// <summary>One line placing the latest value in its recent run relative to a centre line.</summary>
public static class TrendContext
{
    /// <summary>
    /// Describes the last of <paramref name="values"/> against <paramref name="centre"/>, looking back at most
    /// <paramref name="window"/> values (the last one included); null when there are fewer than 2 values.
    /// </summary>
    /// <remarks>
    /// <para>Let k be how many of the last n = min(window, count) values lie on the latest value's side, and r
    /// the length of the unbroken run of same-side values that ends with it. The line is:</para>
    /// <list type="bullet">
    /// <item>"the latest batch is on the centre line" when it equals the centre;</item>
    /// <item>"Rth batch in a row below (above) the centre line" when r ≥ 2 and either r &gt; n (the run is
    /// longer than the window) or r = k (every same-side value in the window belongs to the run);</item>
    /// <item>otherwise "Kth of the last N batches below (above) the centre line".</item>
    /// </list>
    /// <para>"On the centre line" is exact equality, the same rule that ends a run in <see cref="RunRules"/>.</para>
    /// </remarks>
    public static string? Describe(IReadOnlyList<double> values, double centre, int window = 5)
    {
        ArgumentNullException.ThrowIfNull(values);
        if (window < 2) throw new ArgumentOutOfRangeException(nameof(window), window, "the window needs at least 2 values");
        if (!double.IsFinite(centre)) throw new ArgumentOutOfRangeException(nameof(centre), centre, "the centre line must be a finite number");
        for (var i = 0; i < values.Count; i++)
        {
            if (!double.IsFinite(values[i]))
                throw new ArgumentException(FormattableString.Invariant($"value {i} is {values[i]:R}, not a finite number"), nameof(values));
        }

        if (values.Count < 2) return null;

        int last = values.Count - 1;
        int side = Math.Sign(values[last] - centre);
        if (side == 0) return "the latest batch is on the centre line";

        int n = Math.Min(window, values.Count);
        var k = 0;
        for (int i = values.Count - n; i <= last; i++)
        {
            if (Math.Sign(values[i] - centre) == side) k++;
        }

        var run = 0;
        for (int i = last; i >= 0 && Math.Sign(values[i] - centre) == side; i--) run++;

        string where = side < 0 ? "below" : "above";
        if (run >= 2 && (run > n || run == k))
            return string.Create(CultureInfo.InvariantCulture, $"{Ordinal(run)} batch in a row {where} the centre line");
        return string.Create(CultureInfo.InvariantCulture, $"{Ordinal(k)} of the last {n} batches {where} the centre line");
    }

    internal static string Ordinal(int number)
    {
        int lastTwo = number % 100;
        string suffix = lastTwo is >= 11 and <= 13
            ? "th"
            : (number % 10) switch { 1 => "st", 2 => "nd", 3 => "rd", _ => "th" };
        return number.ToString(CultureInfo.InvariantCulture) + suffix;
    }
}
