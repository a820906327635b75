using BatchReconcile.Reconciliation.Settings;
using BatchReconcile.Reconciliation.Tests.Support;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Tests;

/// <summary>
/// A QC sample of the product with no assay is all product. Its content must equal its mass exactly:
/// 0.208 · 100 / 100 is 0.20800000000000002 in binary floating point, one unit above the mass (IEEE 754).
/// </summary>
public class SampleRowTests
{
    private static readonly ProcessCatalog Catalog = new(
        [
            Plant.M("ENB", "ethyl 4-nitrobenzoate", "C9H9NO4"),
            Plant.M("H2", "hydrogen", "H2"),
            Plant.M("WATER", "water", "H2O", MaterialRole.Water),
            Plant.M("BZC", "benzocaine", "C9H11NO2"),
        ],
        []);

    private static readonly Recipe Recipe = Plant.Recipe(
        "BZC-S2",
        Plant.Step("S2", "nitro reduction", Plant.Reaction([(1, "ENB"), (3, "H2")], [(1, "BZC"), (2, "WATER")]), "BZC", 80, 99, 2.0));

    [Theory]
    [InlineData(0.208)]
    [InlineData(0.25)]
    [InlineData(0.1)]
    [InlineData(0.7)]
    public void A_product_sample_without_assay_counts_its_whole_mass_as_product(double sampleKg)
    {
        var batch = new BatchBuilder("BZC-2611-011", "BZC-S2")
            .Charge("S2", "ENB", 200.0, MassUnit.Kilogram)
            .Charge("S2", "H2", 6.5, MassUnit.Kilogram)
            .Product("S2", "BZC", 150.0, MassUnit.Kilogram)
            .Sample("S2", sampleKg, MassUnit.Kilogram, material: "BZC")
            .Build();

        var step = BatchReconciler.Reconcile(batch, Recipe, Catalog, new ReconciliationSettings()).Steps[0];

        var samples = step.Ladder.Single(r => r.Key == "yield-loss-product-in-samples");
        Assert.Equal(sampleKg, samples.Kg);
    }
}
