namespace BatchReconcile.Records.Definitions;

/// <summary>One component of a solution material: another material (with a formula) and its share by mass.</summary>
/// <param name="MaterialCode">The component's material code, in the catalog's spelling.</param>
/// <param name="MassPct">Nominal mass % of the component in the solution, in (0, 100].</param>
public sealed record SolutionComponent(string MaterialCode, double MassPct);
