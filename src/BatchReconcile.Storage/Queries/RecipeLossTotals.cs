using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Storage.Queries;

/// <summary>The loss ladders of a recipe's current batches in a period, summed per step and rung (<c>losses</c>, <c>report</c>).</summary>
/// <param name="Batches">Current batches with at least one step row in the period.</param>
/// <param name="StepRows">Step rows summed.</param>
/// <param name="ChargedKg">All mass charged over those step rows (the sum of their mass in).</param>
/// <param name="Rungs">One total per step and rung, in step order and then ladder order as stored.</param>
public sealed record RecipeLossTotals(int Batches, int StepRows, double ChargedKg, IReadOnlyList<RungTotal> Rungs);

/// <summary>One rung of one step summed over batches, with its per-material parts summed the same way.</summary>
/// <param name="Parts">Per-material sums, by material code; only rungs stored with parts (schema version 9 on) contribute.</param>
public sealed record RungTotal(string Step, int StepOrder, string Key, string Label, double Kg, IReadOnlyList<LadderPart> Parts);
