using System.Globalization;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Definitions.Loading;

namespace BatchReconcile.Records.Tests.Definitions;

/// <summary>Reactions written without coefficients are balanced; written ones must balance, charge included.</summary>
public class ReactionBalancingTests
{
    // Permanganate titration of iron(II) in acid: MnO4^- + 5 Fe^2+ + 8 H^+ -> Mn^2+ + 5 Fe^3+ + 4 H2O
    // (from memory; a standard redox titration of analytical chemistry).
    private const string IonMaterials = """
        { "code": "MNO4", "name": "permanganate", "formula": "MnO4^-", "role": "reagent" },
        { "code": "FE2", "name": "iron(II)", "formula": "Fe^2+" },
        { "code": "HPLUS", "name": "hydrogen ion", "formula": "H^+" },
        { "code": "MN2", "name": "manganese(II)", "formula": "Mn^2+" },
        { "code": "FE3", "name": "iron(III)", "formula": "Fe^3+" },
        { "code": "WATER", "name": "water", "formula": "H2O", "role": "water" }
        """;

    private static ProcessDefinitionLoadResult LoadOneStep(string materials, string reaction, string product)
    {
        using var folder = new DefinitionFolder().With("step.json", TestDefinitions.OneStep(materials, reaction, product));
        return ProcessDefinitionLoader.LoadFolder(folder.Path);
    }

    public static TheoryData<string, string, string, string, string> WrittenWithoutCoefficients => new()
    {
        {
            // Nitro group to amine with hydrogen: ArNO2 + 3 H2 -> ArNH2 + 2 H2O (common practice).
            """
            { "code": "ENB", "name": "ethyl 4-nitrobenzoate", "formula": "C9H9NO4" },
            { "code": "H2", "name": "hydrogen", "formula": "H2" },
            { "code": "BZC", "name": "benzocaine", "formula": "C9H11NO2" },
            { "code": "WATER", "name": "water", "formula": "H2O", "role": "water" }
            """,
            "ENB + H2 -> BZC + WATER", "BZC",
            "ENB + 3 H2 -> BZC + 2 WATER", "ENB:1 H2:3 BZC:1 WATER:2"
        },
        {
            IonMaterials,
            "MNO4 + FE2 + HPLUS -> MN2 + FE3 + WATER", "FE3",
            "MNO4 + 5 FE2 + 8 HPLUS -> MN2 + 5 FE3 + 4 WATER", "MNO4:1 FE2:5 HPLUS:8 MN2:1 FE3:5 WATER:4"
        },
        {
            // Amide from an acid chloride with triethylamine as the HCl scavenger (common practice).
            """
            { "code": "BZCL", "name": "benzoyl chloride", "formula": "C7H5ClO" },
            { "code": "BNA", "name": "benzylamine", "formula": "C7H9N" },
            { "code": "TEA", "name": "triethylamine", "formula": "C6H15N", "role": "reagent" },
            { "code": "NBB", "name": "N-benzylbenzamide", "formula": "C14H13NO" },
            { "code": "TEAHCL", "name": "triethylamine hydrochloride", "formula": "C6H15N·HCl" }
            """,
            "BZCL + BNA + TEA -> NBB + TEAHCL", "NBB",
            "BZCL + BNA + TEA -> NBB + TEAHCL", "BZCL:1 BNA:1 TEA:1 NBB:1 TEAHCL:1"
        },
    };

    [Theory]
    [MemberData(nameof(WrittenWithoutCoefficients))]
    public void A_reaction_without_coefficients_is_balanced_and_noted(string materials, string reaction, string product, string balanced, string coefficients)
    {
        var result = LoadOneStep(materials, reaction, product);

        Assert.True(result.IsSuccess, result.ToString());
        var built = result.Catalog.NewestRecipe("T-1")!.FindStep("S1")!.Reaction;
        Assert.Equal(reaction, built.Text);
        Assert.Equal(balanced, built.Balanced);
        Assert.Equal(coefficients, Render(built));
        var note = Assert.Single(result.Notes);
        Assert.Equal(("processes/step.json", "T-1", "S1"), (note.File, note.Recipe, note.Step));
        Assert.Equal($"reaction '{reaction}' was written without coefficients and was balanced to '{balanced}'", note.Message);
    }

    public static TheoryData<string, string, string, string> WrittenAndBalanced => new()
    {
        { IonMaterials, "MNO4 + 5 FE2 + 8 HPLUS -> MN2 + 5 FE3 + 4 WATER", "FE3", "MNO4:1 FE2:5 HPLUS:8 MN2:1 FE3:5 WATER:4" },
        // Codes are matched without regard to case and rewritten as the catalogue spells them.
        { IonMaterials, "mno4 + 5 fe2 + 8 hplus -> mn2 + 5 fe3 + 4 water", "FE3", "MNO4:1 FE2:5 HPLUS:8 MN2:1 FE3:5 WATER:4" },
        // Glued and fractional coefficients: the same titration per mole of iron.
        { IonMaterials, "1/5 MNO4 + FE2 + 8/5 HPLUS -> 1/5 MN2 + FE3 + 0.8 WATER", "FE3", "MNO4:0.2 FE2:1 HPLUS:1.6 MN2:0.2 FE3:1 WATER:0.8" },
        { IonMaterials, "MNO4 + 5FE2 + 8HPLUS -> MN2 + 5FE3 + 4WATER", "FE3", "MNO4:1 FE2:5 HPLUS:8 MN2:1 FE3:5 WATER:4" },
    };

    [Theory]
    [MemberData(nameof(WrittenAndBalanced))]
    public void A_reaction_with_balancing_coefficients_is_taken_as_written(string materials, string reaction, string product, string coefficients)
    {
        var result = LoadOneStep(materials, reaction, product);

        Assert.True(result.IsSuccess, result.ToString());
        Assert.Empty(result.Notes);
        Assert.Equal(coefficients, Render(result.Catalog.NewestRecipe("T-1")!.FindStep("S1")!.Reaction));
    }

    [Fact]
    public void A_partly_written_reaction_that_balances_is_accepted_without_a_note()
    {
        // 4-nitrobenzoic acid + ethanol -> ester + water: every coefficient is 1, one of them written.
        var result = LoadOneStep(
            """
            { "code": "NBA", "name": "4-nitrobenzoic acid", "formula": "C7H5NO4" },
            { "code": "ETOH", "name": "ethanol", "formula": "C2H6O", "role": "solvent" },
            { "code": "ENB", "name": "ethyl 4-nitrobenzoate", "formula": "C9H9NO4" },
            { "code": "WATER", "name": "water", "formula": "H2O", "role": "water" }
            """,
            "NBA + 1 ETOH -> ENB + WATER",
            "ENB");

        Assert.True(result.IsSuccess, result.ToString());
        Assert.Empty(result.Notes);
        Assert.Equal("NBA + ETOH -> ENB + WATER", result.Catalog.NewestRecipe("T-1")!.Steps[0].Reaction.Balanced);
    }

    [Fact]
    public void An_ionic_reaction_whose_atoms_balance_but_charge_does_not_is_refused()
    {
        // One Fe per MnO4^- balances the atoms but not the electrons: charge +9 against +5.
        var result = LoadOneStep(IonMaterials, "MNO4 + FE2 + 8 HPLUS -> MN2 + FE3 + 4 WATER", "FE3");

        Assert.Equal(
            "reaction 'MNO4 + FE2 + 8 HPLUS -> MN2 + FE3 + 4 WATER' does not balance: charge differs by 4 (reactants +9, products +5)",
            Assert.Single(result.Errors).Message);
    }

    [Fact]
    public void A_reaction_without_coefficients_that_cannot_balance_is_refused_with_the_reason()
    {
        // Hydrogenation product written without the water that carries the oxygen away.
        var result = LoadOneStep(
            """
            { "code": "ENB", "name": "ethyl 4-nitrobenzoate", "formula": "C9H9NO4" },
            { "code": "H2", "name": "hydrogen", "formula": "H2" },
            { "code": "BZC", "name": "benzocaine", "formula": "C9H11NO2" }
            """,
            "ENB + H2 -> BZC",
            "BZC");

        var error = Assert.Single(result.Errors);
        Assert.StartsWith("reaction 'ENB + H2 -> BZC' is written without coefficients and cannot be balanced: ", error.Message, StringComparison.Ordinal);
    }

    private static string Render(RecipeReaction reaction) =>
        string.Join(" ", reaction.Reactants.Concat(reaction.Products).Select(s => $"{s.MaterialCode}:{s.Coefficient.ToString(CultureInfo.InvariantCulture)}"));
}
