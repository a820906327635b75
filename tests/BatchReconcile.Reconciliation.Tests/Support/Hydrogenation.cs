using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Reconciliation.Settings;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Tests.Support;

/// <summary>
/// The hand-worked step most tests vary: ethyl 4-nitrobenzoate + 3 H2 -> benzocaine + 2 H2O over Pd/C in ethanol,
/// ethanol distilled back. Base batch (masses as recorded; kg after conversion):
/// ENB 200.0 kg @ 98.5 % (197.0 kg); H2 6.5 kg; ethanol 1.000 t (1000 kg); Pd/C 4000 g (4.0 kg).
/// Product 150.0 kg @ 99.2 % (148.8 kg); spent catalyst 4.3 kg; still residue 112.0 kg, analysed 1.5 % benzocaine;
/// ethanol recovered 0.940 t; QC sample 250 g of benzocaine (no assay: all product).
/// </summary>
internal static class Hydrogenation
{
    public const string RecipeCode = "ENR-100";
    public const string S = "S1";

    public static readonly ProcessCatalog Catalog = new(
        [
            Plant.M("ENB", "ethyl 4-nitrobenzoate", "C9H9NO4"),
            Plant.M("H2", "hydrogen", "H2"),
            Plant.M("BZC", "benzocaine", "C9H11NO2"),
            Plant.M("WATER", "water", "H2O", MaterialRole.Water),
            Plant.M("ETOH", "ethanol", "C2H6O", MaterialRole.Solvent),
            Plant.M("PDC", "palladium on carbon", "Pd", MaterialRole.Catalyst),
        ],
        []);

    public static RecipeStep Step(
        Dictionary<FlagCode, FlagSeverity>? severities = null,
        double? productInWasteMaxPct = null,
        Dictionary<string, ValueRange>? equivalents = null) =>
        Plant.Step(
            S,
            "nitro reduction",
            Plant.Reaction([(1, "ENB"), (3, "H2")], [(1, "BZC"), (2, "WATER")]),
            "BZC",
            yieldMin: 88,
            yieldMax: 98,
            tolerancePct: 2.0,
            equivalents: equivalents ?? new() { ["H2"] = new ValueRange(3.0, 3.6) },
            severities: severities,
            productInWasteMaxPct: productInWasteMaxPct);

    public static BatchBuilder Rows(
        double productKg = 150.0,
        double productAssay = 99.2,
        double hydrogenKg = 6.5,
        double residueKg = 112.0,
        double residueProductPct = 1.5) =>
        new BatchBuilder("ENR-2611-001", RecipeCode)
            .Charge(S, "ENB", 200.0, MassUnit.Kilogram, 98.5)
            .Charge(S, "H2", hydrogenKg, MassUnit.Kilogram)
            .Charge(S, "ETOH", 1.000, MassUnit.Tonne)
            .Charge(S, "PDC", 4000, MassUnit.Gram)
            .Product(S, "BZC", productKg, MassUnit.Kilogram, productAssay, at: new DateTimeOffset(2026, 11, 24, 14, 5, 0, TimeSpan.FromHours(1)))
            .Waste(S, "spent catalyst", 4.3, MassUnit.Kilogram)
            .Waste(S, "still residue", residueKg, MassUnit.Kilogram)
            .Analysis(S, "still residue", "BZC", residueProductPct)
            .Recovered(S, "ETOH", 0.940, MassUnit.Tonne)
            .Sample(S, 250, MassUnit.Gram, "BZC");

    public static StepOutcome Reconcile(BatchBuilder rows, RecipeStep? step = null, ReconciliationSettings? settings = null) =>
        BatchReconciler.Reconcile(rows.Build(), Plant.Recipe(RecipeCode, step ?? Step()), Catalog, settings ?? new ReconciliationSettings())
            .Steps.Single();
}
