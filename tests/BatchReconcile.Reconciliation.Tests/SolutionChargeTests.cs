using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Reconciliation.Tests.Support;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Tests;

/// <summary>
/// A charge of a solution supplies each of its components (issue 9, point 5), worked by hand on step S1 of
/// <see cref="AmineRoute"/>: BCN + H2O -> PAA, the water coming only from 36 % hydrochloric acid. Molar masses:
/// <see cref="Mw"/> (CIAAW 2021 abridged); formulas of the reconciliation spec (AE: Trost, Science 1991; RME: Curzons
/// et al., Green Chem. 2001; cEF: Roschangar, Sheldon, Senanayake, Green Chem. 2015).
/// </summary>
public class SolutionChargeTests
{
    // BCN 150.0 kg @ 99.0 % = 148.5 kg -> n = 148.5 / 117.151 = 1.267595 kmol.
    // HCL36 600.0 kg, nominal: HCl 600 × 36/100 = 216.0 kg, water 600 × 64/100 = 384.0 kg -> n_water = 384.0 / 18.015 = 21.31557 kmol.
    // n/ν: BCN 1.267595 < water 21.31557, so L = BCN; ξ_max = 1.267595 kmol.
    private const double NBcn = 148.5 / Mw.BenzylCyanide;
    private const double Theo = NBcn * Mw.Phenylacetamide;            // 1.267595 × 135.166 = 171.336 kg
    private const double React = 148.5 + 384.0;                        // BCN and the acid's water: 532.5 kg
    private const double MassIn = 150.0 + 600.0;                       // the whole acid is weighed: 750.0 kg

    public static TheoryData<string, double> HandFigures => new()
    {
        { "ExtentMaxMol", NBcn * 1000 },                               // 1267.595 mol
        { "TheoreticalKg", Theo },                                    // 171.336 kg
        { "YieldPct", 100 * 147.0 / Theo },                           // 85.796 %
        { "AtomEconomyPct", 100 * Mw.Phenylacetamide / (Mw.BenzylCyanide + Mw.Water) }, // 135.166 / 135.166 = 100 %: a hydration
        { "StoichiometricFactor", React / (NBcn * (Mw.BenzylCyanide + Mw.Water)) },    // 532.5 / 171.336 = 3.1079
        { "ReactantMassKg", React },
        { "RmePct", 100 * 147.0 / React },                            // 27.606 %
        { "MassInKg", MassIn },
        { "Pmi", MassIn / 147.0 },                                    // 5.1020
        { "CompleteEFactor", (MassIn - 147.0) / 147.0 },              // 4.1020
        // The acid's water is a reactant here, and HCl is a reagent: nothing is solvent or water, so sEF = cEF.
        { "SimpleEFactor", (MassIn - 147.0) / 147.0 },
        { "GapKg", MassIn - 147.0 - 600.0 },                          // 3.0 kg
        { "Equiv:WATER", 384.0 / Mw.Water / NBcn },                   // 16.816 equiv
        { "Equiv:HCL", 216.0 / Mw.HydrogenChloride / NBcn },          // 5.92463 / 1.267595 = 4.6739 equiv
    };

    [Theory]
    [MemberData(nameof(HandFigures))]
    public void A_36_percent_hydrochloric_acid_charge_supplies_the_water_of_a_hydration_step(string figure, double expected)
    {
        var s1 = S1(AmineRoute.S1Rows(Batch()));
        Close.Equal(expected, HydrogenationFiguresTests.Figure(s1, figure), figure);
    }

    [Fact]
    public void The_acid_water_makes_the_step_computable_and_HCl_is_counted_within_its_equivalents_range()
    {
        var s1 = S1(AmineRoute.S1Rows(Batch()));
        Assert.Equal("BCN", s1.LimitingReactant);
        Assert.Empty(s1.Flags);                       // HCl 4.67 equiv is inside the step's 4.0 to 5.5
        Assert.False(s1.Equivalents.ContainsKey("HCL36"));
    }

    [Fact]
    public void Without_the_composition_the_same_charge_leaves_the_water_missing()
    {
        // What a site had to do before: the acid entered as HCl at assay 36 %; the 384 kg of water reach nobody.
        var s1 = S1(new BatchBuilder("BNA-2612-015", AmineRoute.RecipeCode)
            .Charge("S1", "BCN", 150.0, MassUnit.Kilogram, 99.0)
            .Charge("S1", "HCL", 600.0, MassUnit.Kilogram, 36)
            .Product("S1", "PAA", 147.0, MassUnit.Kilogram)
            .Waste("S1", "mother liquor", 600.0, MassUnit.Kilogram));
        var f = Assert.Single(s1.Flags);
        Assert.Equal((FlagCode.ReactantMissing, "WATER"), (f.Code, f.Subject));
    }

    [Fact]
    public void A_small_acid_charge_makes_its_water_the_limiting_reactant()
    {
        // HCL36 20.0 kg: water 20.0 × 0.64 = 12.8 kg -> 12.8 / 18.015 = 0.710519 kmol < BCN 1.267595 kmol -> L = WATER.
        // m_theo = 0.710519 × 135.166 = 96.038 kg; 147.0 kg isolated is then over theory.
        var s1 = S1(AmineRoute.S1Rows(Batch(), acidKg: 20.0));
        Assert.Equal("WATER", s1.LimitingReactant);
        Close.Equal(12.8 / Mw.Water * Mw.Phenylacetamide, s1.TheoreticalKg, "theoretical");
        Close.Equal(96.038, s1.TheoreticalKg, "rounded hand value", 1e-5);
        Assert.Contains(s1.Flags, f => f.Code == FlagCode.YieldOverTheory);
        // HCl 7.2 kg = 0.197487 kmol over 0.710519 kmol = 0.2779 equiv, below 4.0.
        var eq = Assert.Single(s1.Flags, f => f.Code == FlagCode.EquivalentsOutOfRange);
        Assert.Equal("HCL", eq.Subject);
        Close.Equal(7.2 / Mw.HydrogenChloride / (12.8 / Mw.Water), eq.Measured, "HCl equiv");
    }

    [Fact]
    public void The_assay_of_a_solution_charge_is_that_of_its_main_component_and_the_rest_scales()
    {
        // HCL36 600.0 kg assayed 35.0 % HCl: HCl 210.0 kg; water (100 - 35.0) × 64/64 = 65.0 % = 390.0 kg.
        var s1 = S1(AmineRoute.S1Rows(Batch(), acidAssay: 35.0));
        Close.Equal(148.5 + 390.0, s1.ReactantMassKg, "BCN + water");
        Close.Equal(210.0 / Mw.HydrogenChloride / NBcn, s1.Equivalents["HCL"], "HCl equiv");
        Close.Equal(750.0, s1.MassInKg, "whole mass in the balance");
    }

    [Theory]
    // S2 charges sodium hypochlorite 12.5 % with 1 % NaOH, rest water, 750 kg, and NAOH50 200 kg (NaOH 100.0 kg).
    [InlineData(null, 93.75, 7.5)]                 // nominal: NaOCl 12.5 %, NaOH 1.0 %, water 86.5 %
    // Assay 12.0 % NaOCl: 90.0 kg; NaOH (100 - 12) × 1/87.5 = 1.005714 % = 7.542857 kg; water 88 × 86.5/87.5 = 86.994 %.
    [InlineData(12.0, 90.0, 7.542857142857143)]
    public void A_three_component_solution_scales_its_other_components_to_the_assay(double? assay, double naoclKg, double naohKg)
    {
        var s2 = AmineRoute.Reconcile(AmineRoute.Rows(hypochloriteAssay: assay)).Steps[1];
        double nPaa = 145.0 / Mw.Phenylacetamide;   // L = PAA, 1.072755 kmol
        Assert.Equal("PAA", s2.LimitingReactant);
        Close.Equal(naoclKg / Mw.SodiumHypochlorite / nPaa, s2.Equivalents["NAOCL"], "NaOCl equiv");
        Close.Equal((100.0 + naohKg) / Mw.SodiumHydroxide / nPaa, s2.Equivalents["NAOH"], "NaOH equiv (both charges)");
        Close.Equal(145.0 + naoclKg + (100.0 + naohKg), s2.ReactantMassKg, "reactants of the equation");
        Close.Equal(145.0 + 750.0 + 200.0, s2.MassInKg, "whole masses in the balance");
    }

    [Fact]
    public void A_component_supplied_by_two_charges_adds_up()
    {
        // S2: NaOH from NAOH50 (200 × 0.5 = 100.0 kg) and from NAOCL13 (750 × 0.01 = 7.5 kg): 107.5 / 39.997 = 2.68770 kmol;
        // L = PAA 145.0 / 135.166 = 1.072755 kmol -> 2.5054 equiv.
        var s2 = AmineRoute.Reconcile(AmineRoute.Rows()).Steps[1];
        Assert.Equal("PAA", s2.LimitingReactant);
        Close.Equal(107.5 / Mw.SodiumHydroxide / (145.0 / Mw.Phenylacetamide), s2.Equivalents["NAOH"], "NaOH equiv");
        Close.Equal(93.75 / Mw.SodiumHypochlorite / (145.0 / Mw.Phenylacetamide), s2.Equivalents["NAOCL"], "NaOCl equiv"); // 1.1740
    }

    private static BatchBuilder Batch() => new("BNA-2612-014", AmineRoute.RecipeCode);

    private static StepOutcome S1(BatchBuilder rows) =>
        BatchReconciler.Reconcile(rows.Build(), AmineRoute.Recipe(AmineRoute.S1()), AmineRoute.Catalog, new Settings.ReconciliationSettings()).Steps.Single();
}
