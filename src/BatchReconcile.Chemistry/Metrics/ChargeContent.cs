namespace BatchReconcile.Chemistry.Metrics;

/// <summary>One material a charge row puts into the vessel, and how much of it (kg, pure).</summary>
/// <remarks>
/// A plain charge holds one content, its own material at m·a/100. A charge of a solution (hydrochloric acid
/// 36 % in water) holds one content per component: each is counted as that component for the limiting
/// reactant, equivalents and atom economy, while the row's gross mass is what the balance weighs.
/// </remarks>
/// <param name="Material">Material code of the content (for a solution, the component's code).</param>
/// <param name="Kg">Mass of that material in the row, kg.</param>
/// <param name="Role">Its role, for the simple E-factor's solvent and water.</param>
public sealed record ChargeContent(string Material, double Kg, AuxiliaryRole Role);
