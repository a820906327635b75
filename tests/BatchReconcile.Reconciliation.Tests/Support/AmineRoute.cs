using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Reconciliation.Settings;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Tests.Support;

/// <summary>
/// A three-step route of an invented plant, benzylamine hydrochloride from benzyl cyanide, with its reagents bought as
/// solutions (commercial strengths, common practice: hydrochloric acid 36 %, sodium hypochlorite 12.5 % with 1 % NaOH,
/// sodium hydroxide 50 %):
/// <list type="bullet">
/// <item>S1 nitrile hydration: BCN + H2O -> PAA (phenylacetamide) in 36 % hydrochloric acid, whose water is the only
/// water of the step (benzyl cyanide to phenylacetamide with concentrated hydrochloric acid is an Organic Syntheses
/// preparation, from memory).</item>
/// <item>S2 Hofmann rearrangement: PAA + NaOCl + 2 NaOH -> BNA (benzylamine) + Na2CO3 + NaCl + H2O.</item>
/// <item>S3 salt formation: BNA + HCl -> BNA·HCl, from 36 % hydrochloric acid.</item>
/// </list>
/// Hypochlorite with acid gives chlorine and 36 % hydrochloric acid fumes: the figures support, not replace, the site's
/// procedures and qualified review.
/// </summary>
internal static class AmineRoute
{
    public const string RecipeCode = "BNA-300";

    public static readonly ProcessCatalog Catalog = new(
        [
            Plant.M("BCN", "benzyl cyanide", "C8H7N"),
            Plant.M("WATER", "water", "H2O", MaterialRole.Water),
            Plant.M("HCL", "hydrogen chloride", "HCl", MaterialRole.Reagent),
            Plant.M("PAA", "phenylacetamide", "C8H9NO"),
            Plant.M("NAOCL", "sodium hypochlorite", "NaClO", MaterialRole.Reagent),
            Plant.M("NAOH", "sodium hydroxide", "NaOH", MaterialRole.Reagent),
            Plant.M("BNA", "benzylamine", "C7H9N"),
            Plant.M("NA2CO3", "sodium carbonate", "Na2CO3"),
            Plant.M("NACL", "sodium chloride", "NaCl"),
            Plant.M("BNAHCL", "benzylamine hydrochloride", "C7H10ClN"),
            Plant.Solution("HCL36", "hydrochloric acid 36 %", ("HCL", 36), ("WATER", 64)),
            Plant.Solution("NAOCL13", "sodium hypochlorite solution 12.5 %", ("NAOCL", 12.5), ("NAOH", 1.0), ("WATER", 86.5)),
            Plant.Solution("NAOH50", "sodium hydroxide 50 %", ("NAOH", 50), ("WATER", 50)),
        ],
        []);

    public static RecipeStep S1(Dictionary<string, ValueRange>? equivalents = null) => Plant.Step(
        "S1", "nitrile hydration", Plant.Reaction([(1, "BCN"), (1, "WATER")], [(1, "PAA")]), "PAA", 80, 95, 2.0,
        equivalents ?? new() { ["HCL"] = new ValueRange(4.0, 5.5) });

    public static RecipeStep S2() => Plant.Step(
        "S2", "Hofmann rearrangement",
        Plant.Reaction([(1, "PAA"), (1, "NAOCL"), (2, "NAOH")], [(1, "BNA"), (1, "NA2CO3"), (1, "NACL"), (1, "WATER")]),
        "BNA", 75, 90, 3.0);

    public static RecipeStep S3() => Plant.Step(
        "S3", "salt formation", Plant.Reaction([(1, "BNA"), (1, "HCL")], [(1, "BNAHCL")]), "BNAHCL", 90, 99, 2.0,
        new() { ["HCL"] = new ValueRange(1.05, 1.2) });

    public static Recipe Recipe(params RecipeStep[] steps) => Plant.Recipe(RecipeCode, steps.Length > 0 ? steps : [S1(), S2(), S3()]);

    /// <summary>S1 alone: BCN 150.0 kg @ 99.0 % (148.5 kg), 36 % hydrochloric acid; product 147.0 kg; mother liquor 600.0 kg.</summary>
    public static BatchBuilder S1Rows(BatchBuilder b, double acidKg = 600.0, double? acidAssay = null) => b
        .Charge("S1", "BCN", 150.0, MassUnit.Kilogram, 99.0)
        .Charge("S1", "HCL36", acidKg, MassUnit.Kilogram, acidAssay)
        .Product("S1", "PAA", 147.0, MassUnit.Kilogram)
        .Waste("S1", "mother liquor", 600.0, MassUnit.Kilogram);

    /// <summary>
    /// The whole batch. S2 charges <paramref name="paaKg"/> of S1's 147.0 kg (145.0: 2.0 kg held back), sodium
    /// hypochlorite 12.5 % 750 kg and sodium hydroxide 50 % 200 kg; isolates 95.0 kg benzylamine, aqueous 995.0 kg.
    /// S3 charges all 95.0 kg with 36 % hydrochloric acid 100 kg; isolates 120.0 kg of the salt, filtrate 74.0 kg.
    /// </summary>
    public static BatchBuilder Rows(double paaKg = 145.0, bool withS2 = true, double? hypochloriteAssay = null)
    {
        var b = S1Rows(new BatchBuilder("BNA-2612-014", RecipeCode));
        if (withS2)
        {
            b.Charge("S2", "PAA", paaKg, MassUnit.Kilogram)
                .Charge("S2", "NAOCL13", 750.0, MassUnit.Kilogram, hypochloriteAssay)
                .Charge("S2", "NAOH50", 200.0, MassUnit.Kilogram)
                .Product("S2", "BNA", 95.0, MassUnit.Kilogram)
                .Waste("S2", "aqueous", 995.0, MassUnit.Kilogram);
        }

        return b
            .Charge("S3", "BNA", 95.0, MassUnit.Kilogram)
            .Charge("S3", "HCL36", 100.0, MassUnit.Kilogram)
            .Product("S3", "BNAHCL", 120.0, MassUnit.Kilogram)
            .Waste("S3", "filtrate", 74.0, MassUnit.Kilogram);
    }

    public static BatchOutcome Reconcile(BatchBuilder rows, Recipe? recipe = null, ReconciliationSettings? settings = null) =>
        BatchReconciler.Reconcile(rows.Build(), recipe ?? Recipe(), Catalog, settings ?? new ReconciliationSettings());
}
