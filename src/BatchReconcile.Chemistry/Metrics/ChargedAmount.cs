namespace BatchReconcile.Chemistry.Metrics;

/// <summary>Amount of one charged material of interest: a reactant of the equation or a reagent with a known molar mass.</summary>
/// <param name="Material">Material code.</param>
/// <param name="Coefficient">ν in the equation; null for a reagent outside the equation.</param>
/// <param name="MolarMassGPerMol">Molar mass in g/mol.</param>
/// <param name="ChargedKg">Σ m·a/100 over the material's charge rows, in kg.</param>
/// <param name="AmountKmol">n = ChargedKg / M in kmol (kg over g/mol).</param>
/// <param name="Equivalents">n / n_L, moles charged relative to the limiting reactant (no division by ν, the way chemists write "3.3 equiv"); null when the limiting reactant is undefined.</param>
public sealed record ChargedAmount(
    string Material,
    double? Coefficient,
    double MolarMassGPerMol,
    double ChargedKg,
    double AmountKmol,
    double? Equivalents)
{
    /// <summary>n/ν in kmol, the quantity compared to find the limiting reactant; null outside the equation.</summary>
    public double? AmountPerCoefficientKmol => Coefficient is { } nu ? AmountKmol / nu : null;
}
