using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Reconciliation.Tests.Support;

namespace BatchReconcile.Reconciliation.Tests;

/// <summary>
/// Every figure of the base hydrogenation batch (<see cref="Hydrogenation"/>), worked by hand from the formulas of the
/// reconciliation spec: AE (Trost, Science 1991); RME (Curzons et al., Green Chem. 2001); MRP and RME_g (Andraos,
/// Org. Process Res. Dev. 2005); cEF and sEF (Roschangar, Sheldon, Senanayake, Green Chem. 2015); uncertainty
/// combined in quadrature (JCGM 100:2008, GUM). Molar masses: <see cref="Mw"/> (CIAAW 2021 abridged).
/// </summary>
public class HydrogenationFiguresTests
{
    // Assay-corrected charges: ENB 200.0 × 98.5 % = 197.0 kg; H2 6.5 kg.
    // n_ENB = 197.0 / 195.174 = 1.009356 kmol; n_H2 / 3 = 6.5 / 2.016 / 3 = 1.074735 kmol -> L = ENB.
    private const double XiMax = 197.0 / Mw.EthylNitrobenzoate;                 // kmol
    private const double Theo = XiMax * Mw.Benzocaine;                           // 166.738 kg
    private const double Act = 150.0 * 99.2 / 100;                               // 148.8 kg
    private const double SumNuM = Mw.EthylNitrobenzoate + (3 * Mw.H2);           // 201.222 g/mol
    private const double Stoich = XiMax * SumNuM;                                // 203.105 kg
    private const double React = 197.0 + 6.5;                                    // 203.5 kg
    private const double MassIn = 200.0 + 6.5 + (1.000 * 1000) + (4000 / 1000.0); // 1210.5 kg (t and g converted)
    private const double Rec = 0.940 * 1000;                                     // 940 kg
    private const double InWaste = 112.0 * 1.5 / 100;                            // 1.68 kg (analysis row)
    private const double InSamples = 250 / 1000.0;                               // 0.25 kg (sample of BZC, no assay)
    private const double MassOut = 150.0 + 4.3 + 112.0 + 940 + 0.25;             // 1206.55 kg

    public static TheoryData<string, double> HandFigures => new()
    {
        { "ExtentMaxMol", XiMax * 1000 },                         // 1009.356 mol
        { "TheoreticalKg", Theo },                               // 166.738 kg
        { "ActualKg", Act },
        { "YieldPct", 100 * Act / Theo },                        // 89.242 %
        { "AtomEconomyPct", 100 * Mw.Benzocaine / SumNuM },      // 165.192 / 201.222 = 82.094 %
        { "StoichiometricMassKg", Stoich },
        { "StoichiometricFactor", React / Stoich },              // 1.00195
        { "RmePct", 100 * Act / React },                         // 73.120 %
        { "Mrp", React / (MassIn - Rec) },                       // 203.5 / 270.5 = 0.75231
        { "OverallRmePct", 100 * Act / (MassIn - Rec) },         // 55.009 %
        { "Pmi", MassIn / Act },                                 // 8.1351
        { "CompleteEFactor", (MassIn - Rec - Act) / Act },       // 121.7 / 148.8 = 0.81788
        // sEF leaves out solvent and water: ethanol 1000 kg charged, 940 kg of it recovered.
        { "SimpleEFactor", (MassIn - 1000 - (Rec - 940) - Act) / Act }, // 61.7 / 148.8 = 0.41465
        { "MassInKg", MassIn },
        { "ReactantMassKg", React },
        { "RecoveredKg", Rec },
        { "MassOutKg", MassOut },
        { "VentedKg", 0 },
        { "GapKg", MassIn - MassOut },                           // 3.95 kg
        { "ClosurePct", 100 * MassOut / MassIn },                // 99.674 %
        { "Equiv:H2", 6.5 / Mw.H2 / XiMax },                     // 3.1943 equiv
        { "Equiv:ENB", 1.0 },
        { "Equiv:PDC", 4.0 / Mw.Palladium / XiMax },             // catalyst outside the equation: 0.037239
        { "Rung:auxiliaries-not-recovered", MassIn - React - Rec }, // 1007.0 - 940 = 67.0 kg
        { "Rung:recovered", Rec },
        { "Rung:excess-reactants", React - Stoich },             // 0.395 kg
        { "Rung:co-products", Stoich - Theo },                   // ξ_max × 2 × 18.015 = 36.367 kg
        { "Rung:yield-loss-product-in-waste", InWaste },
        { "Rung:yield-loss-product-in-samples", InSamples },
        { "Rung:yield-loss-unexplained", Theo - Act - InWaste - InSamples }, // 16.008 kg
    };

    [Theory]
    [MemberData(nameof(HandFigures))]
    public void Hand_worked_figure(string figure, double expected) =>
        Close.Equal(expected, Figure(Hydrogenation.Reconcile(Hydrogenation.Rows()), figure), figure);

    [Fact]
    public void Rounded_hand_values_and_identities()
    {
        var o = Hydrogenation.Reconcile(Hydrogenation.Rows());
        Assert.Equal("ENB", o.LimitingReactant);
        Assert.True(o.HasRows);
        Assert.Equal(89.242, o.YieldPct!.Value, 3);
        Assert.Equal(82.094, o.AtomEconomyPct, 3);
        Assert.Equal(73.120, o.RmePct!.Value, 3);
        Assert.Equal(3.95, o.GapKg, 9);

        // RME = Y·AE/SF/100 (Curzons et al., Green Chem. 2001); RME_g = RME·MRP (Andraos, OPRD 2005).
        Close.Equal(o.YieldPct.Value * o.AtomEconomyPct / o.StoichiometricFactor!.Value / 100, o.RmePct, "RME identity");
        Close.Equal(o.RmePct.Value * o.Mrp!.Value, o.OverallRmePct, "RME_g identity");

        // The ladder's rungs plus the product add up to the charged mass exactly (spec), in stable key order.
        Assert.Equal(LadderRungKeys.All, o.Ladder.Select(r => r.Key));
        Close.Equal(o.MassInKg, o.Ladder.Sum(r => r.Kg) + o.ActualKg, "ladder sum");
        Close.Equal(100.0, o.Ladder.Sum(r => r.PctOfCharged) + (100 * o.ActualKg / o.MassInKg), "ladder % sum");
        Assert.All(o.Ladder, r => Assert.False(string.IsNullOrWhiteSpace(r.Label)));

        // Solvent is not given equivalents; the clean base batch raises nothing.
        Assert.False(o.Equivalents.ContainsKey("ETOH"));
        Assert.Empty(o.Flags);
    }

    [Fact]
    public void Solvent_water_and_the_per_material_parts_of_the_ladder()
    {
        var o = Hydrogenation.Reconcile(Hydrogenation.Rows());

        // Solvent: the ethanol, 1.000 t = 1000.0 kg (role solvent, not in the equation); no water is charged.
        Close.Equal(1000.0, o.SolventInKg, "solvent in");
        Close.Equal(0.0, o.WaterInKg, "water in");

        // Auxiliaries not recovered, by material in charge order: ENB 200.0 − 197.0 = 3.0 (non-assay part of a reactant
        // row); ETOH 1000.0 − 940.0 recovered = 60.0; PDC 4000 g = 4.0. H2 at 100 % puts nothing in. 3.0 + 60.0 + 4.0 = 67.0.
        var aux = o.Ladder.Single(r => r.Key == LadderRungKeys.AuxiliariesNotRecovered);
        Assert.Equal(["ENB", "ETOH", "PDC"], aux.Parts.Select(p => p.Material));
        Close.Equal(3.0, aux.Parts[0].Kg, "ENB");
        Close.Equal(60.0, aux.Parts[1].Kg, "ETOH");
        Close.Equal(4.0, aux.Parts[2].Kg, "PDC");

        // Excess reactants per reactant: ENB 197.0 − ξ_max·195.174 = 0 (limiting); H2 6.5 − 1.009356 × 3 × 2.016 =
        // 6.5 − 6.10458 = 0.39542 kg, the rung's 0.395 kg.
        var excess = o.Ladder.Single(r => r.Key == LadderRungKeys.ExcessReactants);
        Assert.Equal(["ENB", "H2"], excess.Parts.Select(p => p.Material));
        Assert.True(Math.Abs(excess.Parts[0].Kg) <= 1e-9 * o.MassInKg);
        Close.Equal(6.5 - (XiMax * 3 * Mw.H2), excess.Parts[1].Kg, "H2");

        // Parts add up to their rung within 1e-9 of m_in (rounding only); every other rung has none.
        Assert.True(Math.Abs(aux.Parts.Sum(p => p.Kg) - aux.Kg) <= 1e-9 * o.MassInKg);
        Assert.True(Math.Abs(excess.Parts.Sum(p => p.Kg) - excess.Kg) <= 1e-9 * o.MassInKg);
        Assert.All(o.Ladder.Where(r => r != aux && r != excess), r => Assert.Empty(r.Parts));
    }

    [Fact]
    public void Combined_uncertainty_adds_every_weighing_in_quadrature()
    {
        // Site defaults: u = sqrt((0.001·m)² + (0.05 kg)²) per weighed row; no vented gas, so every sensitivity is 1
        // (JCGM 100:2008 (GUM) 5.1.2).
        static double U(double m) => Math.Sqrt(Math.Pow(0.001 * m, 2) + Math.Pow(0.05, 2));
        double[] weighings = [200.0, 6.5, 1000.0, 4.0, 150.0, 4.3, 112.0, 940.0, 0.25];
        double expected = Math.Sqrt(weighings.Sum(m => U(m) * U(m)));
        var o = Hydrogenation.Reconcile(Hydrogenation.Rows());
        Close.Equal(expected, o.CombinedUncertaintyKg, "u_c");
        // By hand, u² per row: 0.0425 + 0.0025423 + 1.0025 + 0.002516 + 0.025 + 0.0025185 + 0.015044 + 0.8861 + 0.0025001
        // = 1.981221 kg², u_c = 1.40756 kg.
        Assert.Equal(1.40756, o.CombinedUncertaintyKg, 5);
    }

    [Fact]
    public void Yield_over_100_percent_makes_the_yield_loss_rung_negative()
    {
        // Product 170.0 kg @ 100 %: Y = 170 / 166.738 = 101.957 %; unexplained = 166.738 - 170 - 1.68 - 0.25 = -5.192 kg.
        var o = Hydrogenation.Reconcile(Hydrogenation.Rows(productKg: 170.0, productAssay: 100));
        Close.Equal(100 * 170.0 / Theo, o.YieldPct, "yield");
        var unexplained = o.Ladder.Single(r => r.Key == LadderRungKeys.UnexplainedYieldLoss);
        Close.Equal(Theo - 170.0 - InWaste - InSamples, unexplained.Kg, "unexplained rung");
        Assert.True(unexplained.Kg < 0);
        Close.Equal(o.MassInKg, o.Ladder.Sum(r => r.Kg) + o.ActualKg, "ladder sum");
    }

    internal static double? Figure(StepOutcome o, string figure) => figure switch
    {
        "ExtentMaxMol" => o.ExtentMaxMol,
        "TheoreticalKg" => o.TheoreticalKg,
        "ActualKg" => o.ActualKg,
        "YieldPct" => o.YieldPct,
        "AtomEconomyPct" => o.AtomEconomyPct,
        "StoichiometricMassKg" => o.StoichiometricMassKg,
        "StoichiometricFactor" => o.StoichiometricFactor,
        "RmePct" => o.RmePct,
        "Mrp" => o.Mrp,
        "OverallRmePct" => o.OverallRmePct,
        "Pmi" => o.Pmi,
        "CompleteEFactor" => o.CompleteEFactor,
        "SimpleEFactor" => o.SimpleEFactor,
        "MassInKg" => o.MassInKg,
        "ReactantMassKg" => o.ReactantMassKg,
        "RecoveredKg" => o.RecoveredKg,
        "MassOutKg" => o.MassOutKg,
        "VentedKg" => o.VentedKg,
        "VentedMaxKg" => o.VentedMaxKg,
        "GapKg" => o.GapKg,
        "ClosurePct" => o.ClosurePct,
        _ when figure.StartsWith("Equiv:", StringComparison.Ordinal) => o.Equivalents.TryGetValue(figure[6..], out var e) ? e : null,
        _ when figure.StartsWith("Rung:", StringComparison.Ordinal) => o.Ladder.SingleOrDefault(r => r.Key == figure[5..])?.Kg,
        _ => throw new ArgumentException($"No figure '{figure}'.", nameof(figure)),
    };
}
