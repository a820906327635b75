using BatchReconcile.Chemistry.Formulas;

namespace BatchReconcile.Records.Definitions;

/// <summary>A material of the process definitions, with its parsed formula.</summary>
/// <param name="Vented">Leaves the vessel as gas and is never weighed (CO2, H2, HCl, isobutylene ...).</param>
/// <param name="SourceFile">The definition file it came from, for messages.</param>
public sealed record Material(string Code, string Name, Formula Formula, MaterialRole Role, bool Vented, string SourceFile);
