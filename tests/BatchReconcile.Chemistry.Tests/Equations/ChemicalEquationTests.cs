using BatchReconcile.Chemistry.Equations;
using BatchReconcile.Chemistry.Formulas;
using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Tests.Equations;

public class ChemicalEquationTests
{
    private static readonly Dictionary<string, string> Materials = new(StringComparer.Ordinal)
    {
        ["NB"] = "C6H5NO2",
        ["ANL"] = "C6H7N",
        ["WATER"] = "H2O",
        ["4AP"] = "C6H7NO",
    };

    private static Formula? Lookup(string name) => Materials.TryGetValue(name, out var text) ? Formula.Parse(text) : null;

    [Theory]
    [InlineData("2 KMnO4 + 16 HCl -> 2 KCl + 2 MnCl2 + 5 Cl2 + 8 H2O", "2 KMnO4 + 16 HCl -> 2 KCl + 2 MnCl2 + 5 Cl2 + 8 H2O")]
    [InlineData("2H2 + O2 = 2H2O", "2 H2 + O2 -> 2 H2O")]
    [InlineData("1 H2 + 0.5 O2 → 1 H2O", "H2 + 1/2 O2 -> H2O")]
    [InlineData("MnO4^- + 5 Fe^2+ + 8 H^+ <=> Mn^2+ + 5 Fe^3+ + 4 H2O", "MnO4^- + 5 Fe^2+ + 8 H^+ -> Mn^2+ + 5 Fe^3+ + 4 H2O")]
    [InlineData("CuSO4·5H2O -> CuSO4 + 5 H2O", "CuSO4·5H2O -> CuSO4 + 5 H2O")]
    public void ToString_is_the_canonical_form(string text, string canonical)
    {
        var equation = ChemicalEquation.Parse(text);

        Assert.Equal(canonical, equation.ToString());
        Assert.Equal(canonical, ChemicalEquation.Parse(canonical).ToString());
    }

    [Fact]
    public void Terms_carry_species_formula_and_written_coefficient()
    {
        var equation = ChemicalEquation.Parse("Fe2O3 + 3 CO -> 2 Fe + 3 CO2");

        Assert.Equal(["Fe2O3", "CO"], equation.Reactants.Select(t => t.Species));
        Assert.Equal(["Fe", "CO2"], equation.Products.Select(t => t.Species));
        Assert.Null(equation.Reactants[0].Coefficient);
        Assert.Equal(Rational.One, equation.Reactants[0].EffectiveCoefficient);
        Assert.Equal((Rational)3, equation.Reactants[1].Coefficient);
        Assert.Equal(2m, equation.Reactants[0].Formula.Elements["Fe"]);
        Assert.False(equation.HasAllCoefficients);
        Assert.Equal(4, equation.Terms.Count);
    }

    [Fact]
    public void Charges_come_from_the_formula()
    {
        var equation = ChemicalEquation.Parse("Cr2O7^2- + 6 I^- + 14 H^+ -> 2 Cr^3+ + 3 I2 + 7 H2O");

        Assert.Equal([-2, -1, 1], equation.Reactants.Select(t => t.Formula.Charge));
        Assert.Equal([3, 0, 0], equation.Products.Select(t => t.Formula.Charge));
    }

    [Fact]
    public void Names_resolve_through_the_lookup_and_others_parse_as_formulas()
    {
        var equation = ChemicalEquation.Parse("NB + 3 H2 -> ANL + 2 WATER", Lookup);

        Assert.Equal("NB + 3 H2 -> ANL + 2 WATER", equation.ToString());
        Assert.Equal("C6H5NO2", equation.Reactants[0].Formula.Hill);
        Assert.Equal("H2", equation.Reactants[1].Formula.Hill);
        Assert.Equal("H2O", equation.Products[1].Formula.Hill);
    }

    [Fact]
    public void A_name_starting_with_a_digit_is_not_read_as_a_coefficient()
    {
        var equation = ChemicalEquation.Parse("4AP -> 2 4AP", Lookup);

        Assert.Null(equation.Reactants[0].Coefficient);
        Assert.Equal((Rational)2, equation.Products[0].Coefficient);
        Assert.Equal("C6H7NO", equation.Products[0].Formula.Hill);
    }

    [Theory]
    [InlineData("H2 + Xq2 -> H2O", 6, "species 2 on the left: unknown element 'Xq' at 1 of 'Xq2'")]
    [InlineData("H2 + O2 -> 2 H2Xq", 16, "species 1 on the right: unknown element 'Xq' at 3 of 'H2Xq'")]
    [InlineData("Ca(OH -> CaO", 3, "species 1 on the left: '(' at 3 is never closed of 'Ca(OH'")]
    [InlineData("  H2+ + H2 ⇌ H4", 5, "species 1 on the left: ")]
    [InlineData("H2 + O2", 1, "no arrow")]
    [InlineData("H2 -> O2 -> O3", 10, "two arrows")]
    [InlineData("-> H2O", 1, "empty side: nothing on the left of the arrow")]
    public void Refuses_text_with_position_and_reason(string text, int position, string reason)
    {
        Assert.False(ChemicalEquation.TryParse(text, out var equation, out var error));

        Assert.Null(equation);
        Assert.Equal(position, error.Position);
        Assert.Contains(reason, error.Message, StringComparison.Ordinal);
        var thrown = Assert.Throws<EquationFormatException>(() => ChemicalEquation.Parse(text));
        Assert.Equal(error, thrown.Error);
    }

    [Fact]
    public void Unknown_names_say_the_lookup_did_not_know_them()
    {
        Assert.False(ChemicalEquation.TryParse("NB + 3 H2 -> ANIL + 2 WATER", Lookup, out _, out var error));

        Assert.Equal(14, error.Position);
        Assert.Equal("species 1 on the right: unknown element 'A' at 1 of 'ANIL' (and it is not a known name)", error.Message);
    }

    [Fact]
    public void WithCoefficients_replaces_every_coefficient_in_term_order()
    {
        var equation = ChemicalEquation.Parse("H2 + O2 -> H2O");

        var balanced = equation.WithCoefficients([2, 1, 2]);

        Assert.Equal("2 H2 + O2 -> 2 H2O", balanced.ToString());
        Assert.True(balanced.HasAllCoefficients);
        Assert.Throws<ArgumentException>(() => equation.WithCoefficients([1, 2]));
        Assert.Throws<ArgumentOutOfRangeException>(() => equation.WithCoefficients([1, 0, 2]));
    }

    [Fact]
    public void Create_refuses_an_empty_side_as_a_bug()
    {
        var water = EquationTerm.Create("H2O", Formula.Parse("H2O"));

        Assert.Throws<ArgumentException>(() => ChemicalEquation.Create([water], []));
        Assert.Throws<ArgumentException>(() => EquationTerm.Create("H2 O", Formula.Parse("H2O")));
        Assert.Equal("H2O -> H2O", ChemicalEquation.Create([water], [water]).ToString());
    }
}
