namespace BatchReconcile.Storage.Queries;

/// <summary>
/// The loss ladders of a recipe's current batch revisions summed per step and rung, and the rungs' per-material parts per
/// step, rung and material: what <c>losses</c> and the report's Pareto are built from (<c>BatchStore.LossTotalsOfRecipe</c>).
/// </summary>
/// <param name="Batches">Current batch revisions of the recipe in the period.</param>
/// <param name="ChargedKg">All mass charged at every step of those batches (Σ m_in).</param>
/// <param name="Rungs">Per step and rung, in the order first met (steps in production and step order, rungs in ladder order).</param>
/// <param name="Parts">Per step, rung and material, for the batches stored with parts.</param>
public sealed record LossTotals(int Batches, double ChargedKg, IReadOnlyList<RungTotal> Rungs, IReadOnlyList<RungPartTotal> Parts);

/// <param name="Label">The rung's label as stored with the first batch that has it.</param>
public sealed record RungTotal(string Step, string RungKey, string Label, double Kg);

public sealed record RungPartTotal(string Step, string RungKey, string Material, double Kg);
