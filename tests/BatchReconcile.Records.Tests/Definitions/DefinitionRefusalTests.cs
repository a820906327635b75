using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Definitions.Loading;

namespace BatchReconcile.Records.Tests.Definitions;

/// <summary>Each kind of bad definition is refused with a message that says where and why.</summary>
public class DefinitionRefusalTests
{
    // Each row changes one thing in a valid file: what kind of refusal, the change, where the error
    // must be located (recipe, step; null for material errors) and a fragment its message must hold.
    public static TheoryData<string, string, string, string?, string?, string> OneChange => new()
    {
        {
            "unbalanced reaction: names the element and the amount, with both totals",
            "\"ENB + 3 H2 -> BZC + 2 WATER\"", "\"ENB + 2 H2 -> BZC + 2 WATER\"",
            // H: reactants 9 (ENB) + 2·2 = 13; products 11 (BZC) + 2·2 = 15.
            "BZC-900", "S2", "reaction 'ENB + 2 H2 -> BZC + 2 WATER' does not balance: H differs by 2 (reactants 13, products 15): is a H2 (hydrogen) missing on the left (or one too many on the right)?"
        },
        {
            "unknown material in a reaction",
            "\"NBA + ETOH -> ENB + WATER\"", "\"NBA + ETHANOL -> ENB + WATER\"",
            "BZC-900", "S1", "names 'ETHANOL', which is not a material in any loaded file"
        },
        {
            "a formula written in a reaction instead of a material code",
            "\"ENB + 3 H2 -> BZC + 2 WATER\"", "\"ENB + 3 H2 -> BZC + 2 H2O\"",
            "BZC-900", "S2", "names 'H2O', which is not a material"
        },
        {
            "bad formula: names the formula and the character",
            "\"formula\": \"C9H11NO2\"", "\"formula\": \"C9H11NQ2\"",
            null, null, "material 'BZC': formula 'C9H11NQ2' is not valid: unknown element 'Q' at 7"
        },
        {
            "bad role",
            "\"role\": \"water\"", "\"role\": \"oxidant\"",
            null, null, "material 'WATER': role 'oxidant' is not known; expected one of reactant, solvent, catalyst, reagent, water, workup"
        },
        {
            "material code that cannot be written in a reaction",
            "\"code\": \"WATER\"", "\"code\": \"PROCESS WATER\"",
            null, null, "a material code starts with a letter"
        },
        {
            "vented given as a string",
            "\"role\": \"water\"", "\"role\": \"water\", \"vented\": \"yes\"",
            null, null, "material 'WATER': 'vented' must be true or false, found the string \"yes\""
        },
        {
            "yield range upside down",
            "{ \"min\": 85, \"max\": 96 }", "{ \"min\": 96, \"max\": 85 }",
            "BZC-900", "S1", "'yieldPct': min 96 is above max 85"
        },
        {
            "yield range above 100 %",
            "{ \"min\": 88, \"max\": 98 }", "{ \"min\": 88, \"max\": 101 }",
            "BZC-900", "S2", "'yieldPct': max 101 must be at most 100"
        },
        {
            "yield range below 0",
            "{ \"min\": 88, \"max\": 98 }", "{ \"min\": -1, \"max\": 98 }",
            "BZC-900", "S2", "min -1 must be at least 0"
        },
        {
            "yield bound given as text",
            "{ \"min\": 88, \"max\": 98 }", "{ \"min\": \"88\", \"max\": 98 }",
            "BZC-900", "S2", "'min' must be a number, found the string \"88\""
        },
        {
            "equivalents of zero",
            "{ \"min\": 8.0, \"max\": 14.0 }", "{ \"min\": 0, \"max\": 14.0 }",
            "BZC-900", "S1", "equivalents of 'ETOH': min 0 must be more than 0"
        },
        {
            "equivalents upside down",
            "{ \"min\": 3.0, \"max\": 3.6 }", "{ \"min\": 3.6, \"max\": 3.0 }",
            "BZC-900", "S2", "equivalents of 'H2': min 3.6 is above max 3"
        },
        {
            "equivalents naming an unknown material",
            "\"H2\": { \"min\": 3.0", "\"D2\": { \"min\": 3.0",
            "BZC-900", "S2", "equivalents name 'D2', which is not a material in any loaded file"
        },
        {
            "unknown flag code in severities",
            "\"balanceTolerancePct\": 1.5,", "\"balanceTolerancePct\": 1.5, \"severities\": { \"yield-lower\": \"minor\" },",
            "BZC-900", "S2", "severities: 'yield-lower' is not a flag code; expected one of yield-low, yield-high"
        },
        {
            "unknown severity in severities",
            "\"balanceTolerancePct\": 1.5,", "\"balanceTolerancePct\": 1.5, \"severities\": { \"balance-gap\": \"urgent\" },",
            "BZC-900", "S2", "severities: 'balance-gap' has severity the string \"urgent\"; expected \"critical\", \"major\" or \"minor\""
        },
        {
            "product-in-waste limit above 100 %",
            "\"balanceTolerancePct\": 1.5,", "\"balanceTolerancePct\": 1.5, \"productInWasteMaxPct\": 150,",
            "BZC-900", "S2", "'productInWasteMaxPct' must be from 0 to 100, found 150"
        },
        {
            "product not on the product side",
            "\"product\": \"ENB\"", "\"product\": \"NBA\"",
            "BZC-900", "S1", "product 'NBA' is not on the product side of reaction 'NBA + ETOH -> ENB + WATER'"
        },
        {
            "product that is not a material",
            "\"product\": \"ENB\"", "\"product\": \"ESTER\"",
            "BZC-900", "S1", "product 'ESTER' is not a material in any loaded file"
        },
        {
            "balance tolerance of zero",
            "\"balanceTolerancePct\": 1.5", "\"balanceTolerancePct\": 0",
            "BZC-900", "S2", "'balanceTolerancePct' must be more than 0 and at most 100, found 0"
        },
        {
            "recipe version 0",
            "\"version\": 1", "\"version\": 0",
            "BZC-900", null, "'version' must be 1 or more, found 0"
        },
        {
            "recipe version with a fraction",
            "\"version\": 1", "\"version\": 1.5",
            "BZC-900", null, "'version' must be a whole number, found the number 1.5"
        },
        {
            "step code used twice",
            "\"code\": \"S2\"", "\"code\": \"s1\"",
            "BZC-900", "s1", "step code 's1' is used twice in this recipe (steps[0] and steps[1])"
        },
        {
            "required key missing",
            "\"product\": \"BZC\",", "",
            "BZC-900", "S2", "step: 'product' is required"
        },
        {
            "key in the wrong case",
            "\"balanceTolerancePct\": 1.5", "\"BalanceTolerancePct\": 1.5",
            "BZC-900", "S2", "key 'BalanceTolerancePct' must be written 'balanceTolerancePct'"
        },
        {
            "material written twice in a reaction",
            "\"ENB + 3 H2 -> BZC + 2 WATER\"", "\"ENB + 3 H2 + WATER -> BZC + 3 WATER\"",
            "BZC-900", "S2", "names material 'WATER' more than once"
        },
        {
            "reaction text that is not an equation",
            "\"ENB + 3 H2 -> BZC + 2 WATER\"", "\"ENB + 3 H2 BZC + 2 WATER\"",
            "BZC-900", "S2", "reaction 'ENB + 3 H2 BZC + 2 WATER' cannot be read at character 1: no arrow"
        },
        {
            "material code defined twice in one file",
            "{ \"code\": \"H2\",    \"name\": \"hydrogen\",              \"formula\": \"H2\" },",
            "{ \"code\": \"H2\",    \"name\": \"hydrogen\",              \"formula\": \"H2\" }, { \"code\": \"h2\", \"name\": \"hydrogen gas\", \"formula\": \"H2\" },",
            null, null, "material code 'h2' is defined twice in this file (materials[4] and materials[5])"
        },
    };

    [Theory]
    [MemberData(nameof(OneChange))]
    public void One_bad_thing_is_refused_with_a_located_message(string kind, string from, string to, string? recipe, string? step, string fragment)
    {
        _ = kind;
        using var folder = new DefinitionFolder().With("bzc.json", TestDefinitions.Benzocaine.Change(from, to));

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        Assert.False(result.IsSuccess);
        Assert.Null(result.Catalog);
        var error = Assert.Single(result.Errors, e => e.Message.Contains(fragment, StringComparison.Ordinal));
        Assert.Equal("processes/bzc.json", error.File);
        Assert.Equal(recipe, error.Recipe);
        Assert.Equal(step, error.Step);
    }

    [Fact]
    public void An_unbalanced_reaction_reads_in_full_with_file_recipe_step_and_element()
    {
        using var folder = new DefinitionFolder().With(
            "bzc.json",
            TestDefinitions.Benzocaine.Change("\"ENB + 3 H2 -> BZC + 2 WATER\"", "\"ENB + 3 H2 -> BZC + WATER\""));

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        // Partly written coefficients count as written. H: 9 + 3·2 = 15 against 11 + 2 = 13; O: 4 against 2 + 1 = 3.
        Assert.Equal(
            "processes/bzc.json, recipe BZC-900 version 1, step S2: reaction 'ENB + 3 H2 -> BZC + WATER' does not balance: "
            + "H differs by 2 (reactants 15, products 13) and O by 1 (reactants 4, products 3): is a WATER (water) missing on the right (or one too many on the left)?",
            Assert.Single(result.Errors).ToString());
    }

    [Fact]
    public void A_material_code_clash_between_files_names_both_files()
    {
        // Sodium salicylate by Kolbe-Schmitt carboxylation (from memory): both files define WATER.
        var second = TestDefinitions.OneStep(
            """
            { "code": "NAOPH", "name": "sodium phenoxide", "formula": "C6H5ONa" },
            { "code": "CO2G", "name": "carbon dioxide", "formula": "CO2" },
            { "code": "NASAL", "name": "sodium salicylate", "formula": "C7H5NaO3" },
            { "code": "WATER", "name": "process water", "formula": "H2O", "role": "water" }
            """,
            "NAOPH + CO2G -> NASAL",
            "NASAL");
        using var folder = new DefinitionFolder().With("a-bzc.json", TestDefinitions.Benzocaine).With("b-salicylate.json", second);

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        var error = Assert.Single(result.Errors);
        Assert.Equal("processes/b-salicylate.json", error.File);
        Assert.Contains("material code 'WATER' is also defined in processes/a-bzc.json", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_recipe_version_defined_in_two_files_is_refused()
    {
        var recipeOnly = "{" + TestDefinitions.Benzocaine[TestDefinitions.Benzocaine.IndexOf("\"recipes\"", StringComparison.Ordinal)..];
        using var folder = new DefinitionFolder().With("a.json", TestDefinitions.Benzocaine).With("b.json", recipeOnly);

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        var error = Assert.Single(result.Errors);
        Assert.Equal(new DefinitionError("processes/b.json", "BZC-900", null, "version 1 is also defined in processes/a.json; each recipe version must be defined once"), error);
    }

    [Fact]
    public void Two_versions_of_a_recipe_are_both_kept()
    {
        var recipeOnly = "{" + TestDefinitions.Benzocaine[TestDefinitions.Benzocaine.IndexOf("\"recipes\"", StringComparison.Ordinal)..];
        using var folder = new DefinitionFolder()
            .With("a.json", TestDefinitions.Benzocaine)
            .With("b.json", recipeOnly.Change("\"version\": 1", "\"version\": 2").Change("\"max\": 98", "\"max\": 97"));

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        Assert.True(result.IsSuccess, result.ToString());
        Assert.Equal(98, result.Catalog.FindRecipe("BZC-900", 1)!.Steps[1].YieldPct.Max);
        Assert.Equal(97, result.Catalog.NewestRecipe("BZC-900")!.Steps[1].YieldPct.Max);
    }

    [Theory]
    [InlineData("\"2026-02-30\"", "the string \"2026-02-30\"")]
    [InlineData("\"01.03.2026\"", "the string \"01.03.2026\"")]
    [InlineData("\"2026-03-01T00:00:00+01:00\"", "the string \"2026-03-01T00:00:00+01:00\"")]
    [InlineData("20260301", "the number 20260301")]
    public void An_effective_date_that_is_not_a_calendar_date_is_refused_where_it_is(string value, string described)
    {
        var json = TestDefinitions.Benzocaine.Change("\"version\": 1,", $"\"version\": 1, \"effectiveFrom\": {value},");
        using var folder = new DefinitionFolder().With("a.json", json);

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        var error = Assert.Single(result.Errors);
        Assert.Equal(("processes/a.json", "BZC-900", (string?)null), (error.File, error.Recipe, error.Step));
        Assert.Contains($"'effectiveFrom' must be a calendar date written YYYY-MM-DD", error.Message, StringComparison.Ordinal);
        Assert.Contains(described, error.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("2026-03-01", "2026-03-01")]
    [InlineData("2026-03-01", "2026-02-01")]
    public void A_later_version_that_does_not_take_effect_later_is_refused(string v1, string v2)
    {
        var recipeOnly = "{" + TestDefinitions.Benzocaine[TestDefinitions.Benzocaine.IndexOf("\"recipes\"", StringComparison.Ordinal)..];
        using var folder = new DefinitionFolder()
            .With("a.json", TestDefinitions.Benzocaine.Change("\"version\": 1,", $"\"version\": 1, \"effectiveFrom\": \"{v1}\","))
            .With("b.json", recipeOnly.Change("\"version\": 1,", $"\"version\": 2, \"effectiveFrom\": \"{v2}\","));

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        var error = Assert.Single(result.Errors);
        Assert.Equal(("processes/b.json", "BZC-900"), (error.File, error.Recipe));
        Assert.Contains($"version 2: 'effectiveFrom' {v2} is not after {v1} of version 1", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Effective_dates_are_kept_with_their_versions()
    {
        var recipeOnly = "{" + TestDefinitions.Benzocaine[TestDefinitions.Benzocaine.IndexOf("\"recipes\"", StringComparison.Ordinal)..];
        using var folder = new DefinitionFolder()
            .With("a.json", TestDefinitions.Benzocaine.Change("\"version\": 1,", "\"version\": 1, \"effectiveFrom\": \"2026-01-05\","))
            .With("b.json", recipeOnly.Change("\"version\": 1,", "\"version\": 2, \"effectiveFrom\": \"2026-03-10\","));

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        Assert.True(result.IsSuccess, result.ToString());
        Assert.Equal(new DateOnly(2026, 1, 5), result.Catalog.FindRecipe("BZC-900", 1)!.EffectiveFrom);
        Assert.Equal(2, result.Catalog.RecipeInEffect("BZC-900", new DateOnly(2026, 3, 10))!.Version);
        Assert.Equal(1, result.Catalog.RecipeInEffect("BZC-900", new DateOnly(2026, 3, 9))!.Version);
        Assert.Null(result.Catalog.RecipeInEffect("BZC-900", new DateOnly(2026, 1, 4)));
    }

    [Fact]
    public void A_vented_material_among_the_reactants_is_refused()
    {
        // Kolbe-Schmitt carboxylation, C6H5ONa + CO2 -> sodium salicylate (from memory): CO2 is consumed
        // there, so marking it vented (never weighed, leaves the vessel) is a definition error.
        var json = TestDefinitions.OneStep(
            """
            { "code": "NAOPH", "name": "sodium phenoxide", "formula": "C6H5ONa" },
            { "code": "CO2", "name": "carbon dioxide", "formula": "CO2", "vented": true },
            { "code": "NASAL", "name": "sodium salicylate", "formula": "C7H5NaO3" }
            """,
            "NAOPH + CO2 -> NASAL",
            "NASAL");
        using var folder = new DefinitionFolder().With("salicylate.json", json);

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        var error = Assert.Single(result.Errors);
        Assert.Equal(("T-1", "S1"), (error.Recipe, error.Step));
        Assert.Contains("vented material 'CO2' among the reactants", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_vented_material_cannot_be_the_isolated_product()
    {
        // Boc removal: the wanted product is the salt, not the gas (common practice).
        var json = TestDefinitions.OneStep(
            """
            { "code": "BOCPZ", "name": "tert-butyl piperazine-1-carboxylate", "formula": "C9H18N2O2" },
            { "code": "HCL", "name": "hydrogen chloride", "formula": "HCl", "role": "reagent" },
            { "code": "PPZ2HCL", "name": "piperazine dihydrochloride", "formula": "C4H10N2·2HCl" },
            { "code": "CO2", "name": "carbon dioxide", "formula": "CO2", "vented": true },
            { "code": "IBE", "name": "isobutylene", "formula": "C4H8", "vented": true }
            """,
            "BOCPZ + 2 HCL -> PPZ2HCL + CO2 + IBE",
            "IBE");
        using var folder = new DefinitionFolder().With("boc.json", json);

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        Assert.Contains("product 'IBE' is a vented material", Assert.Single(result.Errors).Message, StringComparison.Ordinal);
    }

    // Line and character of the first syntax error, 1-based; characters, not bytes.
    [Theory]
    [InlineData("{\n  \"materials\": [\n    { \"code\": \"H2\" \"name\": \"hydrogen\", \"formula\": \"H2\" }\n  ]\n}", 3, 20)] // missing comma: points at the next key
    [InlineData("{\n  \"materials\": [\n    { \"code\": \"H2\", \"name\": \"hydrogène\", \"formula\": H2 }\n  ]\n}", 3, 53)] // unquoted value; 'è' before it is one character (two bytes)
    [InlineData("{\n  \"materials\": [\n", 3, 1)] // file cut short, as while it is still being written
    public void A_json_syntax_error_names_the_line_and_character(string json, int line, int character)
    {
        using var folder = new DefinitionFolder().With("broken.json", json);

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        var error = Assert.Single(result.Errors);
        Assert.Equal("processes/broken.json", error.File);
        Assert.StartsWith($"not valid JSON at line {line}, character {character}: ", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_key_given_twice_is_refused()
    {
        using var folder = new DefinitionFolder().With("bzc.json", TestDefinitions.Benzocaine.Change("\"version\": 1", "\"version\": 1, \"version\": 2"));

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        // The second "version" key: line 12, after 6 spaces of indent and `"code": "BZC-900", "version": 1, ` (33 characters).
        var error = Assert.Single(result.Errors);
        Assert.StartsWith("not valid JSON at line 12, character 40: ", error.Message, StringComparison.Ordinal);
        Assert.Contains("'version'", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Several_errors_in_one_file_are_all_reported()
    {
        var json = TestDefinitions.Benzocaine
            .Change("\"formula\": \"C9H9NO4\"", "\"formula\": \"C9H9NO4)\"")
            .Change("\"role\": \"solvent\"", "\"role\": \"diluent\"")
            .Change("\"ENB + 3 H2 -> BZC + 2 WATER\"", "\"ENB + 3 H2 + PDC -> BZC + 2 WATER\"")
            .Change("{ \"min\": 85, \"max\": 96 }", "{ \"min\": 85 }");
        using var folder = new DefinitionFolder().With("bzc.json", json).With("good.json", TestDefinitions.OneStep(
            """
            { "code": "NAOPH", "name": "sodium phenoxide", "formula": "C6H5ONa" },
            { "code": "CO2G", "name": "carbon dioxide", "formula": "CO2" },
            { "code": "NASAL", "name": "sodium salicylate", "formula": "C7H5NaO3" }
            """,
            "NAOPH + CO2G -> NASAL",
            "NASAL"));

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        // Refused materials are reported once each, then where reactions use them; the good file adds nothing.
        Assert.False(result.IsSuccess);
        var messages = result.Errors.Select(e => e.ToString()).ToArray();
        Assert.Collection(
            messages,
            m => Assert.StartsWith("processes/bzc.json: material 'ETOH': role 'diluent' is not known", m, StringComparison.Ordinal),
            m => Assert.StartsWith("processes/bzc.json: material 'ENB': formula 'C9H9NO4)' is not valid", m, StringComparison.Ordinal),
            m => Assert.Equal("processes/bzc.json, recipe BZC-900 version 1, step S1: step: 'yieldPct': 'max' is required", m),
            m => Assert.StartsWith("processes/bzc.json, recipe BZC-900 version 1, step S1: reaction 'NBA + ETOH -> ENB + WATER' names material 'ETOH', which was refused", m, StringComparison.Ordinal),
            m => Assert.StartsWith("processes/bzc.json, recipe BZC-900 version 1, step S1: reaction 'NBA + ETOH -> ENB + WATER' names material 'ENB', which was refused", m, StringComparison.Ordinal),
            m => Assert.StartsWith("processes/bzc.json, recipe BZC-900 version 1, step S2: reaction 'ENB + 3 H2 + PDC -> BZC + 2 WATER' names material 'ENB', which was refused", m, StringComparison.Ordinal),
            m => Assert.StartsWith("processes/bzc.json, recipe BZC-900 version 1, step S2: reaction 'ENB + 3 H2 + PDC -> BZC + 2 WATER' names 'PDC', which is not a material", m, StringComparison.Ordinal));
    }
}
