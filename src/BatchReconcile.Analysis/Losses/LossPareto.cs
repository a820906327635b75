namespace BatchReconcile.Analysis.Losses;

/// <summary>Sums loss-ladder entries per step, rung and material and orders them as a Pareto.</summary>
/// <remarks>
/// <para>
/// Entries with the same (Step, RungKey, Material) are summed into one row (ordinal comparison; the label of
/// the first such entry is kept). Rows are sorted by Kg descending, ties by Step, RungKey and Material, so
/// rows with negative mass (a rung that ran backwards) come last.
/// </para>
/// <para>
/// SharePct = Kg / P · 100 where P is the sum of the positive rows, so the shares of the positive rows add
/// up to 100 and a negative row neither takes a share nor reduces the others; zero and negative rows have
/// SharePct 0 and carry the cumulative share forward. When no row is positive every share is 0.
/// PctOfCharged = Kg / totalChargedKg · 100 for every row, negative ones included.
/// </para>
/// </remarks>
public static class LossPareto
{
    /// <summary>The Pareto of <paramref name="entries"/> against <paramref name="totalChargedKg"/> (kg charged over the same batches).</summary>
    /// <exception cref="ArgumentOutOfRangeException">totalChargedKg not a finite number &gt; 0 while there are entries.</exception>
    /// <exception cref="ArgumentException">An entry whose mass is not a finite number.</exception>
    public static IReadOnlyList<ParetoRow> Build(IEnumerable<LossEntry> entries, double totalChargedKg)
    {
        ArgumentNullException.ThrowIfNull(entries);
        var sums = new Dictionary<(string Step, string Rung, string? Material), (string Label, double Kg)>();
        var order = new List<(string Step, string Rung, string? Material)>();
        foreach (var entry in entries)
        {
            ArgumentNullException.ThrowIfNull(entry, nameof(entries));
            if (!double.IsFinite(entry.Kg))
                throw new ArgumentException(
                    FormattableString.Invariant($"loss entry {entry.Step}/{entry.RungKey} has {entry.Kg:R} kg, not a finite number"), nameof(entries));
            var key = (entry.Step, entry.RungKey, entry.Material);
            if (sums.TryGetValue(key, out var sum)) sums[key] = (sum.Label, sum.Kg + entry.Kg);
            else
            {
                sums[key] = (entry.Label, entry.Kg);
                order.Add(key);
            }
        }

        if (order.Count == 0) return [];
        if (!(totalChargedKg > 0) || double.IsInfinity(totalChargedKg))
            throw new ArgumentOutOfRangeException(nameof(totalChargedKg), totalChargedKg, "the total charged mass must be a finite number > 0");

        var sorted = order
            .Select(key => (Key: key, sums[key].Label, sums[key].Kg))
            .OrderByDescending(r => r.Kg)
            .ThenBy(r => r.Key.Step, StringComparer.Ordinal)
            .ThenBy(r => r.Key.Rung, StringComparer.Ordinal)
            .ThenBy(r => r.Key.Material, StringComparer.Ordinal)
            .ToList();

        double positive = 0;
        foreach (var row in sorted)
        {
            if (row.Kg > 0) positive += row.Kg;
        }

        var rows = new List<ParetoRow>(sorted.Count);
        double running = 0;
        foreach (var row in sorted)
        {
            double share = 0;
            if (row.Kg > 0)
            {
                running += row.Kg;
                share = row.Kg / positive * 100;
            }

            double cumulative = positive > 0 ? running / positive * 100 : 0;
            rows.Add(new ParetoRow(row.Key.Step, row.Key.Rung, row.Label, row.Key.Material, row.Kg,
                row.Kg / totalChargedKg * 100, share, cumulative));
        }

        return rows;
    }
}
