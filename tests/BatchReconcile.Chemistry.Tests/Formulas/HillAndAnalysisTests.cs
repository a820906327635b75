using BatchReconcile.Chemistry.Formulas;

namespace BatchReconcile.Chemistry.Tests.Formulas;

public class HillAndAnalysisTests
{
    [Theory]
    // Hill system (E. A. Hill, J. Am. Chem. Soc. 22 (1900) 478): C, H, then alphabetical; no C: all alphabetical.
    [InlineData("CH3COOH", "C2H4O2", true)]
    [InlineData("H2SO4", "H2O4S", true)]
    [InlineData("NaCl", "ClNa", true)]
    [InlineData("CHCl3", "CHCl3", true)]
    [InlineData("CuSO4·5H2O", "CuH10O9S", true)]
    [InlineData("K4[Fe(CN)6]", "C6FeK4N6", true)]
    [InlineData("[Cu(NH3)4]SO4·H2O", "CuH14N4O5S", true)]
    [InlineData("Fe0.95O", "Fe0.95O", true)]
    [InlineData("(Fe0.5)2O", "FeO", true)]
    // "O4.5S" re-reads as O4·5S under the '.' rule (see FormulaReader.IsDecimalPoint), so no round trip here.
    [InlineData("CaSO4*0.5H2O", "CaHO4.5S", false)]
    [InlineData("SO4^2-", "O4S^2-", true)]
    [InlineData("Fe^+3", "Fe^3+", true)]
    [InlineData("NH4^+", "H4N^+", true)]
    [InlineData("MnO4^-", "MnO4^-", true)]
    [InlineData("CD3OD", "CD4O", true)]
    [InlineData("C8H10N4O2", "C8H10N4O2", true)]
    [InlineData("OC(NH2)2", "CH4N2O", true)]
    public void Hill_formula(string text, string hill, bool roundTrips)
    {
        var formula = Formula.Parse(text);
        Assert.Equal(hill, formula.Hill);
        // The Hill string is itself a formula of the same composition, except where the '.' rule reads a decimal as an adduct.
        Assert.Equal(roundTrips, formula.Equals(Formula.Parse(formula.Hill)));
        Assert.Equal(formula.Elements.Keys, formula.MassFractionsPct.Keys);
    }

    [Theory]
    // Caffeine C8H10N4O2: C 49.48, H 5.19, N 28.85, O 16.48 % (Merck Index, from memory; checked by hand
    // with CIAAW 2021 abridged weights: 96.088/194.194, 10.08/194.194, 56.028/194.194, 31.998/194.194).
    [InlineData("C8H10N4O2", "C=49.48;H=5.19;N=28.85;O=16.48")]
    // Glucose C6H12O6: worked by hand from CIAAW 2021 abridged weights: 72.066, 12.096, 95.994 of 180.156.
    [InlineData("C6H12O6", "C=40.00;H=6.71;O=53.28")]
    // Sodium chloride: worked by hand: 35.45 and 22.990 of 58.44.
    [InlineData("NaCl", "Cl=60.66;Na=39.34")]
    // Copper(II) sulfate pentahydrate: worked by hand: Cu 63.546, H 10.08, O 143.991, S 32.06 of 249.677.
    [InlineData("CuSO4·5H2O", "Cu=25.45;H=4.04;O=57.67;S=12.84")]
    public void Elemental_analysis(string text, string expected)
    {
        var fractions = Formula.Parse(text).MassFractionsPct;
        var pairs = expected.Split(';').Select(p => p.Split('=')).ToList();
        Assert.Equal(pairs.Select(p => p[0]), fractions.Keys);
        foreach (var p in pairs)
            Assert.Equal(double.Parse(p[1], System.Globalization.CultureInfo.InvariantCulture), fractions[p[0]], 0.006);
        Assert.Equal(100.0, fractions.Values.Sum(), 1e-9);
    }

    [Fact]
    public void Equal_composition_means_equal_formula()
    {
        var ethanol = Formula.Parse("C2H5OH");
        var ether = Formula.Parse("CH3OCH3");
        Assert.Equal(ethanol, ether);
        Assert.Equal(ethanol.GetHashCode(), ether.GetHashCode());
        Assert.NotEqual(ethanol, Formula.Parse("C2H6O^+"));
        Assert.NotEqual(ethanol, Formula.Parse("C2H6O2"));
        Assert.Equal("C2H5OH", ethanol.Text);
        Assert.Equal("C2H5OH", ethanol.ToString());
    }

    [Fact]
    public void Decimal_count_of_one_or_more_before_more_atoms_reads_as_adduct()
    {
        // Documented consequence of the '.' rule: "Fe1.5O" is Fe·5O, as "CuSO4.5H2O" is CuSO4·5H2O.
        var formula = Formula.Parse("Fe1.5O");
        Assert.Equal(1m, formula.Elements["Fe"]);
        Assert.Equal(5m, formula.Elements["O"]);
        // Written last, the same count is a decimal.
        Assert.Equal(1.5m, Formula.Parse("OFe1.5").Elements["Fe"]);
    }
}
