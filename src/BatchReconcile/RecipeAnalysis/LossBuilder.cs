using BatchReconcile.Analysis.Losses;
using BatchReconcile.Digest.Model.Report;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Storage.Queries;

namespace BatchReconcile.RecipeAnalysis;

/// <summary>The loss ladders of a recipe's batches summed per step and rung, as a Pareto (docs/analysis.md, "Losses").</summary>
public static class LossBuilder
{
    /// <param name="rows">Step rows with their ladders (<see cref="StepParts.Ladder"/>).</param>
    public static LossSummary Build(IReadOnlyList<RecipeStepRow> rows)
    {
        ArgumentNullException.ThrowIfNull(rows);
        var charged = rows.Sum(r => r.Outcome.MassInKg);
        var batches = rows.Select(r => r.BatchId).Distinct(StringComparer.Ordinal).Count();
        // Recovered mass went back for reuse: it is where mass went, not a loss, so it is not in the Pareto.
        var rungs = rows.SelectMany(r => r.Outcome.Ladder.Where(g => g.Key != LadderRungKeys.Recovered).Select(g => new LossEntry(r.Outcome.Step, g.Key, g.Label, null, g.Kg))).ToList();
        if (rungs.Count == 0 || !(charged > 0))
        {
            return new LossSummary(batches, charged, []);
        }

        var pareto = LossPareto.Build(rungs, charged);
        var totals = pareto.ToDictionary(p => (p.Step, p.RungKey), p => p.Kg);
        // The parts are summed on their own and listed under their rung: passing them to the Pareto too would count
        // the same mass twice in the shares.
        var parts = rows
            .SelectMany(r => r.Outcome.Ladder.SelectMany(g => g.Parts.Select(part => (r.Outcome.Step, g.Key, part.Material, part.Kg))))
            .GroupBy(p => (p.Step, p.Key, p.Material))
            // A part that sums to nothing (the limiting reactant of "excess reactants") says nothing: left out.
            .Where(g => Math.Abs(g.Sum(p => p.Kg)) > 1e-9 * charged)
            .Select(g =>
            {
                var kg = g.Sum(p => p.Kg);
                var rung = totals.GetValueOrDefault((g.Key.Step, g.Key.Key));
                return new LossPart(g.Key.Step, g.Key.Key, g.Key.Material, kg, 100 * kg / charged, rung != 0 ? 100 * kg / rung : 0);
            })
            .ToList();
        return new LossSummary(
            batches,
            charged,
            pareto.Select(p => new LossRow(p.Step, p.RungKey, p.Label, p.Material, p.Kg, p.PctOfCharged, p.SharePct, p.CumulativeSharePct)).ToList())
        {
            Parts = parts,
        };
    }
}
