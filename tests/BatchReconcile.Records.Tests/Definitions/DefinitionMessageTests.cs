using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Definitions.Loading;

namespace BatchReconcile.Records.Tests.Definitions;

/// <summary>
/// What a process chemist reads when a definition file is refused: every message names file, recipe, version and
/// step; a reaction that does not balance says by how much each element differs and, where one loaded material
/// makes the difference up, which one is probably missing and on which side; an unknown code suggests the nearest.
/// </summary>
public sealed class DefinitionMessageTests
{
    // Molecular formulas from memory (as listed in PubChem): benzonitrile C7H5N, benzamide C7H7NO, piperazine C4H10N2,
    // piperazine dihydrochloride C4H12Cl2N2, 4-nitrobenzoic acid C7H5NO4, ethyl 4-nitrobenzoate C9H9NO4. The balanced
    // forms (nitrile + water -> amide; diamine + 2 HCl -> dihydrochloride; acid + ethanol -> ester + water) are common practice.
    private const string Materials = """
        { "code": "BZN", "name": "benzonitrile", "formula": "C7H5N" },
        { "code": "BZA", "name": "benzamide", "formula": "C7H7NO" },
        { "code": "PPZ", "name": "piperazine", "formula": "C4H10N2" },
        { "code": "PPZ2HCL", "name": "piperazine dihydrochloride", "formula": "C4H12Cl2N2" },
        { "code": "HCL", "name": "hydrogen chloride", "formula": "HCl" },
        { "code": "NBA", "name": "4-nitrobenzoic acid", "formula": "C7H5NO4" },
        { "code": "ETOH", "name": "ethanol", "formula": "C2H6O", "role": "solvent" },
        { "code": "ENB", "name": "ethyl 4-nitrobenzoate", "formula": "C9H9NO4" },
        { "code": "WATER", "name": "water", "formula": "H2O", "role": "water" }
        """;

    [Theory]
    [InlineData("1 BZN -> BZA", "BZA",
        "H differs by 2 (reactants 5, products 7) and O by 1 (reactants 0, products 1): is a WATER (water) missing on the left (or one too many on the right)?")]
    [InlineData("NBA + 1 ETOH -> ENB", "ENB",
        "H differs by 2 (reactants 11, products 9) and O by 1 (reactants 5, products 4): is a WATER (water) missing on the right (or one too many on the left)?")]
    [InlineData("1 PPZ -> PPZ2HCL", "PPZ2HCL",
        "H differs by 2 (reactants 10, products 12) and Cl by 2 (reactants 0, products 2): are 2 HCL (hydrogen chloride) missing on the left (or 2 too many on the right)?")]
    [InlineData("1 BZN + HCL -> BZA", "BZA",
        "H differs by 1 (reactants 6, products 7), Cl by 1 (reactants 1, products 0) and O by 1 (reactants 0, products 1)")]
    [InlineData("2 PPZ -> PPZ2HCL", "PPZ2HCL",
        "C differs by 4 (reactants 8, products 4), H by 8 (reactants 20, products 12), N by 2 (reactants 4, products 2) and Cl by 2 (reactants 0, products 2)")]
    public void A_reaction_that_does_not_balance_names_each_difference_and_the_material_that_would_make_it_up(string reaction, string product, string expected)
    {
        var error = Assert.Single(Load(DefinitionsWith(reaction, product)).Errors);

        Assert.Equal($"reaction '{reaction}' does not balance: {expected}", error.Message);
        Assert.Equal(("processes/step.json", "T-1", 1, "S1"), (error.File, error.Recipe, error.Version, error.Step));
        Assert.Equal($"processes/step.json, recipe T-1 version 1, step S1: {error.Message}", error.ToString());
    }

    [Theory]
    [InlineData("BZN + WATR -> BZA", "BZA", "reaction 'BZN + WATR -> BZA' names 'WATR', which is not a material in any loaded file (species are written with material codes) (did you mean 'WATER'?)")]
    [InlineData("BZN + WATER -> BZA", "BZAM", "product 'BZAM' is not a material in any loaded file (did you mean 'BZA'?)")]
    [InlineData("BZN + XYLENE -> BZA", "BZA", "reaction 'BZN + XYLENE -> BZA' names 'XYLENE', which is not a material in any loaded file (species are written with material codes)")]
    public void An_unknown_code_suggests_the_nearest_defined_one_when_one_is_near(string reaction, string product, string expected)
    {
        var errors = Load(DefinitionsWith(reaction, product)).Errors;

        Assert.Contains(expected, errors.Select(e => e.Message));
    }

    [Fact]
    public void Equivalents_naming_an_unknown_code_suggest_the_nearest()
    {
        var json = TestDefinitions.OneStep(Materials, "BZN + WATER -> BZA", "BZA", """, "equivalents": { "WATERR": { "min": 1.0, "max": 3.0 } }""");

        var error = Assert.Single(Load(json).Errors);

        Assert.Equal("equivalents name 'WATERR', which is not a material in any loaded file (did you mean 'WATER'?)", error.Message);
    }

    [Theory]
    [InlineData("WATR", "WATER")]
    [InlineData("water", "WATER")]
    [InlineData("HC1", "HCL")]
    [InlineData("HLC", "HCL")]
    [InlineData("PPZ2HC", "PPZ2HCL")]
    [InlineData("ETOHX", "ETOH")]
    [InlineData("XYLENE", null)]
    [InlineData("H", null)]
    public void The_nearest_code_is_a_small_slip_away_or_none(string unknown, string? nearest)
    {
        string[] defined = ["BZN", "BZA", "PPZ", "PPZ2HCL", "HCL", "NBA", "ETOH", "ENB", "WATER"];

        Assert.Equal(nearest, NearestCode.Find(unknown, defined));
    }

    [Fact]
    public void Every_problem_of_a_recipe_names_its_version_and_a_balanced_note_does_too()
    {
        var json = TestDefinitions.Benzocaine
            .Change("\"version\": 1", "\"version\": 3")
            .Change("\"reaction\": \"ENB + 3 H2 -> BZC + 2 WATER\"", "\"reaction\": \"ENB + 3 H2 -> BZC + WATER\"");
        using var folder = new DefinitionFolder().With("bzc.json", json);

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        var error = Assert.Single(result.Errors);
        Assert.StartsWith("processes/bzc.json, recipe BZC-900 version 3, step S2: reaction 'ENB + 3 H2 -> BZC + WATER' does not balance: ", error.ToString(), StringComparison.Ordinal);
        Assert.EndsWith("is a WATER (water) missing on the right (or one too many on the left)?", error.Message, StringComparison.Ordinal);
        var note = Assert.Single(result.Notes);
        Assert.Equal(("BZC-900", 3, "S1"), (note.Recipe, note.Version, note.Step));
        Assert.StartsWith("processes/bzc.json, recipe BZC-900 version 3, step S1: reaction 'NBA + ETOH -> ENB + WATER' was written without coefficients", note.ToString(), StringComparison.Ordinal);
    }

    private static string DefinitionsWith(string reaction, string product) => TestDefinitions.OneStep(Materials, reaction, product);

    private static ProcessDefinitionLoadResult Load(string json)
    {
        using var folder = new DefinitionFolder().With("step.json", json);
        return ProcessDefinitionLoader.LoadFolder(folder.Path);
    }
}
