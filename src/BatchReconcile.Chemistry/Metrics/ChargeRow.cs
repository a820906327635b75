namespace BatchReconcile.Chemistry.Metrics;

/// <summary>One `charge` row of a step: mass put into the vessel, in kg.</summary>
/// <remarks>
/// Whether a row is a reactant is decided by its material code matching a reactant of the equation,
/// not by <see cref="Role"/>; the role only matters for charges outside the equation.
/// </remarks>
public sealed record ChargeRow
{
    private ChargeRow(string material, double grossKg, double assayPct, AuxiliaryRole role)
    {
        Material = material;
        GrossKg = grossKg;
        AssayPct = assayPct;
        Role = role;
    }

    public string Material { get; }

    /// <summary>Gross (as weighed) mass in kg.</summary>
    public double GrossKg { get; }

    /// <summary>Mass % of the named material in the gross mass, in (0, 100].</summary>
    public double AssayPct { get; }

    public AuxiliaryRole Role { get; }

    /// <summary>m·a/100: mass of the named material itself, in kg.</summary>
    public double AssayKg => GrossKg * AssayPct / 100;

    /// <exception cref="ArgumentException">Empty material, negative or non-finite mass, assay outside (0, 100].</exception>
    public static ChargeRow Create(string material, double grossKg, double assayPct = 100, AuxiliaryRole role = AuxiliaryRole.Other)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(material);
        Guard.FiniteNonNegative(grossKg, nameof(grossKg), material);
        Guard.AssayPct(assayPct, nameof(assayPct), material);
        return new ChargeRow(material, grossKg, assayPct, role);
    }
}
