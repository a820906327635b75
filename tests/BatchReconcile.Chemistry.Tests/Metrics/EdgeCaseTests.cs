using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Chemistry.Tests.Metrics;

/// <summary>Degenerate steps: no exception, no NaN, no infinity; absent ratios are null.</summary>
public class EdgeCaseTests
{
    [Fact]
    public void Yield_above_100_percent_gives_a_negative_yield_loss_rung_that_is_not_clipped()
    {
        // Nitro case with a wet product: 400.0 kg @ 100 % against m_theo = 386.780 kg -> Y = 103.418 %.
        var input = StepInput.Create(
            Chem.NitroReduction(),
            [ChargeRow.Create("NT", 500.0, 99.0), ChargeRow.Create("H2", 25.0), ChargeRow.Create("MEOH", 1500.0, role: AuxiliaryRole.Solvent)],
            [OutputRow.Product(400.0), OutputRow.Waste(1600.0, productKg: 2.0)],
            Chem.Balance());
        var r = StepMetrics.Compute(input);
        double mTheo = 495.0 / Chem.NitroToluene * Chem.Toluidine;

        Assert.Equal(100 * 400.0 / mTheo, r.YieldPct!.Value, 10);
        Assert.True(r.YieldPct > 100);
        Assert.Equal(mTheo - 400.0, r.Ladder!.YieldLossKg, 10);          // -13.220 kg
        Assert.True(r.Ladder.YieldLossKg < 0);
        Assert.Equal(mTheo - 400.0 - 2.0, r.Ladder[LossRungKind.UnexplainedYieldLoss].Kg, 10);
        Assert.True(r.Ladder[LossRungKind.UnexplainedYieldLoss].PercentOfInput < 0);
        Assert.Equal(r.InputKg, r.Ladder.Rungs.Sum(g => g.Kg) + r.ActualProductKg, 9);
    }

    [Fact]
    public void Yield_above_100_percent_with_vented_gas_judges_surplus_with_the_smaller_estimate()
    {
        // Boc case, product 140 kg @ 100 % > m_theo 135.803 kg: ξ_act > ξ_max, so the smaller vent estimate is at ξ_max.
        var input = StepInput.Create(
            Chem.BocDeprotection(),
            [ChargeRow.Create("BOCBN", 200.0, 98.0), ChargeRow.Create("HCL", 300.0, 15.0), ChargeRow.Create("IPA", 400.0)],
            [OutputRow.Product(140.0), OutputRow.Waste(700.0)],
            Chem.Balance());
        var r = StepMetrics.Compute(input);
        double ventMax = 196.0 / Chem.BocBenzylamine * 100.117;  // 94.672 kg
        Assert.True(r.Balance.VentedKg > r.Balance.VentedAtMaxExtentKg);
        Assert.Equal(840.0 + ventMax - 900.0, r.Balance.SurplusForDecisionKg, 10); // 34.672 kg
        Assert.True(r.Balance.IsSignificantSurplus);
        Assert.False(r.Balance.IsSignificantLoss);
    }

    [Fact]
    public void No_product_isolated_leaves_product_based_ratios_null()
    {
        var input = StepInput.Create(
            Chem.NitroReduction(),
            [ChargeRow.Create("NT", 500.0), ChargeRow.Create("H2", 25.0)],
            [OutputRow.Waste(520.0)],
            Chem.Balance());
        var r = StepMetrics.Compute(input);
        Assert.Equal(0.0, r.YieldPct);
        Assert.Equal(0.0, r.ReactionMassEfficiencyPct);
        Assert.Null(r.ProcessMassIntensity);
        Assert.Null(r.CompleteEFactor);
        Assert.Null(r.SimpleEFactor);
        Assert.NotNull(r.Ladder);
        Assert.All(Figures.AllNumbers(r), n => Assert.True(double.IsFinite(n.Value), n.Path));
    }

    [Fact]
    public void An_empty_step_reports_nulls_and_zeros_without_throwing()
    {
        var r = StepMetrics.Compute(StepInput.Create(Chem.BocDeprotection(), [], [], Chem.Balance()));
        Assert.Equal(["BOCBN", "HCL"], r.MissingReactants);
        Assert.Equal(0.0, r.InputKg);
        Assert.Null(r.ReactionMassEfficiencyPct);
        Assert.Null(r.MaterialRecoveryParameter);
        Assert.Null(r.OverallReactionMassEfficiencyPct);
        Assert.Null(r.Balance.ClosurePct);
        Assert.Equal(0.0, r.Balance.GapKg);
        Assert.False(r.Balance.IsSignificantLoss);
        Assert.False(r.Balance.IsSignificantSurplus);
        Assert.All(Figures.AllNumbers(r), n => Assert.True(double.IsFinite(n.Value), n.Path));
    }

    [Fact]
    public void Recovering_more_than_was_charged_leaves_recovery_ratios_null_and_flags_a_surplus()
    {
        var input = StepInput.Create(
            Chem.Esterification(),
            [ChargeRow.Create("BZOH", 100.0), ChargeRow.Create("ETOH", 100.0)],
            [OutputRow.Product(50.0), OutputRow.Recovered(250.0)],
            Chem.Balance());
        var r = StepMetrics.Compute(input);
        Assert.Null(r.MaterialRecoveryParameter);
        Assert.Null(r.OverallReactionMassEfficiencyPct);
        // cEF keeps its positive denominator (m_act) and is reported even though negative: (200 - 250 - 50) / 50 = -2.
        Assert.Equal(-2.0, r.CompleteEFactor!.Value, 12);
        Assert.True(r.Balance.IsSignificantSurplus);
        Assert.Equal(100.0, r.Balance.SurplusForDecisionKg, 12);
    }

    [Fact]
    public void Recovered_reactant_makes_the_auxiliary_rung_negative_and_the_ladder_still_adds_up()
    {
        // Esterification: m_aux = 1030 - 717.81 = 312.19 kg, recovered ethanol 330 kg -> rung 1 = -17.81 kg.
        var input = StepInput.Create(
            Chem.Esterification(),
            [ChargeRow.Create("BZOH", 250.0, 99.5), ChargeRow.Create("ETOH", 470.0, 99.8), ChargeRow.Create("H2SO4", 10.0, 96.0), ChargeRow.Create("WATER", 300.0, role: AuxiliaryRole.Water)],
            [OutputRow.Product(290.0, 99.0), OutputRow.Recovered(330.0)],
            Chem.Balance());
        var r = StepMetrics.Compute(input);
        Assert.Equal(-17.81, r.Ladder![LossRungKind.AuxiliariesNotRecovered].Kg, 9);
        Assert.Equal(1030.0, r.Ladder.Rungs.Sum(g => g.Kg) + r.ActualProductKg, 9);
    }
}
