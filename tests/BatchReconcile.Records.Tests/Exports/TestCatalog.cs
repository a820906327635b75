using BatchReconcile.Chemistry.Formulas;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Records.Tests.Exports;

/// <summary>A small process catalogue written by hand for the reader's tests.</summary>
/// <remarks>
/// Chemistry (formulas and balanced equations, common practice):
/// EST-7 v1: S1 Fischer esterification 4-nitrobenzoic acid + ethanol -> ethyl 4-nitrobenzoate + water;
///           S2 nitro reduction ethyl 4-nitrobenzoate + 3 H2 -> benzocaine + 2 water (Pd/C).
/// EST-7 v2: as v1, plus S3 benzocaine + HCl -> benzocaine hydrochloride.
/// DEP-3 v1: D1 Boc removal N-Boc-benzylamine -> benzylamine + CO2 + isobutylene (both vented).
/// </remarks>
internal static class TestCatalog
{
    public static ProcessCatalog Instance { get; } = Build();

    private static ProcessCatalog Build()
    {
        Material M(string code, string name, string formula, MaterialRole role = MaterialRole.Reactant, bool vented = false) =>
            new(code, name, Formula.Parse(formula), role, vented, "test.json");

        var materials = new[]
        {
            M("NBA", "4-nitrobenzoic acid", "C7H5NO4"),
            M("ETOH", "ethanol", "C2H6O", MaterialRole.Solvent),
            M("H2SO4", "sulfuric acid", "H2SO4", MaterialRole.Catalyst),
            M("ENB", "ethyl 4-nitrobenzoate", "C9H9NO4"),
            M("WATER", "water", "H2O", MaterialRole.Water),
            M("H2", "hydrogen", "H2"),
            M("PDC", "palladium on carbon", "Pd", MaterialRole.Catalyst),
            M("BZC", "benzocaine", "C9H11NO2"),
            M("HCL", "hydrogen chloride", "HCl", MaterialRole.Reagent),
            M("BZCHCL", "benzocaine hydrochloride", "C9H12ClNO2"),
            M("BOCBA", "N-Boc-benzylamine", "C12H17NO2"),
            M("BNA", "benzylamine", "C7H9N"),
            M("CO2", "carbon dioxide", "CO2", vented: true),
            M("IBU", "isobutylene", "C4H8", vented: true),
            M("DCM", "dichloromethane", "CH2Cl2", MaterialRole.Solvent),
        };

        var s1 = Step("S1", "esterification", "NBA + ETOH -> ENB + WATER", [("NBA", 1), ("ETOH", 1)], [("ENB", 1), ("WATER", 1)], "ENB");
        var s2 = Step("S2", "nitro reduction", "ENB + 3 H2 -> BZC + 2 WATER", [("ENB", 1), ("H2", 3)], [("BZC", 1), ("WATER", 2)], "BZC");
        var s3 = Step("S3", "salt formation", "BZC + HCL -> BZCHCL", [("BZC", 1), ("HCL", 1)], [("BZCHCL", 1)], "BZCHCL");
        var d1 = Step("D1", "Boc removal", "BOCBA -> BNA + CO2 + IBU", [("BOCBA", 1)], [("BNA", 1), ("CO2", 1), ("IBU", 1)], "BNA");

        var recipes = new[]
        {
            // Listed newest first on purpose: "newest" must not mean "last loaded".
            new Recipe("EST-7", 2, "benzocaine hydrochloride", [s1, s2, s3], "test.json"),
            new Recipe("EST-7", 1, "benzocaine", [s1, s2], "test.json"),
            new Recipe("DEP-3", 1, "benzylamine by Boc removal", [d1], "test.json"),
        };

        return new ProcessCatalog(materials, recipes);
    }

    private static RecipeStep Step(
        string code, string name, string reaction,
        (string Code, double Nu)[] reactants, (string Code, double Nu)[] products, string product) =>
        new(
            code,
            name,
            new RecipeReaction(
                reaction,
                reaction,
                reactants.Select(r => new ReactionSpecies(r.Code, r.Nu)).ToList(),
                products.Select(p => new ReactionSpecies(p.Code, p.Nu)).ToList()),
            product,
            new ValueRange(85, 98),
            2.0,
            new Dictionary<string, ValueRange>(),
            new Dictionary<FlagCode, FlagSeverity>(),
            null);
}
