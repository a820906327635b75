using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Chemistry.Tests.Metrics;

public class LimitingReactantTests
{
    // A (ν 1, M 100) and B (ν 2, M 50) -> P (ν 1, M 150): 100 kg A = 1 kmol (n/ν 1); B kg/50/2 decides.
    [Theory]
    [InlineData(100.0, "A")]  // B: 100 / 50 / 2 = 1 kmol: exact tie, first in equation order wins
    [InlineData(99.0, "B")]   // B: 0.99 kmol < 1
    [InlineData(101.0, "A")]  // B: 1.01 kmol > 1
    public void Smallest_n_over_nu_limits_and_ties_go_to_the_first_written(double bKg, string expected)
    {
        var r = StepMetrics.Compute(TwoReactants(["A", "B"], 100.0, bKg));
        Assert.Equal(expected, r.LimitingReactant);
    }

    [Fact]
    public void A_tie_follows_equation_order_not_charge_order()
    {
        var r = StepMetrics.Compute(TwoReactants(["B", "A"], 100.0, 100.0));
        Assert.Equal("B", r.LimitingReactant);
        Assert.Equal(1.0, r.MaxExtentKmol!.Value, 12);
    }

    [Fact]
    public void A_tie_within_rounding_noise_still_goes_to_the_first_written()
    {
        // 1e-12 relative above an exact tie: rounding noise, not a real excess (window 1e-9).
        var r = StepMetrics.Compute(TwoReactants(["A", "B"], 100.0 * (1 + 1e-12), 100.0));
        Assert.Equal("A", r.LimitingReactant);
    }

    [Fact]
    public void Equivalents_are_mole_ratios_not_divided_by_nu()
    {
        // n_A = 1 kmol (L), n_B = 110 / 50 = 2.2 kmol -> 2.2 equiv even though ν_B = 2 (spec: "3.3 equiv" usage).
        var r = StepMetrics.Compute(TwoReactants(["A", "B"], 100.0, 110.0));
        Assert.Equal(2.2, r.Reactants.Single(a => a.Material == "B").Equivalents!.Value, 12);
        Assert.Equal(1.1, r.Reactants.Single(a => a.Material == "B").AmountPerCoefficientKmol!.Value, 12);
    }

    [Theory]
    [InlineData(false)] // no row at all
    [InlineData(true)]  // a row of 0 kg
    public void A_reactant_not_charged_leaves_the_stoichiometry_undefined(bool zeroRow)
    {
        var charges = new List<ChargeRow> { ChargeRow.Create("BOCBN", 200.0, 98.0), ChargeRow.Create("IPA", 400.0, role: AuxiliaryRole.Solvent) };
        if (zeroRow)
        {
            charges.Add(ChargeRow.Create("HCL", 0.0));
        }

        var input = StepInput.Create(Chem.BocDeprotection(), charges, [OutputRow.Product(100.0), OutputRow.Waste(450.0)], Chem.Balance());
        var r = StepMetrics.Compute(input);

        Assert.Equal(["HCL"], r.MissingReactants);
        Assert.Null(r.LimitingReactant);
        Assert.Null(r.MaxExtentKmol);
        Assert.Null(r.TheoreticalProductKg);
        Assert.Null(r.YieldPct);
        Assert.Null(r.StoichiometricFactor);
        Assert.Null(r.Ladder);
        Assert.All(r.Reactants, a => Assert.Null(a.Equivalents));
        Assert.Null(r.Balance.VentedAtMaxExtentKg);
        Assert.All(r.Balance.Vented, v => Assert.Null(v.AtMaxExtentKg));
        // The charged total is incomplete, so the figures that set the product against it are not computable
        // (issue 9); the vented estimate from ξ_act = 100 / 143.614 still is, and MRP needs no product.
        Assert.Null(r.ReactionMassEfficiencyPct);
        Assert.Null(r.OverallReactionMassEfficiencyPct);
        Assert.Null(r.ProcessMassIntensity);
        Assert.Null(r.CompleteEFactor);
        Assert.Null(r.SimpleEFactor);
        Assert.NotNull(r.MaterialRecoveryParameter);
        Assert.Equal(100.0 / Chem.BenzylamineHcl * (Chem.CarbonDioxide + Chem.Isobutylene), r.Balance.VentedKg, 10);
        Assert.All(Figures.AllNumbers(r), n => Assert.True(double.IsFinite(n.Value), n.Path));
    }

    private static StepInput TwoReactants(string[] order, double aKg, double bKg)
    {
        var terms = new Dictionary<string, ReactionTerm> { ["A"] = Chem.T("A", 1, 100.0), ["B"] = Chem.T("B", 2, 50.0) };
        return StepInput.Create(
            StepReaction.Create(order.Select(c => terms[c]), Chem.T("P", 1, 150.0)),
            [ChargeRow.Create("B", bKg), ChargeRow.Create("A", aKg)],
            [OutputRow.Product(120.0)],
            Chem.Balance());
    }
}
