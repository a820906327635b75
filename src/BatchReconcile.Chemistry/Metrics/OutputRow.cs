namespace BatchReconcile.Chemistry.Metrics;

/// <summary>One weighed output row of a step (product, waste, recovered or sample), in kg.</summary>
/// <remarks>
/// <see cref="ProductKg"/> is the mass of the step's desired product inside the row. The batch-record
/// layer resolves it (assay of a product row, an `analysis` row or assay on a waste stream), so this
/// layer never needs to know how stream compositions were recorded.
/// </remarks>
public sealed record OutputRow
{
    private OutputRow(OutputKind kind, double grossKg, double productKg, double productFraction, AuxiliaryRole role, string? material = null)
    {
        Material = material;
        Kind = kind;
        GrossKg = grossKg;
        ProductKg = productKg;
        ProductFraction = productFraction;
        Role = role;
    }

    public OutputKind Kind { get; }

    /// <summary>The material a recovered row names (catalog spelling), for the per-material parts of the loss ladder; null when not given.</summary>
    public string? Material { get; }

    /// <summary>Gross (as weighed) mass in kg.</summary>
    public double GrossKg { get; }

    /// <summary>Mass of the desired product contained in this row, in kg.</summary>
    public double ProductKg { get; }

    /// <summary>Solvent/water/other, for recovered rows; <see cref="AuxiliaryRole.Other"/> for every other kind.</summary>
    public AuxiliaryRole Role { get; }

    /// <summary>d(ProductKg)/d(GrossKg): the sensitivity the vented-gas estimate has to this row's weighing.</summary>
    internal double ProductFraction { get; }

    /// <summary>An isolated product row; its product content is m·a/100.</summary>
    public static OutputRow Product(double grossKg, double assayPct = 100)
    {
        Guard.FiniteNonNegative(grossKg, nameof(grossKg), "product row");
        Guard.AssayPct(assayPct, nameof(assayPct), "product row");
        return new OutputRow(OutputKind.Product, grossKg, grossKg * assayPct / 100, assayPct / 100, AuxiliaryRole.Other);
    }

    /// <summary>A waste stream, with the mass of desired product found in it (0 when not analysed).</summary>
    public static OutputRow Waste(double grossKg, double productKg = 0) => WithContent(OutputKind.Waste, grossKg, productKg);

    /// <summary>A QC sample, with the mass of desired product in it (0 when the sample is not of the product).</summary>
    public static OutputRow Sample(double grossKg, double productKg = 0) => WithContent(OutputKind.Sample, grossKg, productKg);

    /// <summary>A recovered stream; the role tells the simple E-factor whether it is solvent or water.</summary>
    /// <param name="material">The material the row names; without it the auxiliaries rung has no per-material parts.</param>
    public static OutputRow Recovered(double grossKg, AuxiliaryRole role = AuxiliaryRole.Other, string? material = null)
    {
        Guard.FiniteNonNegative(grossKg, nameof(grossKg), "recovered row");
        if (material is not null)
        {
            ArgumentException.ThrowIfNullOrWhiteSpace(material);
        }

        return new OutputRow(OutputKind.Recovered, grossKg, 0, 0, role, material);
    }

    private static OutputRow WithContent(OutputKind kind, double grossKg, double productKg)
    {
        string what = kind == OutputKind.Waste ? "waste row" : "sample row";
        Guard.FiniteNonNegative(grossKg, nameof(grossKg), what);
        Guard.FiniteNonNegative(productKg, nameof(productKg), what);
        if (productKg > grossKg)
        {
            throw new ArgumentException($"{what}: product content exceeds the gross mass.", nameof(productKg));
        }

        // The product content of a waste or sample row comes from an analysis, not from this weighing,
        // so its sensitivity to the row's gross mass is taken as zero.
        return new OutputRow(kind, grossKg, productKg, 0, AuxiliaryRole.Other);
    }
}
