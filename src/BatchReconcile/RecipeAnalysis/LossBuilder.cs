using BatchReconcile.Analysis.Losses;
using BatchReconcile.Digest.Model.Report;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Storage.Queries;

namespace BatchReconcile.RecipeAnalysis;

/// <summary>The loss ladders of a recipe's batches summed per step and rung, as a Pareto (docs/analysis.md, "Losses").</summary>
public static class LossBuilder
{
    /// <param name="totals">The ladders summed by the store (<c>BatchStore.LossTotalsOfRecipe</c>).</param>
    public static LossSummary Build(RecipeLossTotals totals)
    {
        ArgumentNullException.ThrowIfNull(totals);
        var charged = totals.ChargedKg;
        // Recovered mass went back for reuse: it is where mass went, not a loss, so it is not in the Pareto.
        var rungs = totals.Rungs.Where(r => r.Key != LadderRungKeys.Recovered).ToList();
        if (rungs.Count == 0 || !(charged > 0))
        {
            return new LossSummary(totals.Batches, charged, []);
        }

        var pareto = LossPareto.Build(rungs.Select(r => new LossEntry(r.Step, r.Key, r.Label, null, r.Kg)), charged);
        // The parts are listed under their rung: passing them to the Pareto too would count the same mass twice in the shares.
        // A part that sums to nothing (the limiting reactant of "excess reactants") says nothing: left out.
        var parts = rungs
            .SelectMany(r => r.Parts.Where(p => Math.Abs(p.Kg) > 1e-9 * charged)
                .Select(p => new LossPart(r.Step, r.Key, p.Material, p.Kg, 100 * p.Kg / charged, r.Kg != 0 ? 100 * p.Kg / r.Kg : 0)))
            .ToList();
        return new LossSummary(
            totals.Batches,
            charged,
            pareto.Select(p => new LossRow(p.Step, p.RungKey, p.Label, p.Material, p.Kg, p.PctOfCharged, p.SharePct, p.CumulativeSharePct)).ToList())
        {
            Parts = parts,
        };
    }
}
