namespace BatchReconcile.Analysis.Losses;

/// <summary>One row of a loss Pareto: a step's rung (and material), its mass and its share of the losses.</summary>
/// <param name="Step">Step code.</param>
/// <param name="RungKey">Stable key of the ladder rung.</param>
/// <param name="Label">Readable name of the rung.</param>
/// <param name="Material">The material, where the rung is tied to one.</param>
/// <param name="Kg">Summed mass in kg.</param>
/// <param name="PctOfCharged">Kg as % of the total mass charged.</param>
/// <param name="SharePct">Kg as % of the sum of the positive rows; 0 for zero and negative rows.</param>
/// <param name="CumulativeSharePct">Running total of SharePct down the sorted rows (100 at the last positive row).</param>
public sealed record ParetoRow(
    string Step, string RungKey, string Label, string? Material, double Kg, double PctOfCharged, double SharePct, double CumulativeSharePct);
