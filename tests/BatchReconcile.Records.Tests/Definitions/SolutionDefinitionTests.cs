using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Definitions.Loading;

namespace BatchReconcile.Records.Tests.Definitions;

/// <summary>Materials defined as solutions by mass fraction (issue 9, point 5): loaded, and refused where wrong with file and material.</summary>
public class SolutionDefinitionTests
{
    // Benzyl cyanide hydrated to phenylacetamide in 36 % hydrochloric acid (commercial strength, common practice).
    private const string Substances = """
        { "code": "BCN", "name": "benzyl cyanide", "formula": "C8H7N" },
        { "code": "WATER", "name": "water", "formula": "H2O", "role": "water" },
        { "code": "HCL", "name": "hydrogen chloride", "formula": "HCl", "role": "reagent" },
        { "code": "PAA", "name": "phenylacetamide", "formula": "C8H9NO" },
        """;

    private const string Acid = """{ "code": "HCL36", "name": "hydrochloric acid 36 %", "composition": { "HCL": 36, "WATER": 64 } }""";

    private static string File(string solution = Acid, string reaction = "BCN + WATER -> PAA", string product = "PAA", string extra = "") =>
        TestDefinitions.OneStep(Substances + solution, reaction, product, extra);

    [Fact]
    public void A_solution_loads_with_its_components_in_order_and_the_catalog_spelling()
    {
        using var folder = new DefinitionFolder().With(
            "paa.json",
            File("""{ "code": "HCL36", "name": "hydrochloric acid 36 %", "composition": { "hcl": 36, "WATER": 64 } }""",
                extra: """, "equivalents": { "HCL": { "min": 4.0, "max": 5.5 } }"""));

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        Assert.True(result.IsSuccess, string.Join("\n", result.Errors));
        var acid = result.Catalog!.FindMaterial("HCL36")!;
        Assert.True(acid.IsSolution);
        Assert.Null(acid.Formula);
        Assert.Equal([new SolutionComponent("HCL", 36), new SolutionComponent("WATER", 64)], acid.Composition);
        Assert.False(result.Catalog.FindMaterial("HCL")!.IsSolution);
    }

    public static TheoryData<string, string, string> Refused => new()
    {
        {
            "fractions that do not add up to 100",
            """{ "code": "HCL36", "name": "hydrochloric acid", "composition": { "HCL": 36, "WATER": 60 } }""",
            "material 'HCL36': composition adds up to 96 %, not 100 % (within 0.01); give every component, the solvent too"
        },
        {
            "a fraction of 0",
            """{ "code": "HCL36", "name": "hydrochloric acid", "composition": { "HCL": 0, "WATER": 100 } }""",
            "material 'HCL36': composition of 'HCL' must be more than 0 and at most 100 (mass %), found 0"
        },
        {
            "a fraction above 100",
            """{ "code": "HCL36", "name": "hydrochloric acid", "composition": { "HCL": 136, "WATER": -36 } }""",
            "material 'HCL36': composition of 'HCL' must be more than 0 and at most 100 (mass %), found 136"
        },
        {
            "a fraction as text",
            """{ "code": "HCL36", "name": "hydrochloric acid", "composition": { "HCL": "36", "WATER": 64 } }""",
            "material 'HCL36': composition of 'HCL' must be a number, found the string \"36\""
        },
        {
            "one component only",
            """{ "code": "HCL36", "name": "hydrochloric acid", "composition": { "HCL": 100 } }""",
            "material 'HCL36': a composition needs at least two components"
        },
        {
            "both a formula and a composition",
            """{ "code": "HCL36", "name": "hydrochloric acid", "formula": "HCl", "composition": { "HCL": 36, "WATER": 64 } }""",
            "material 'HCL36': give either 'formula' (a substance) or 'composition' (a solution of other materials), not both"
        },
        {
            "a role of its own",
            """{ "code": "HCL36", "name": "hydrochloric acid", "role": "reagent", "composition": { "HCL": 36, "WATER": 64 } }""",
            "material 'HCL36': a solution has no 'role' of its own"
        },
        {
            "vented",
            """{ "code": "HCL36", "name": "hydrochloric acid", "vented": true, "composition": { "HCL": 36, "WATER": 64 } }""",
            "material 'HCL36': a solution is charged and weighed as a liquid, so it cannot be 'vented'"
        },
        {
            "an unknown component",
            """{ "code": "HCL36", "name": "hydrochloric acid", "composition": { "HCL": 36, "H2O": 64 } }""",
            "material 'HCL36': composition names 'H2O', which is not a material in any loaded file"
        },
        {
            "a solution within a solution",
            Acid + """, { "code": "HCL18", "name": "hydrochloric acid 18 %", "composition": { "HCL36": 50, "WATER": 50 } }""",
            "material 'HCL18': composition names 'HCL36', which is itself a solution; give the components of both directly"
        },
        {
            "not an object",
            """{ "code": "HCL36", "name": "hydrochloric acid", "composition": [36, 64] }""",
            "material 'HCL36': 'composition'"
        },
    };

    [Theory]
    [MemberData(nameof(Refused))]
    public void A_bad_composition_is_refused_with_file_and_material(string kind, string solution, string fragment)
    {
        _ = kind;
        using var folder = new DefinitionFolder().With("paa.json", File(solution));

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        Assert.False(result.IsSuccess);
        var error = Assert.Single(result.Errors, e => e.Message.Contains(fragment, StringComparison.Ordinal));
        Assert.Equal("processes/paa.json", error.File);
        Assert.Null(error.Recipe);
    }

    [Fact]
    public void A_solution_in_a_reaction_is_refused_naming_the_component_to_use()
    {
        using var folder = new DefinitionFolder().With("paa.json", File(reaction: "BCN + HCL36 -> PAA"));

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        var error = Assert.Single(result.Errors, e => e.Message.Contains("a solution", StringComparison.Ordinal));
        Assert.Equal(
            "processes/paa.json, recipe T-1 version 1, step S1: reaction 'BCN + HCL36 -> PAA' names 'HCL36', a solution (HCL 36 %, WATER 64 %); "
            + "write the component that reacts (e.g. HCL) in the reaction and charge HCL36 in the batch record: its components are counted from its composition",
            error.ToString());
    }

    [Fact]
    public void A_solution_as_equivalents_is_refused_naming_its_components()
    {
        using var folder = new DefinitionFolder().With(
            "paa.json", File(extra: """, "equivalents": { "HCL36": { "min": 4.0, "max": 5.5 } }"""));

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        var error = Assert.Single(result.Errors);
        Assert.Equal(
            "processes/paa.json, recipe T-1 version 1, step S1: equivalents name 'HCL36', a solution; name the component whose equivalents are meant (HCL 36 %, WATER 64 %)",
            error.ToString());
    }

    [Fact]
    public void Rounded_label_fractions_within_the_tolerance_load()
    {
        // 33.33 + 66.66 = 99.99: within 0.01 of 100.
        using var folder = new DefinitionFolder().With(
            "paa.json", File("""{ "code": "HCL33", "name": "hydrochloric acid 33 %", "composition": { "HCL": 33.33, "WATER": 66.66 } }"""));

        Assert.True(ProcessDefinitionLoader.LoadFolder(folder.Path).IsSuccess);
    }
}
