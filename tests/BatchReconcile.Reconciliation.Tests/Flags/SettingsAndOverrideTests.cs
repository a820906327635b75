using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Reconciliation.Settings;
using BatchReconcile.Reconciliation.Tests.Support;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Tests.Flags;

/// <summary>Severities from site settings and step overrides, the product-in-waste limit, balance settings, reagent ranges.</summary>
public class SettingsAndOverrideTests
{
    // Residue analysed 5.0 %: 5.6 kg of product = 3.3586 % of the 166.738 kg theoretical.
    private static BatchBuilder ProductInWaste() => Hydrogenation.Rows(residueProductPct: 5.0);

    [Theory]
    [InlineData(null, null, FlagSeverity.Minor)]                  // spec default
    [InlineData("major", null, FlagSeverity.Major)]               // site setting
    [InlineData(" Critical ", null, FlagSeverity.Critical)]       // site setting, text as typed
    [InlineData("major", FlagSeverity.Minor, FlagSeverity.Minor)] // the step wins over the site
    [InlineData(null, FlagSeverity.Critical, FlagSeverity.Critical)]
    public void Severity_default_site_and_step(string? site, FlagSeverity? step, FlagSeverity expected)
    {
        var settings = new ReconciliationSettings();
        if (site is not null)
        {
            settings.Severities["product-in-waste"] = site;
        }

        var overrides = step is { } s ? new Dictionary<FlagCode, FlagSeverity> { [FlagCode.ProductInWaste] = s } : null;
        var o = Hydrogenation.Reconcile(ProductInWaste(), Hydrogenation.Step(severities: overrides), settings);
        Assert.Equal(expected, Assert.Single(o.Flags).Severity);
    }

    [Fact]
    public void A_step_override_of_one_code_leaves_the_others_at_the_site_setting()
    {
        var settings = new ReconciliationSettings();
        settings.Severities["yield-low"] = "critical";
        var step = Hydrogenation.Step(severities: new() { [FlagCode.ProductInWaste] = FlagSeverity.Major });

        // Product 140.0 kg (yield 83.3 %) and residue at 5.0 %: both flags.
        var o = Hydrogenation.Reconcile(Hydrogenation.Rows(productKg: 140.0, residueProductPct: 5.0), step, settings);
        Assert.Equal(FlagSeverity.Critical, o.Flags.Single(f => f.Code == FlagCode.YieldLow).Severity);
        Assert.Equal(FlagSeverity.Major, o.Flags.Single(f => f.Code == FlagCode.ProductInWaste).Severity);
    }

    [Fact]
    public void Unknown_codes_and_severities_are_all_reported()
    {
        var text = new Dictionary<string, string> { ["yeld-low"] = "major", ["balance-gap"] = "urgent", ["step-missing"] = "minor" };
        Assert.False(SeverityTable.TryCreate(text, out var table, out var errors));
        Assert.Null(table);
        Assert.Equal(2, errors.Count);
        Assert.Contains("'yeld-low' is not a flag code", errors[0], StringComparison.Ordinal);
        Assert.Contains("balance-gap: 'urgent' is not a severity", errors[1], StringComparison.Ordinal);

        var settings = new ReconciliationSettings { Severities = new(text, StringComparer.OrdinalIgnoreCase) };
        Assert.Throws<ArgumentException>(() => Hydrogenation.Reconcile(Hydrogenation.Rows(), settings: settings));
    }

    [Theory]
    [InlineData(2.0, null, true)]   // 3.36 % > 2 % (site default)
    [InlineData(4.0, null, false)]  // site limit 4 %
    [InlineData(4.0, 3.0, true)]    // step limit 3 % wins over the site's 4 %
    [InlineData(2.0, 5.0, false)]   // step limit 5 % wins over the site's 2 %
    public void Product_in_waste_limit_site_and_step(double siteMaxPct, double? stepMaxPct, bool flagged)
    {
        var settings = new ReconciliationSettings { ProductInWasteMaxPct = siteMaxPct };
        var o = Hydrogenation.Reconcile(ProductInWaste(), Hydrogenation.Step(productInWasteMaxPct: stepMaxPct), settings);
        Assert.Equal(flagged, o.Flags.Any(f => f.Code == FlagCode.ProductInWaste));
    }

    /// <summary>The same 35.95 kg gap (residue 80 kg) is flagged on fine balances and not when it is within k·u_c.</summary>
    [Theory]
    [InlineData(0.05, true)]  // u_c = 1.4045 kg, k·u_c = 2.81 kg < 35.95 kg, and 35.95 > 24.21 kg tolerance
    [InlineData(10.0, false)] // u_c = sqrt(1.9425 + 9 × 100) = 30.032 kg, k·u_c = 60.06 kg > 35.95 kg
    public void Gap_beyond_tolerance_is_flagged_only_beyond_expanded_uncertainty(double absoluteKg, bool flagged)
    {
        var settings = new ReconciliationSettings { BalanceAbsoluteUncertaintyKg = absoluteKg };
        var o = Hydrogenation.Reconcile(Hydrogenation.Rows(residueKg: 80.0), settings: settings);
        static double U(double m, double a) => Math.Sqrt(Math.Pow(0.001 * m, 2) + (a * a));
        double[] weighings = [200.0, 6.5, 1000.0, 4.0, 150.0, 4.3, 80.0, 940.0, 0.25];
        Close.Equal(Math.Sqrt(weighings.Sum(m => U(m, absoluteKg) * U(m, absoluteKg))), o.CombinedUncertaintyKg, "u_c");
        Close.Equal(35.95, o.GapKg, "gap");
        Assert.Equal(flagged, o.Flags.Any(f => f.Code == FlagCode.BalanceGap));
    }

    [Fact]
    public void Coverage_factor_from_the_site_settings_moves_the_decision()
    {
        // Residue 80 kg, absolute 10 kg: u_c = 30.032 kg; k = 1 gives 30.03 kg < 35.95 kg, so the gap is flagged.
        var settings = new ReconciliationSettings { BalanceAbsoluteUncertaintyKg = 10.0, CoverageFactor = 1.0 };
        var o = Hydrogenation.Reconcile(Hydrogenation.Rows(residueKg: 80.0), settings: settings);
        var f = o.Flags.Single(x => x.Code == FlagCode.BalanceGap);
        Close.Equal(o.CombinedUncertaintyKg, f.Limit, "the larger limit is k·u_c here", 1e-12);
        Assert.Contains("(k = 1)", f.Message, StringComparison.Ordinal);
    }

    /// <summary>Pd/C outside the equation, given a range: 4.0 kg / 106.42 kg/kmol / 1.009356 kmol = 0.037239 equiv (counted as Pd, assay 100 %).</summary>
    [Theory]
    [InlineData(0.01, 0.05, true, null, null)]      // charged, in range
    [InlineData(0.05, 0.10, true, 0.037239, 0.05)]  // charged, below
    [InlineData(0.01, 0.05, false, 0.0, 0.01)]      // not charged: 0 equiv, below
    [InlineData(0.0, 0.05, false, null, null)]      // not charged, and 0 is allowed
    public void Reagent_outside_the_equation(double min, double max, bool charged, double? measured, double? limit)
    {
        var step = Hydrogenation.Step(equivalents: new() { ["H2"] = new(3.0, 3.6), ["pdc"] = new(min, max) });
        var rows = Hydrogenation.Rows();
        if (!charged)
        {
            rows.Without(r => r.Material == "PDC");
        }

        var o = Hydrogenation.Reconcile(rows, step);
        var f = o.Flags.SingleOrDefault(x => x.Code == FlagCode.EquivalentsOutOfRange);
        if (measured is null)
        {
            Assert.Null(f);
            return;
        }

        Assert.NotNull(f);
        Assert.Equal("PDC", f.Subject);
        Assert.Equal(measured.Value, f.Measured!.Value, 6);
        Assert.Equal(limit, f.Limit);
        if (charged)
        {
            Close.Equal(4.0 / Mw.Palladium / (197.0 / Mw.EthylNitrobenzoate), o.Equivalents["PDC"], "Pd equiv");
        }
        else
        {
            Assert.Contains("PDC was not charged in step S1 (nitro reduction) although the master record requires 0.01 to 0.05 equiv", f.Message, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void Equivalents_out_of_range_of_a_reactant_of_the_equation()
    {
        // ENB itself limited to 0.9–0.95 equiv: it is the limiting reactant, so 1.00 equiv, above.
        var step = Hydrogenation.Step(equivalents: new() { ["ENB"] = new(0.9, 0.95) });
        var f = Assert.Single(Hydrogenation.Reconcile(Hydrogenation.Rows(), step).Flags);
        Assert.Equal((FlagCode.EquivalentsOutOfRange, "ENB", 0.95), (f.Code, f.Subject, f.Limit!.Value));
        Close.Equal(1.0, f.Measured, "equiv");
    }

    [Fact]
    public void Unit_conversion_of_non_kg_rows_is_in_the_kg_figures()
    {
        // RecordRow.QuantityKg comes from MassUnit.ToKilograms: 1.000 t = 1000 kg, 4000 g = 4 kg, 250 g = 0.25 kg.
        var batch = Hydrogenation.Rows().Build();
        Assert.Equal(1000.0, batch.Rows.Single(r => r.Entry == EntryKind.Charge && r.Material == "ETOH").QuantityKg);
        Assert.Equal(4.0, batch.Rows.Single(r => r.Material == "PDC").QuantityKg);
    }
}
