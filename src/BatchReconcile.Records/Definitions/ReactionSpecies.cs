namespace BatchReconcile.Records.Definitions;

/// <summary>One species of a step's balanced reaction, by material code.</summary>
/// <param name="Coefficient">The stoichiometric coefficient ν of the balanced equation (positive).</param>
public sealed record ReactionSpecies(string MaterialCode, double Coefficient);
