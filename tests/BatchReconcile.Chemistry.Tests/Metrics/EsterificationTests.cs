using BatchReconcile.Chemistry.Metrics;

namespace BatchReconcile.Chemistry.Tests.Metrics;

/// <summary>
/// Hand-worked esterification with excess alcohol: benzoic acid + ethanol -> ethyl benzoate + water, H2SO4 catalyst.
/// Formulas: project reconciliation spec; AE (Trost, Science 1991); RME (Curzons et al., Green Chem. 2001);
/// MRP (Andraos, OPRD 2005); E-factors (Roschangar et al., Green Chem. 2015).
/// </summary>
public class EsterificationTests
{
    // Charges: BZOH 250.0 kg @ 99.5 % -> 248.75 kg; ETOH 470.0 kg @ 99.8 % -> 469.06 kg; H2SO4 10.0 kg @ 96 % -> 9.6 kg;
    // work-up water 300 kg. m_in = 1030 kg; m_react = 248.75 + 469.06 = 717.81 kg.
    // n_BZOH = 248.75 / 122.123 = 2.036881 kmol (L); n_ETOH = 469.06 / 46.069 = 10.181684 kmol -> 4.9987 equiv.
    // H2SO4: 9.6 / 98.072 = 0.097887 kmol -> 0.048057 equiv.
    // m_theo = 2.036881 * 150.177 = 305.893 kg; m_stoich = 2.036881 * 168.192 = 342.587 kg; SF = 717.81 / 342.587 = 2.09526.
    // Product 290.0 kg @ 99.0 % -> 287.1 kg: Y = 93.856 %; AE = 150.177 / 168.192 = 89.289 %; RME = 287.1 / 717.81 = 39.997 %.
    // Recovered ethanol 250 kg (a reactant, so not solvent for sEF). MRP = 717.81 / 780 = 0.920269.
    // cEF = (1030 - 250 - 287.1) / 287.1 = 1.71682; sEF = (1030 - 300 - 250 - 287.1) / 287.1 = 0.67189.
    private const double Xi = 248.75 / Chem.BenzoicAcid;

    public static TheoryData<string, double> HandFigures => new()
    {
        { "Reactant:BZOH.ChargedKg", 248.75 },
        { "Reactant:ETOH.ChargedKg", 469.06 },
        { "Reactant:ETOH.Equivalents", 469.06 / Chem.Ethanol / Xi },       // 4.9987
        { "Reactant:ETOH.AmountPerCoefficientKmol", 469.06 / Chem.Ethanol },
        { "Reagent:H2SO4.Equivalents", 9.6 / Chem.SulfuricAcid / Xi },      // 0.048057
        { "TheoreticalProductKg", Xi * Chem.EthylBenzoate },
        { "YieldPct", 100 * 287.1 / (Xi * Chem.EthylBenzoate) },
        { "AtomEconomyPct", 100 * Chem.EthylBenzoate / (Chem.BenzoicAcid + Chem.Ethanol) },
        { "StoichiometricFactor", 717.81 / (Xi * (Chem.BenzoicAcid + Chem.Ethanol)) },
        { "ReactionMassEfficiencyPct", 100 * 287.1 / 717.81 },
        { "MaterialRecoveryParameter", 717.81 / 780.0 },
        { "ProcessMassIntensity", 1030.0 / 287.1 },
        { "CompleteEFactor", (1030.0 - 250.0 - 287.1) / 287.1 },
        { "SimpleEFactor", (1030.0 - 300.0 - 250.0 - 287.1) / 287.1 },
        { "SolventAndWaterChargedKg", 300.0 },
        { "Rung:ExcessReactants", 717.81 - (Xi * (Chem.BenzoicAcid + Chem.Ethanol)) }, // 375.223: the excess ethanol
        { "Rung:AuxiliariesNotRecovered", 1030.0 - 717.81 - 250.0 },                  // 62.19
    };

    [Theory]
    [MemberData(nameof(HandFigures))]
    public void Hand_worked_figure_matches(string figure, double expected) =>
        Chem.AssertClose(expected, Figures.Get(StepMetrics.Compute(Input()), figure), 1e-12, figure);

    [Fact]
    public void Rounded_hand_values_agree()
    {
        var r = StepMetrics.Compute(Input());
        Assert.Equal("BZOH", r.LimitingReactant);
        Assert.Equal(4.9987, r.Reactants[1].Equivalents!.Value, 4);
        Assert.Equal(0.048057, r.Reagents.Single().Equivalents!.Value, 6);
        Assert.Equal(93.856, r.YieldPct!.Value, 3);
        Assert.Equal(89.289, r.AtomEconomyPct, 3);
        Assert.Equal(2.09526, r.StoichiometricFactor!.Value, 5);
        Assert.Equal(39.997, r.ReactionMassEfficiencyPct!.Value, 3);
        Assert.Equal(0.67189, r.SimpleEFactor!.Value, 5);
    }

    [Fact]
    public void Rows_of_one_material_are_summed_before_amounts_are_taken()
    {
        // Ethanol charged in two portions of different grades: 300.0 kg @ 99.8 % + 170.0 kg @ 99.8 % = 469.06 kg, same as one row.
        var split = StepInput.Create(
            Chem.Esterification(),
            [
                ChargeRow.Create("BZOH", 250.0, 99.5),
                ChargeRow.Create("ETOH", 300.0, 99.8),
                ChargeRow.Create("ETOH", 170.0, 99.8),
            ],
            [OutputRow.Product(290.0, 99.0)],
            Chem.Balance());
        var r = StepMetrics.Compute(split);
        Assert.Equal(469.06, r.Reactants[1].ChargedKg, 10);
        Assert.Equal(469.06 / Chem.Ethanol / Xi, r.Reactants[1].Equivalents!.Value, 10);
    }

    internal static StepInput Input() => StepInput.Create(
        Chem.Esterification(),
        [
            ChargeRow.Create("BZOH", 250.0, 99.5),
            ChargeRow.Create("ETOH", 470.0, 99.8, AuxiliaryRole.Solvent), // role ignored: ETOH is a reactant
            ChargeRow.Create("H2SO4", 10.0, 96.0),
            ChargeRow.Create("WATER", 300.0, role: AuxiliaryRole.Water),
        ],
        [
            OutputRow.Product(290.0, 99.0),
            OutputRow.Recovered(250.0),
            OutputRow.Waste(470.0, productKg: 8.0),
        ],
        Chem.Balance(),
        new Dictionary<string, double> { ["H2SO4"] = Chem.SulfuricAcid });
}
