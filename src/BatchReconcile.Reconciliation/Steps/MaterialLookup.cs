using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Reconciliation.Steps;

/// <summary>Materials by code, case-insensitively, always handing back the catalog's spelling.</summary>
/// <remarks>The metrics compare codes ordinally, so every code is normalised here before it reaches them.</remarks>
internal sealed class MaterialLookup(ProcessCatalog catalog)
{
    public Material Get(string code) =>
        catalog.FindMaterial(code)
        ?? throw new InvalidOperationException($"Material '{code}' is not in the process definitions; validation should have refused the export or recipe.");

    /// <summary>True when <paramref name="code"/> names the material whose catalog code is <paramref name="catalogCode"/>.</summary>
    public bool Is(string? code, string catalogCode) =>
        code is not null && string.Equals(code.Trim(), catalogCode, StringComparison.OrdinalIgnoreCase);

    /// <summary>Molar mass of a substance; a solution has none (the loader keeps solutions out of reactions and equivalents).</summary>
    public static double MolarMass(Material material) =>
        material.Formula?.MolarMass
        ?? throw new InvalidOperationException($"Material '{material.Code}' is a solution and has no molar mass; the definitions loader should have kept it out of reactions and equivalents.");
}
