using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Chemistry.Tests.Metrics;

/// <summary>
/// Hand-worked step: 4-nitrotoluene + 3 H2 -> p-toluidine + 2 H2O over Pd/C in methanol.
/// Formulas: project reconciliation spec; AE (Trost, Science 1991); RME (Curzons et al., Green Chem. 2001);
/// MRP and RME_g (Andraos, OPRD 2005); cEF/sEF (Roschangar et al., Green Chem. 2015, sEF as defined in StepMetrics).
/// </summary>
public class NitroReductionTests
{
    // Charges: NT 500.0 kg @ 99.0 % -> 495.0 kg; H2 25.0 kg; methanol 1500 kg (solvent); Pd/C 5.0 kg; water 200 kg.
    // m_in = 500 + 25 + 1500 + 5 + 200 = 2230 kg; m_react = 495 + 25 = 520 kg; m_aux = 1710 kg.
    // n_NT = 495 / 137.138 = 3.60950 kmol (n/ν = 3.60950); n_H2 = 25 / 2.016 = 12.40079 kmol (n/ν = 4.13360) -> L = NT.
    // ξ_max = 3.60950 kmol; m_theo = 3.60950 * 107.156 = 386.780 kg; m_stoich = 3.60950 * 143.186 = 516.830 kg.
    // Outputs: product 360.0 kg @ 98.5 % -> m_act = 354.6 kg; recovered methanol 1350 kg; aqueous layer 500 kg with
    // 6.0 kg product; filter cake 8.0 kg; QC sample 0.5 kg holding 0.49 kg product. m_out = 2218.5 kg.
    private const double Xi = 495.0 / Chem.NitroToluene;
    private const double MAct = 360.0 * 0.985;
    private const double MTheo = Xi * Chem.Toluidine;
    private const double MStoich = Xi * (Chem.NitroToluene + (3 * Chem.Hydrogen));

    public static TheoryData<string, double> HandFigures => new()
    {
        { "MaxExtentKmol", Xi },                                   // 3.60950
        { "Reactant:H2.AmountKmol", 25.0 / Chem.Hydrogen },        // 12.40079
        { "Reactant:H2.Equivalents", 25.0 / Chem.Hydrogen / Xi },  // 3.4356 equiv (n_H2 / n_NT, not divided by ν)
        { "Reactant:NT.ChargedKg", 495.0 },                        // assay-corrected 500 * 99.0 / 100
        { "TheoreticalProductKg", MTheo },                         // 386.780
        { "ActualProductKg", MAct },                               // 354.6
        { "YieldPct", 100 * MAct / MTheo },                        // 91.680
        { "AtomEconomyPct", 100 * Chem.Toluidine / 143.186 },      // 107.156 / (137.138 + 3*2.016) = 74.837 %
        { "StoichiometricReactantKg", MStoich },                   // 516.830
        { "ReactantChargedKg", 520.0 },
        { "StoichiometricFactor", 520.0 / MStoich },               // 1.006133
        { "ReactionMassEfficiencyPct", 100 * MAct / 520.0 },       // 68.192
        { "InputKg", 2230.0 },
        { "AuxiliaryKg", 1710.0 },
        { "RecoveredKg", 1350.0 },
        { "MaterialRecoveryParameter", 520.0 / (2230.0 - 1350.0) }, // 0.590909
        { "OverallReactionMassEfficiencyPct", 100 * MAct / 880.0 }, // 40.295
        { "ProcessMassIntensity", 2230.0 / MAct },                  // 6.28878
        { "CompleteEFactor", (2230.0 - 1350.0 - MAct) / MAct },     // 525.4 / 354.6 = 1.48167
        { "SimpleEFactor", (2230.0 - 1700.0 - 0.0 - MAct) / MAct }, // solvent+water 1500+200 out, nothing else recovered: 175.4 / 354.6 = 0.49464
        { "Rung:AuxiliariesNotRecovered", 1710.0 - 1350.0 },        // 360
        { "Rung:Recovered", 1350.0 },
        { "Rung:ExcessReactants", 520.0 - MStoich },                // 3.1697
        { "Rung:CoProducts", MStoich - MTheo },                     // 130.050 (2 H2O per ξ: 3.60950 * 36.030)
        { "Rung:ProductInWaste", 6.0 },
        { "Rung:ProductInSamples", 0.49 },
        { "Rung:UnexplainedYieldLoss", MTheo - MAct - 6.49 },       // 25.690
        { "Balance.OutputKg", 2218.5 },
        { "Balance.VentedKg", 0.0 },                                // excess H2 purge is not estimated: it stays in the gap
        { "Balance.GapKg", 11.5 },
        { "Balance.ClosurePct", 100 * 2218.5 / 2230.0 },            // 99.4843
        { "Balance.ToleranceKg", 44.6 },                            // 2.0 % of 2230
    };

    [Theory]
    [MemberData(nameof(HandFigures))]
    public void Hand_worked_figure_matches(string figure, double expected)
    {
        Chem.AssertClose(expected, Figures.Get(StepMetrics.Compute(Input()), figure), 1e-12, figure);
    }

    [Fact]
    public void Nitrotoluene_limits_because_its_n_over_nu_is_smaller()
    {
        // n/ν: NT 3.60950 kmol < H2 12.40079 / 3 = 4.13360 kmol.
        var r = StepMetrics.Compute(Input());
        Assert.Equal("NT", r.LimitingReactant);
        Assert.Equal(1.0, r.Reactants.Single(a => a.Material == "NT").Equivalents);
        Assert.Empty(r.MissingReactants);
    }

    [Fact]
    public void Hand_worked_rounded_values_agree_with_the_expressions()
    {
        // Independent check of the expressions above against values rounded by hand.
        var r = StepMetrics.Compute(Input());
        Assert.Equal(91.680, r.YieldPct!.Value, 3);
        Assert.Equal(74.837, r.AtomEconomyPct, 3);
        Assert.Equal(68.192, r.ReactionMassEfficiencyPct!.Value, 3);
        Assert.Equal(0.4946, r.SimpleEFactor!.Value, 4);
        Assert.False(r.Balance.IsSignificantLoss);
        Assert.False(r.Balance.IsSignificantSurplus);
    }

    internal static StepInput Input() => StepInput.Create(
        Chem.NitroReduction(),
        [
            ChargeRow.Create("NT", 500.0, 99.0),
            ChargeRow.Create("H2", 25.0),
            ChargeRow.Create("MEOH", 1500.0, role: AuxiliaryRole.Solvent),
            ChargeRow.Create("PDC", 5.0),
            ChargeRow.Create("WATER", 200.0, role: AuxiliaryRole.Water),
        ],
        [
            OutputRow.Product(360.0, 98.5),
            OutputRow.Recovered(1350.0, AuxiliaryRole.Solvent),
            OutputRow.Waste(500.0, productKg: 6.0),
            OutputRow.Waste(8.0),
            OutputRow.Sample(0.5, productKg: 0.49),
        ],
        Chem.Balance(tolerancePct: 2.0));
}
