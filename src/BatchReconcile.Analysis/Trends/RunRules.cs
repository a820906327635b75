namespace BatchReconcile.Analysis.Trends;

/// <summary>The eight Nelson tests for special causes on a chart with centre line and sigma.</summary>
/// <remarks>
/// <para>
/// Codes and counts follow Nelson, L. S. (1984), "The Shewhart Control Chart—Tests for Special Causes",
/// Journal of Quality Technology 16(4): 237-239. Zones are measured from the centre line in units of
/// sigma: zone C within 1 sigma, B between 1 and 2, A between 2 and 3.
/// </para>
/// <list type="table">
/// <item><term>rule-1</term><description>1 point more than 3 sigma from the centre line (either side).</description></item>
/// <item><term>rule-2</term><description>9 points in a row on the same side of the centre line.</description></item>
/// <item><term>rule-3</term><description>6 points in a row steadily increasing or steadily decreasing.</description></item>
/// <item><term>rule-4</term><description>14 points in a row alternating up and down.</description></item>
/// <item><term>rule-5</term><description>2 of 3 points in a row more than 2 sigma from the centre line, same side.</description></item>
/// <item><term>rule-6</term><description>4 of 5 points in a row more than 1 sigma from the centre line, same side.</description></item>
/// <item><term>rule-7</term><description>15 points in a row within 1 sigma of the centre line (either side).</description></item>
/// <item><term>rule-8</term><description>8 points in a row more than 1 sigma from the centre line, with points on both sides.</description></item>
/// </list>
/// <para>
/// The Western Electric zone tests (Western Electric Company (1956), Statistical Quality Control
/// Handbook) are rule-1, rule-5 and rule-6 here, and its fourth test, 8 in a row on one side, is rule-2
/// with Nelson's count of 9. The count of 9 is used because the codes follow Nelson's numbering and
/// because Nelson chose 9 so that the chance of a false signal from an in-control normal process
/// (2 · 0.5⁹ ≈ 0.0039) is close to that of rule-1 (0.0027); that reason is given from memory of the paper.
/// </para>
/// <para>
/// Where a signal is marked: only on the point that completes a pattern, never on the earlier points of
/// it. A point carries rule-k when the window of the rule's length that ends at it satisfies the rule, so
/// a run that goes on (a tenth point on the same side) marks each further point too. For rule-5 and
/// rule-6 the completing point must itself be one of the points beyond the zone (the third point of
/// "2 of 3" that falls back inside does not carry the signal); both need a full window of 3 or 5 points.
/// "More than" and "within" are strict: a point exactly on a zone boundary is not beyond it, and a point
/// exactly on the centre line is on neither side, so it ends a rule-2 run. Ties end rule-3 and rule-4
/// runs (an equal value neither rises nor falls).
/// </para>
/// <para>
/// Zero sigma (a baseline of all-equal values): the zones have no width, so the zone rules (1, 5, 6, 7
/// and 8) are not evaluated at all, rather than marking every departure from the centre line as "beyond
/// 3 sigma". Rules 2, 3 and 4 need only the centre line and the order of the values and are still applied.
/// </para>
/// </remarks>
public static class RunRules
{
    private static readonly string[] AllCodes = ["rule-1", "rule-2", "rule-3", "rule-4", "rule-5", "rule-6", "rule-7", "rule-8"];

    private static readonly Dictionary<string, string> Descriptions = new(StringComparer.Ordinal)
    {
        ["rule-1"] = "One point more than 3 sigma from the centre line.",
        ["rule-2"] = "Nine points in a row on the same side of the centre line.",
        ["rule-3"] = "Six points in a row steadily increasing or steadily decreasing.",
        ["rule-4"] = "Fourteen points in a row alternating up and down.",
        ["rule-5"] = "Two of three points in a row more than 2 sigma from the centre line on the same side.",
        ["rule-6"] = "Four of five points in a row more than 1 sigma from the centre line on the same side.",
        ["rule-7"] = "Fifteen points in a row within 1 sigma of the centre line.",
        ["rule-8"] = "Eight points in a row more than 1 sigma from the centre line, on both sides of it.",
    };

    /// <summary>Every rule code, in rule order.</summary>
    public static IReadOnlyList<string> Codes => AllCodes;

    /// <summary>A plain sentence saying what the rule detects.</summary>
    /// <exception cref="ArgumentException">Not one of <see cref="Codes"/>.</exception>
    public static string Describe(string code)
    {
        ArgumentNullException.ThrowIfNull(code);
        return Descriptions.TryGetValue(code, out var text)
            ? text
            : throw new ArgumentException($"unknown run rule '{code}' (expected rule-1 .. rule-8)", nameof(code));
    }

    /// <summary>For each value, the codes of the rules whose pattern it completes, in rule order.</summary>
    /// <exception cref="ArgumentException">A value that is not a finite number.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A mean that is not finite, or a sigma that is negative or not finite.</exception>
    public static IReadOnlyList<string>[] Evaluate(IReadOnlyList<double> values, double mean, double sigma)
    {
        ArgumentNullException.ThrowIfNull(values);
        if (!double.IsFinite(mean)) throw new ArgumentOutOfRangeException(nameof(mean), mean, "the centre line must be a finite number");
        if (!(sigma >= 0) || double.IsInfinity(sigma))
            throw new ArgumentOutOfRangeException(nameof(sigma), sigma, "sigma must be a finite number >= 0");

        int n = values.Count;
        var z = new double[n];
        for (var i = 0; i < n; i++)
        {
            double v = values[i];
            if (!double.IsFinite(v))
                throw new ArgumentException(FormattableString.Invariant($"value {i} is {v:R}, not a finite number"), nameof(values));
            z[i] = v - mean;
        }

        bool zones = sigma > 0;
        var result = new IReadOnlyList<string>[n];
        var found = new List<string>(8);
        for (var i = 0; i < n; i++)
        {
            found.Clear();
            if (zones && Math.Abs(z[i]) > 3 * sigma) found.Add("rule-1");
            if (SameSide(z, i, 9)) found.Add("rule-2");
            if (Monotone(values, i, 6)) found.Add("rule-3");
            if (Alternating(values, i, 14)) found.Add("rule-4");
            if (zones && CountBeyond(z, i, 3, 2 * sigma, 2)) found.Add("rule-5");
            if (zones && CountBeyond(z, i, 5, sigma, 4)) found.Add("rule-6");
            if (zones && AllWithin(z, i, 15, sigma)) found.Add("rule-7");
            if (zones && AllOutsideBothSides(z, i, 8, sigma)) found.Add("rule-8");
            result[i] = found.Count == 0 ? [] : found.ToArray();
        }

        return result;
    }

    private static bool SameSide(double[] z, int end, int length)
    {
        if (end < length - 1) return false;
        int side = Math.Sign(z[end]);
        if (side == 0) return false;
        for (int k = end - length + 1; k < end; k++)
        {
            if (Math.Sign(z[k]) != side) return false;
        }

        return true;
    }

    private static bool Monotone(IReadOnlyList<double> v, int end, int length)
    {
        if (end < length - 1) return false;
        int direction = Math.Sign(v[end] - v[end - 1]);
        if (direction == 0) return false;
        for (int k = end - length + 2; k < end; k++)
        {
            if (Math.Sign(v[k] - v[k - 1]) != direction) return false;
        }

        return true;
    }

    private static bool Alternating(IReadOnlyList<double> v, int end, int length)
    {
        if (end < length - 1) return false;
        int previous = 0;
        for (int k = end - length + 2; k <= end; k++)
        {
            int step = Math.Sign(v[k] - v[k - 1]);
            if (step == 0 || step == previous) return false;
            previous = step;
        }

        return true;
    }

    private static bool CountBeyond(double[] z, int end, int window, double distance, int needed)
    {
        if (end < window - 1) return false;
        int side = z[end] > distance ? 1 : z[end] < -distance ? -1 : 0;
        if (side == 0) return false;
        var count = 0;
        for (int k = end - window + 1; k <= end; k++)
        {
            if (side * z[k] > distance) count++;
        }

        return count >= needed;
    }

    private static bool AllWithin(double[] z, int end, int length, double sigma)
    {
        if (end < length - 1) return false;
        for (int k = end - length + 1; k <= end; k++)
        {
            if (!(Math.Abs(z[k]) < sigma)) return false;
        }

        return true;
    }

    private static bool AllOutsideBothSides(double[] z, int end, int length, double sigma)
    {
        if (end < length - 1) return false;
        bool above = false, below = false;
        for (int k = end - length + 1; k <= end; k++)
        {
            if (!(Math.Abs(z[k]) > sigma)) return false;
            if (z[k] > 0) above = true; else below = true;
        }

        return above && below;
    }
}
