using BatchReconcile.Chemistry.Formulas;

namespace BatchReconcile.Records.Definitions;

/// <summary>A material of the process definitions: a substance with its parsed formula, or a solution of such substances.</summary>
/// <param name="Formula">The parsed formula; null exactly when the material is a solution (<see cref="Composition"/>).</param>
/// <param name="Vented">Leaves the vessel as gas and is never weighed (CO2, H2, HCl, isobutylene ...).</param>
/// <param name="SourceFile">The definition file it came from, for messages.</param>
public sealed record Material(string Code, string Name, Formula? Formula, MaterialRole Role, bool Vented, string SourceFile)
{
    /// <summary>
    /// A solution's components by mass % (hydrochloric acid 36 %: HCL 36, WATER 64), the main one first; empty for a
    /// substance. Components are substances of the same catalog; fractions add up to 100 (docs/process-definitions.md).
    /// </summary>
    public IReadOnlyList<SolutionComponent> Composition { get; init; } = [];

    public bool IsSolution => Composition.Count > 0;
}
