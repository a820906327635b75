namespace BatchReconcile.Records.Definitions.Loading;

/// <summary>The defined code nearest to one that is not defined, for "did you mean" hints in definition errors.</summary>
/// <remarks>
/// Nearest by edit distance (insertions, deletions, substitutions and swaps of two neighbouring characters, one
/// each: the optimal string alignment form of the Damerau-Levenshtein distance), ignoring case; a code is suggested only when it differs in at most a third of its characters (at least one), so
/// that a hint is a likely typing slip, not an unrelated material. Ties go to the first in ordinal order.
/// </remarks>
internal static class NearestCode
{
    public static string? Find(string unknown, IEnumerable<string> defined)
    {
        ArgumentNullException.ThrowIfNull(unknown);
        ArgumentNullException.ThrowIfNull(defined);
        var target = unknown.Trim().ToUpperInvariant();
        if (target.Length == 0)
        {
            return null;
        }

        var allowed = Math.Max(1, target.Length / 3);
        string? best = null;
        var bestDistance = int.MaxValue;
        foreach (var code in defined.Order(StringComparer.Ordinal))
        {
            var distance = Distance(target, code.ToUpperInvariant());
            if (distance < bestDistance)
            {
                (best, bestDistance) = (code, distance);
            }
        }

        return bestDistance <= allowed ? best : null;
    }

    /// <summary>" (did you mean 'HCL'?)", or empty when no defined code is near.</summary>
    public static string Hint(string unknown, IEnumerable<string> defined) =>
        Find(unknown, defined) is { } near ? $" (did you mean '{near}'?)" : string.Empty;

    /// <summary>Optimal string alignment distance: Levenshtein plus the swap of two neighbouring characters as one edit.</summary>
    private static int Distance(string a, string b)
    {
        var d = new int[a.Length + 1, b.Length + 1];
        for (var i = 0; i <= a.Length; i++)
        {
            d[i, 0] = i;
        }

        for (var j = 0; j <= b.Length; j++)
        {
            d[0, j] = j;
        }

        for (var i = 1; i <= a.Length; i++)
        {
            for (var j = 1; j <= b.Length; j++)
            {
                var cost = a[i - 1] == b[j - 1] ? 0 : 1;
                d[i, j] = Math.Min(Math.Min(d[i - 1, j] + 1, d[i, j - 1] + 1), d[i - 1, j - 1] + cost);
                if (i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1])
                {
                    d[i, j] = Math.Min(d[i, j], d[i - 2, j - 2] + 1);
                }
            }
        }

        return d[a.Length, b.Length];
    }
}
