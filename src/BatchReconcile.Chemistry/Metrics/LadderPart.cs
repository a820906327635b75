namespace BatchReconcile.Chemistry.Metrics;

/// <summary>The share of one material in a loss-ladder rung that is tied to materials.</summary>
/// <param name="Material">Material code (catalog spelling); for the auxiliaries rung also a solution's own code
/// (the part of its weighed mass that no component accounts for).</param>
/// <param name="Kg">Mass in kg; signed like its rung (recovered beyond what was charged as auxiliary makes it negative).</param>
public sealed record LadderPart(string Material, double Kg);
