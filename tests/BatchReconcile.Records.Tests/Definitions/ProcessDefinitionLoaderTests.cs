using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Definitions.Loading;

namespace BatchReconcile.Records.Tests.Definitions;

public class ProcessDefinitionLoaderTests
{
    private static ProcessCatalog LoadRepositoryConfig()
    {
        var result = ProcessDefinitionLoader.LoadFolder(Path.Combine(RepositoryFolder.Root, "config", "processes"));
        Assert.True(result.IsSuccess, result.ToString());
        return result.Catalog;
    }

    [Fact]
    public void The_repository_demo_definitions_load_without_errors()
    {
        var result = ProcessDefinitionLoader.LoadFolder(Path.Combine(RepositoryFolder.Root, "config", "processes"));

        Assert.True(result.IsSuccess, result.ToString());
        Assert.Empty(result.Errors);
        // BZC-410 has two versions (the second takes effect on 2026-10-26, sample-data/README.md); the others one.
        Assert.Equal(
            ["BZC-410 v1", "BZC-410 v2", "NBB-150 v1", "PPZ-220 v1"],
            result.Catalog.Recipes.Select(r => $"{r.Code} v{r.Version.ToString(System.Globalization.CultureInfo.InvariantCulture)}").Order(StringComparer.Ordinal));
        Assert.All(result.Files, f => Assert.StartsWith("processes/", f, StringComparison.Ordinal));
    }

    // Demo chemistry. Boc removal with HCl: Boc-piperazine + 2 HCl -> piperazine·2HCl + CO2 + isobutylene
    // (common practice; the carbamate fragments into CO2 and the tert-butyl cation, which loses H+).
    [Theory]
    [InlineData("BZC-410", "S1", "NBA + ETOH -> ENB + WATER", "NBA:1 ETOH:1", "ENB:1 WATER:1")] // Fischer esterification, common practice
    [InlineData("BZC-410", "S2", "ENB + 3 H2 -> BZC + 2 WATER", "ENB:1 H2:3", "BZC:1 WATER:2")] // nitro to amine, common practice
    [InlineData("NBB-150", "S1", "BZCL + BNA + TEA -> NBB + TEAHCL", "BZCL:1 BNA:1 TEA:1", "NBB:1 TEAHCL:1")] // Schotten-Baumann-type acylation, common practice
    [InlineData("PPZ-220", "S1", "BOCPZ + 2 HCL -> PPZ2HCL + CO2 + IBE", "BOCPZ:1 HCL:2", "PPZ2HCL:1 CO2:1 IBE:1")]
    public void Demo_reactions_load_with_their_stoichiometry(string recipe, string step, string balanced, string reactants, string products)
    {
        var reaction = LoadRepositoryConfig().NewestRecipe(recipe)!.FindStep(step)!.Reaction;

        Assert.Equal(balanced, reaction.Balanced);
        Assert.Equal(reactants, Render(reaction.Reactants));
        Assert.Equal(products, Render(reaction.Products));
    }

    [Fact]
    public void Boc_removal_vents_carbon_dioxide_and_isobutylene()
    {
        var catalog = LoadRepositoryConfig();
        var step = catalog.NewestRecipe("PPZ-220")!.FindStep("S1")!;

        var vented = step.Reaction.Products.Select(p => catalog.FindMaterial(p.MaterialCode)!).Where(m => m.Vented).Select(m => m.Code);

        Assert.Equal(["CO2", "IBE"], vented.Order(StringComparer.Ordinal));
        Assert.Equal("PPZ2HCL", step.ProductCode);
        Assert.Equal(new ValueRange(2.0, 3.0), step.Equivalents["HCL"]);
    }

    [Fact]
    public void The_demo_acylation_written_without_coefficients_is_noted_as_balanced()
    {
        var result = ProcessDefinitionLoader.LoadFolder(Path.Combine(RepositoryFolder.Root, "config", "processes"));

        var note = Assert.Single(result.Notes, n => n.Recipe == "NBB-150");
        Assert.Equal("processes/benzamide.json", note.File);
        Assert.Contains("balanced to 'BZCL + BNA + TEA -> NBB + TEAHCL'", note.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_valid_file_builds_materials_recipe_steps_and_ranges()
    {
        using var folder = new DefinitionFolder().With("bzc.json", TestDefinitions.Benzocaine);

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        Assert.True(result.IsSuccess, result.ToString());
        var recipe = result.Catalog.FindRecipe("bzc-900", 1)!;
        Assert.Equal("processes/bzc.json", recipe.SourceFile);
        Assert.Equal(["S1", "S2"], recipe.Steps.Select(s => s.Code));
        var s2 = recipe.Steps[1];
        Assert.Equal("BZC", s2.ProductCode);
        Assert.Equal(new ValueRange(88, 98), s2.YieldPct);
        Assert.Equal(1.5, s2.BalanceTolerancePct);
        Assert.Equal(new ValueRange(3.0, 3.6), s2.Equivalents["h2"]);
        Assert.Empty(s2.Severities);
        Assert.Null(s2.ProductInWasteMaxPct);
        var etoh = result.Catalog.FindMaterial("ETOH")!;
        Assert.Equal(MaterialRole.Solvent, etoh.Role);
        Assert.Equal("C2H6O", etoh.Formula!.Hill);
        Assert.Equal(MaterialRole.Reactant, result.Catalog.FindMaterial("NBA")!.Role);
    }

    [Fact]
    public void Optional_severities_and_product_in_waste_limit_are_read()
    {
        var json = TestDefinitions.Benzocaine.Change(
            "\"balanceTolerancePct\": 1.5,",
            "\"balanceTolerancePct\": 1.5, \"severities\": { \"yield-low\": \"minor\", \"Product-In-Waste\": \"CRITICAL\" }, \"productInWasteMaxPct\": 2.5,");
        using var folder = new DefinitionFolder().With("bzc.json", json);

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        Assert.True(result.IsSuccess, result.ToString());
        var step = result.Catalog.NewestRecipe("BZC-900")!.FindStep("S2")!;
        Assert.Equal(FlagSeverity.Minor, step.Severities[FlagCode.YieldLow]);
        Assert.Equal(FlagSeverity.Critical, step.Severities[FlagCode.ProductInWaste]);
        Assert.Equal(2, step.Severities.Count);
        Assert.Equal(2.5, step.ProductInWasteMaxPct);
    }

    [Fact]
    public void Materials_and_recipes_may_live_in_different_files()
    {
        var materials = TestDefinitions.Benzocaine[..TestDefinitions.Benzocaine.IndexOf("\"recipes\"", StringComparison.Ordinal)].TrimEnd().TrimEnd(',') + "}";
        var recipes = "{" + TestDefinitions.Benzocaine[TestDefinitions.Benzocaine.IndexOf("\"recipes\"", StringComparison.Ordinal)..];
        using var folder = new DefinitionFolder().With("materials.json", materials).With("recipes.json", recipes);

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        Assert.True(result.IsSuccess, result.ToString());
        Assert.Equal("processes/materials.json", result.Catalog.FindMaterial("BZC")!.SourceFile);
        Assert.Equal("processes/recipes.json", result.Catalog.NewestRecipe("BZC-900")!.SourceFile);
    }

    [Fact]
    public void Comments_trailing_commas_extra_keys_and_a_byte_order_mark_are_accepted()
    {
        var json = TestDefinitions.Benzocaine
            .Change("\"materials\": [", "// plant: test\n  \"generatedBy\": \"another tool\",\n  \"materials\": [")
            .Change("\"formula\": \"C9H11NO2\" }", "\"formula\": \"C9H11NO2\", \"cas\": \"94-09-7\", }");
        using var folder = new DefinitionFolder().WithBytes("bzc.json", [0xEF, 0xBB, 0xBF, .. System.Text.Encoding.UTF8.GetBytes(json)]);

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        Assert.True(result.IsSuccess, result.ToString());
    }

    [Fact]
    public void Reloading_a_folder_sees_a_changed_file()
    {
        using var folder = new DefinitionFolder().With("bzc.json", TestDefinitions.Benzocaine);
        Assert.True(ProcessDefinitionLoader.LoadFolder(folder.Path).IsSuccess);

        folder.With("bzc.json", TestDefinitions.Benzocaine.Change("\"version\": 1", "\"version\": 2"));
        var reloaded = ProcessDefinitionLoader.LoadFolder(folder.Path);

        Assert.True(reloaded.IsSuccess, reloaded.ToString());
        Assert.Equal(2, reloaded.Catalog.NewestRecipe("BZC-900")!.Version);
        Assert.Null(reloaded.Catalog.FindRecipe("BZC-900", 1));
    }

    [Fact]
    public void Load_files_names_them_as_given()
    {
        using var folder = new DefinitionFolder().With("bzc.json", TestDefinitions.Benzocaine.Change("\"version\": 1", "\"version\": 0"));
        var path = Path.Combine(folder.Path, "bzc.json");

        var result = ProcessDefinitionLoader.LoadFiles([path]);

        var error = Assert.Single(result.Errors);
        Assert.Equal(path, error.File);
        Assert.Equal("BZC-900", error.Recipe);
        Assert.Contains("'version' must be 1 or more, found 0", error.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("benzocaine.json", true)]
    [InlineData("BENZOCAINE.JSON", true)]
    [InlineData(".benzocaine.json", false)] // editors' hidden lock and swap files
    [InlineData("benzocaine.json.tmp", false)]
    [InlineData("benzocaine.json~", false)]
    [InlineData("benzocaine.jsonc", false)]
    [InlineData(".json", false)]
    public void Only_visible_json_files_are_definition_files(string name, bool expected) =>
        Assert.Equal(expected, ProcessDefinitionLoader.IsDefinitionFile(Path.Combine("processes", name)));

    [Fact]
    public void Other_files_in_the_folder_are_not_read()
    {
        using var folder = new DefinitionFolder()
            .With("bzc.json", TestDefinitions.Benzocaine)
            .With("notes.txt", "not JSON at all {")
            .With(".bzc.json.swp", "{");

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        Assert.True(result.IsSuccess, result.ToString());
        Assert.Equal(["processes/bzc.json"], result.Files);
    }

    [Fact]
    public void An_empty_folder_gives_an_empty_catalogue_and_a_note()
    {
        using var folder = new DefinitionFolder();

        var result = ProcessDefinitionLoader.LoadFolder(folder.Path);

        Assert.True(result.IsSuccess);
        Assert.Empty(result.Catalog.Recipes);
        Assert.Contains("no process-definition files", Assert.Single(result.Notes).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_missing_folder_is_an_error_not_an_exception()
    {
        using var folder = new DefinitionFolder();

        var result = ProcessDefinitionLoader.LoadFolder(Path.Combine(folder.Path, "nowhere"));

        Assert.False(result.IsSuccess);
        Assert.Contains("does not exist", Assert.Single(result.Errors).Message, StringComparison.Ordinal);
    }

    private static string Render(IEnumerable<ReactionSpecies> species) =>
        string.Join(" ", species.Select(s => $"{s.MaterialCode}:{s.Coefficient.ToString(System.Globalization.CultureInfo.InvariantCulture)}"));
}
