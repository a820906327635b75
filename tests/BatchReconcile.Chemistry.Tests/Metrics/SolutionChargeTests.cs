using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Chemistry.Tests.Metrics;

/// <summary>
/// A charge of a solution (<see cref="ChargeRow.Solution"/>): each component counts for the stoichiometry, the whole
/// row for the balance, one weighing for the uncertainty. Hand example: benzylamine + HCl -> benzylamine hydrochloride
/// from 36 % hydrochloric acid (commercial strength, common practice). Molar masses: <see cref="Chem"/> (CIAAW 2021 abridged).
/// </summary>
public class SolutionChargeTests
{
    private const double Benzylamine = 107.156; // C7H9N: 84.077 + 9.072 + 14.007

    private static StepReaction SaltFormation() => StepReaction.Create(
        [Chem.T("BNA", 1, Benzylamine), Chem.T("HCL", 1, Chem.HydrogenChloride)], Chem.T("BNAHCL", 1, Chem.BenzylamineHcl));

    private static ChargeRow Acid(double kg) => ChargeRow.Solution(
        "HCL36", kg, [new ChargeContent("HCL", kg * 0.36, AuxiliaryRole.Other), new ChargeContent("WATER", kg * 0.64, AuxiliaryRole.Water)]);

    [Fact]
    public void Moles_of_HCl_come_from_the_solution_and_its_water_is_water_in_the_simple_E_factor()
    {
        // BNA 95.0 kg -> 95.0 / 107.156 = 0.886558 kmol; HCL36 100.0 kg: HCl 36.0 kg -> 36.0 / 36.458 = 0.987438 kmol. L = BNA.
        // m_theo = 0.886558 × 143.614 = 127.322 kg; Y = 120.0 / 127.322 = 94.249 %.
        // m_in = 195.0 kg (the whole acid); cEF = (195 - 120) / 120 = 0.625; the acid's 64.0 kg of water is not a
        // reactant, so sEF = (195 - 64 - 120) / 120 = 0.091667 (Roschangar, Sheldon, Senanayake, Green Chem. 2015).
        var r = StepMetrics.Compute(StepInput.Create(
            SaltFormation(),
            [ChargeRow.Create("BNA", 95.0), Acid(100.0)],
            [OutputRow.Product(120.0), OutputRow.Waste(74.0)],
            Chem.Balance(2.0)));

        Assert.Equal("BNA", r.LimitingReactant);
        Chem.AssertClose(36.0, r.Reactants.Single(a => a.Material == "HCL").ChargedKg, 1e-12, "HCl content");
        Chem.AssertClose(36.0 / Chem.HydrogenChloride / (95.0 / Benzylamine), r.Reactants.Single(a => a.Material == "HCL").Equivalents, 1e-12, "HCl equiv"); // 1.1138
        Chem.AssertClose(100 * 120.0 / (95.0 / Benzylamine * Chem.BenzylamineHcl), r.YieldPct, 1e-12, "yield");
        Chem.AssertClose(195.0, r.InputKg, 1e-12, "m_in");
        Chem.AssertClose(95.0 + 36.0, r.ReactantChargedKg, 1e-12, "m_react");
        Chem.AssertClose(64.0, r.SolventAndWaterChargedKg, 1e-12, "water of the acid");
        Chem.AssertClose(0.625, r.CompleteEFactor, 1e-12, "cEF");
        Chem.AssertClose((195.0 - 64.0 - 120.0) / 120.0, r.SimpleEFactor, 1e-12, "sEF");
        Chem.AssertClose(1.0, r.Balance.GapKg, 1e-9, "gap");
    }

    [Fact]
    public void A_solution_row_is_one_weighing()
    {
        var solution = StepMetrics.Compute(StepInput.Create(SaltFormation(), [ChargeRow.Create("BNA", 95.0), Acid(100.0)], [], Chem.Balance()));
        var plain = StepMetrics.Compute(StepInput.Create(SaltFormation(), [ChargeRow.Create("BNA", 95.0), ChargeRow.Create("HCL", 100.0, 36)], [], Chem.Balance()));
        Assert.Equal(plain.Balance.CombinedStandardUncertaintyKg, solution.Balance.CombinedStandardUncertaintyKg);
    }

    [Fact]
    public void Components_heavier_than_the_row_are_refused()
    {
        var e = Assert.Throws<ArgumentException>(() => ChargeRow.Solution(
            "HCL36", 100.0, [new ChargeContent("HCL", 36.0, AuxiliaryRole.Other), new ChargeContent("WATER", 65.0, AuxiliaryRole.Water)]));
        Assert.Contains("exceed", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_solution_code_in_the_equation_is_refused()
    {
        var reaction = StepReaction.Create([Chem.T("BNA", 1, Benzylamine), Chem.T("HCL36", 1, Chem.HydrogenChloride)], Chem.T("BNAHCL", 1, Chem.BenzylamineHcl));
        Assert.Throws<ArgumentException>(() => StepInput.Create(reaction, [Acid(10.0)], [], Chem.Balance()));
    }
}
