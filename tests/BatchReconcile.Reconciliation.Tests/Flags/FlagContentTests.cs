using System.Globalization;
using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Reconciliation.Tests.Support;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Tests.Flags;

/// <summary>What each flag carries: severity (site defaults of the spec), measured value, limit, unit, subject and sentence.</summary>
public class FlagContentTests
{
    private const double XiMax = 197.0 / Mw.EthylNitrobenzoate;
    private const double Theo = XiMax * Mw.Benzocaine;

    private static Flag Only(string scenario, FlagCode code)
    {
        var flags = Hydrogenation.Reconcile(FlagScenarioTests.Rows(scenario)).Flags;
        return Assert.Single(flags, f => f.Code == code);
    }

    [Fact]
    public void Yield_low()
    {
        var f = Only("product 140.0 kg", FlagCode.YieldLow);
        Close.Equal(100 * 140.0 * 0.992 / Theo, f.Measured, "yield");   // 83.293 %
        Assert.Equal((FlagSeverity.Major, 88.0, "%"), (f.Severity, f.Limit!.Value, f.Unit));
        Assert.Contains("Yield 83.3 % is below the master-record minimum of 88 % for step S1 (nitro reduction)", f.Message, StringComparison.Ordinal);
        Assert.Null(f.Subject);
    }

    [Fact]
    public void Yield_high()
    {
        var f = Only("product 165.0 kg @ 99.9", FlagCode.YieldHigh);
        Close.Equal(100 * 165.0 * 0.999 / Theo, f.Measured, "yield");   // 98.858 %
        Assert.Equal((FlagSeverity.Major, 98.0, "%"), (f.Severity, f.Limit!.Value, f.Unit));
        Assert.Contains("98.9 %", f.Message, StringComparison.Ordinal);
        Assert.Contains("maximum of 98 %", f.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Yield_over_theory_is_critical_and_replaces_yield_high()
    {
        var flags = Hydrogenation.Reconcile(FlagScenarioTests.Rows("product 170.0 kg @ 100")).Flags;
        var f = Assert.Single(flags);
        Assert.Equal(FlagCode.YieldOverTheory, f.Code);
        Close.Equal(100 * 170.0 / Theo, f.Measured, "yield");           // 101.957 %
        Assert.Equal((FlagSeverity.Critical, 100.0, "%"), (f.Severity, f.Limit!.Value, f.Unit));
        Assert.Contains("Yield 102.0 % is above the theoretical maximum of 100 %", f.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_yield_just_over_a_limit_is_printed_with_two_decimals()
    {
        // Product 166.8 kg @ 100 %: Y = 166.8 / 166.738 = 100.037 %; one decimal would read "100.0 % is above 100 %".
        var f = Assert.Single(Hydrogenation.Reconcile(Hydrogenation.Rows(productKg: 166.8, productAssay: 100)).Flags);
        Assert.Equal(FlagCode.YieldOverTheory, f.Code);
        Assert.StartsWith("Yield 100.04 % is above the theoretical maximum of 100 %", f.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Balance_gap_carries_tolerance_and_expanded_uncertainty()
    {
        var f = Only("residue 80 kg", FlagCode.BalanceGap);
        static double U(double m) => Math.Sqrt(Math.Pow(0.001 * m, 2) + Math.Pow(0.05, 2));
        double[] weighings = [200.0, 6.5, 1000.0, 4.0, 150.0, 4.3, 80.0, 940.0, 0.25];
        double expanded = 2 * Math.Sqrt(weighings.Sum(m => U(m) * U(m)));    // 2 × 1.4045 = 2.809 kg
        Close.Equal(1210.5 - (150.0 + 4.3 + 80.0 + 940 + 0.25), f.Measured, "gap"); // 35.95 kg
        Close.Equal(0.02 * 1210.5, f.Limit, "tolerance, the larger limit");         // 24.21 kg
        Assert.Equal((FlagSeverity.Major, "kg"), (f.Severity, f.Unit));
        Assert.Contains("lost 35.95 kg", f.Message, StringComparison.Ordinal);
        Assert.Contains("tolerance of 24.21 kg (2 %)", f.Message, StringComparison.Ordinal);
        Assert.Contains($"uncertainty of {expanded.ToString("0.###", CultureInfo.InvariantCulture)} kg (k = 2)", f.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Balance_surplus()
    {
        var f = Only("residue 145 kg", FlagCode.BalanceSurplus);
        Close.Equal(145.0 - 112.0 - 3.95, f.Measured, "surplus");        // 29.05 kg
        Close.Equal(24.21, f.Limit, "tolerance");
        Assert.Equal((FlagSeverity.Critical, "kg"), (f.Severity, f.Unit));
        Assert.Contains("29.05 kg more output than input", f.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Equivalents_out_of_range()
    {
        var f = Only("H2 7.5 kg", FlagCode.EquivalentsOutOfRange);
        Close.Equal(7.5 / Mw.H2 / XiMax, f.Measured, "equiv");          // 3.686
        Assert.Equal((FlagSeverity.Minor, 3.6, "equiv", "H2"), (f.Severity, f.Limit!.Value, f.Unit, f.Subject));
        Assert.Contains("H2 was charged at 3.69 equiv in step S1 (nitro reduction), outside the allowed 3.00 to 3.60 equiv (relative to ENB)", f.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Reactant_missing_leaves_yield_and_everything_built_on_it_undefined()
    {
        var o = Hydrogenation.Reconcile(FlagScenarioTests.Rows("no H2 charged"));
        var f = Assert.Single(o.Flags);
        Assert.Equal((FlagCode.ReactantMissing, FlagSeverity.Critical, "H2"), (f.Code, f.Severity, f.Subject));
        Assert.Equal(0.0, f.Measured);
        Assert.Contains("Reactant H2 of step S1 (nitro reduction) has no charge recorded", f.Message, StringComparison.Ordinal);
        Assert.Null(o.LimitingReactant);
        Assert.Null(o.ExtentMaxMol);
        Assert.Null(o.TheoreticalKg);
        Assert.Null(o.YieldPct);
        Assert.Null(o.StoichiometricFactor);
        Assert.Empty(o.Ladder);
        Assert.Empty(o.Equivalents);

        // The gross balance is still judged: 1204.0 - 1206.55 = -2.55 kg.
        Close.Equal(-2.55, o.GapKg, "gap");

        // Issue 9: with a reactant not recorded the charged total is known to be incomplete, so every figure that
        // sets the product against it is not computable either (it was RME = 100 · 148.8 / 197.0 before).
        Assert.Null(o.RmePct);
        Assert.Null(o.OverallRmePct);
        Assert.Null(o.Pmi);
        Assert.Null(o.CompleteEFactor);
        Assert.Null(o.SimpleEFactor);
    }

    [Fact]
    public void Product_in_waste()
    {
        var f = Only("residue analysed 5.0 %", FlagCode.ProductInWaste);
        Close.Equal(100 * (112.0 * 0.05) / Theo, f.Measured, "% of theoretical"); // 5.6 / 166.738 = 3.3586 %
        Assert.Equal((FlagSeverity.Minor, 2.0, "%"), (f.Severity, f.Limit!.Value, f.Unit));
        Assert.Contains("carry 5.6 kg of product, 3.4 % of theoretical, above the limit of 2 %", f.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Product_in_waste_from_the_waste_rows_own_assay()
    {
        var o = Hydrogenation.Reconcile(FlagScenarioTests.Rows("filter wash 20 kg BZC @ 20 %"));
        var rung = o.Ladder.Single(r => r.Key == "yield-loss-product-in-waste");
        Close.Equal((20.0 * 0.20) + (112.0 * 0.015), rung.Kg, "product in waste");   // 4.0 + 1.68 = 5.68 kg
        Close.Equal(100 * 5.68 / Theo, o.Flags.Single().Measured, "% of theoretical"); // 3.4066 %
    }

    [Fact]
    public void A_waste_row_naming_the_product_without_assay_adds_no_product_content()
    {
        // Contract: a waste row's material says how much of it is that material only together with assay_pct.
        var o = Hydrogenation.Reconcile(Hydrogenation.Rows().Waste(Hydrogenation.S, "drum 7", 10.0, MassUnit.Kilogram, "BZC"));
        Close.Equal(112.0 * 0.015, o.Ladder.Single(r => r.Key == "yield-loss-product-in-waste").Kg, "product in waste");
    }

    [Fact]
    public void A_sample_row_with_a_stream_analysis_uses_the_analysis()
    {
        // Sample of the still residue, 0.5 kg, not naming a material: 1.5 % of it is product (analysis of that stream).
        var o = Hydrogenation.Reconcile(Hydrogenation.Rows().Sample(Hydrogenation.S, 0.5, MassUnit.Kilogram, stream: "Still Residue "));
        Close.Equal(0.25 + (0.5 * 0.015), o.Ladder.Single(r => r.Key == "yield-loss-product-in-samples").Kg, "product in samples");
    }

    [Fact]
    public void Replicate_analyses_of_one_stream_are_averaged()
    {
        // 1.5 % and 2.5 % for the still residue: mean 2.0 % of 112 kg = 2.24 kg.
        var o = Hydrogenation.Reconcile(Hydrogenation.Rows().Analysis(Hydrogenation.S, "still residue", "BZC", 2.5));
        Close.Equal(112.0 * 0.02, o.Ladder.Single(r => r.Key == "yield-loss-product-in-waste").Kg, "product in waste");
    }
}
