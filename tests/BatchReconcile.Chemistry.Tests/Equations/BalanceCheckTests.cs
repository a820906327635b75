using BatchReconcile.Chemistry.Equations;
using BatchReconcile.Chemistry.Numerics;

namespace BatchReconcile.Chemistry.Tests.Equations;

public class BalanceCheckTests
{
    [Theory]
    [InlineData("2 H2 + O2 -> 2 H2O")]
    [InlineData("H2 + 1/2 O2 -> H2O")]
    [InlineData("H2 + 0.5 O2 -> H2O")]
    [InlineData("MnO4^- + 5 Fe^2+ + 8 H^+ -> Mn^2+ + 5 Fe^3+ + 4 H2O")]
    [InlineData("20 Fe0.95O + 20 CO -> 19 Fe + 20 CO2")]
    [InlineData("D2 + 1/2 O2 -> D2O")]
    public void Balanced_equations_have_no_imbalance(string text)
    {
        var report = BalanceCheck.Check(ChemicalEquation.Parse(text));

        Assert.True(report.IsBalanced);
        Assert.Empty(report.Imbalances);
        Assert.Equal("balanced", report.ToString());
    }

    // Elements are listed in the order they first appear, each formula read in Hill order; charge comes last.
    [Theory]
    [InlineData("H2 + O2 -> H2O", "O is off by 1 (reactants have 1 more)")]
    [InlineData("2 H2 + O2 -> 2 H2O + O2", "O is off by 2 (products have 2 more)")]
    [InlineData("H2 + O2 -> 2 H2O", "H is off by 2 (products have 2 more)")]
    [InlineData("KMnO4 + HCl -> KCl + MnCl2 + Cl2 + H2O", "O is off by 3 (reactants have 3 more); Cl is off by 4 (products have 4 more); H is off by 1 (products have 1 more)")]
    [InlineData("Fe^2+ -> Fe^3+", "charge is off by 1 (products are 1 more positive)")]
    [InlineData("MnO4^- + Fe^2+ + 8 H^+ -> Mn^2+ + Fe^3+ + 4 H2O", "charge is off by 4 (reactants are 4 more positive)")]
    [InlineData("H2 + 1/3 O2 -> H2O", "O is off by 1/3 (products have 1/3 more)")]
    [InlineData("D2 + 1/2 O2 -> H2O", "D is off by 2 (reactants have 2 more); H is off by 2 (products have 2 more)")]
    public void Reports_every_imbalance_with_amount_and_heavier_side(string text, string expected)
    {
        var report = BalanceCheck.Check(ChemicalEquation.Parse(text));

        Assert.False(report.IsBalanced);
        Assert.Equal(expected, report.ToString());
    }

    [Fact]
    public void Imbalance_amounts_are_exact_rationals()
    {
        var report = BalanceCheck.Check(ChemicalEquation.Parse("C + 0.3 O2 -> CO"));

        var imbalance = Assert.Single(report.Imbalances);
        Assert.Equal("O", imbalance.Quantity);
        Assert.Equal(Rational.Create(2, 5), imbalance.Amount);
        Assert.Equal(EquationSide.Products, imbalance.HeavierSide);
    }
}
