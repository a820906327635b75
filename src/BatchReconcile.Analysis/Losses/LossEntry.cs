namespace BatchReconcile.Analysis.Losses;

/// <summary>Mass on one rung of a step's loss ladder (for one batch, or already summed over several).</summary>
/// <param name="Step">Step code.</param>
/// <param name="RungKey">Stable key of the ladder rung.</param>
/// <param name="Label">Readable name of the rung.</param>
/// <param name="Material">The material the mass belongs to, where the rung is tied to one.</param>
/// <param name="Kg">Mass in kg; negative where the rung ran backwards (e.g. more recovered than expected).</param>
public sealed record LossEntry(string Step, string RungKey, string Label, string? Material, double Kg);
