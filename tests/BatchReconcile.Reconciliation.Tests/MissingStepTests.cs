using BatchReconcile.Reconciliation.Settings;
using BatchReconcile.Reconciliation.Tests.Support;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Tests;

/// <summary>Two-step benzocaine recipe; a batch that exports only step 2.</summary>
public class MissingStepTests
{
    private static readonly ProcessCatalog Catalog = new(
        [
            Plant.M("NBA", "4-nitrobenzoic acid", "C7H5NO4"),
            Plant.M("ETOH", "ethanol", "C2H6O", MaterialRole.Solvent),
            Plant.M("ENB", "ethyl 4-nitrobenzoate", "C9H9NO4"),
            Plant.M("WATER", "water", "H2O", MaterialRole.Water),
            Plant.M("H2", "hydrogen", "H2"),
            Plant.M("PDC", "palladium on carbon", "Pd", MaterialRole.Catalyst),
            Plant.M("BZC", "benzocaine", "C9H11NO2"),
        ],
        []);

    private static readonly Recipe Recipe = Plant.Recipe(
        "BZC-410",
        Plant.Step("S1", "esterification", Plant.Reaction([(1, "NBA"), (1, "ETOH")], [(1, "ENB"), (1, "WATER")]), "ENB", 85, 96, 2.0),
        Plant.Step("S2", "nitro reduction", Plant.Reaction([(1, "ENB"), (3, "H2")], [(1, "BZC"), (2, "WATER")]), "BZC", 88, 98, 2.0));

    private static readonly DateTimeOffset Late = new(2026, 11, 25, 5, 40, 0, TimeSpan.FromHours(1));

    private static BatchRecord OnlyStep2() => new BatchBuilder("BZC-2611-007", "BZC-410")
        .Charge("S2", "enb", 200.0, MassUnit.Kilogram, 98.5)   // codes as typed: matched case-insensitively
        .Charge("S2", "H2", 6.5, MassUnit.Kilogram)
        .Charge("S2", "ETOH", 1000.0, MassUnit.Kilogram)
        .Product("S2", "BZC", 150.0, MassUnit.Kilogram, 99.2, at: new DateTimeOffset(2026, 11, 24, 22, 0, 0, TimeSpan.FromHours(1)))
        .Waste("S2", "mother liquor", 1055.0, MassUnit.Kilogram, at: Late)
        .Build();

    [Fact]
    public void Missing_step_is_reported_in_recipe_order_with_its_own_flag_only()
    {
        var outcome = BatchReconciler.Reconcile(OnlyStep2(), Recipe, Catalog, new ReconciliationSettings());
        Assert.Equal(["S1", "S2"], outcome.Steps.Select(s => s.Step));

        var s1 = outcome.Steps[0];
        Assert.False(s1.HasRows);
        var flag = Assert.Single(s1.Flags);
        Assert.Equal((FlagCode.StepMissing, FlagSeverity.Major, "S1"), (flag.Code, flag.Severity, flag.Step));
        Assert.Equal("Step S1 (esterification) has no rows in the export of batch BZC-2611-007; confirm whether the step was run and, if it was, obtain a complete re-export.", flag.Message);
        Assert.Null(flag.Measured);
        Assert.Equal(0.0, s1.MassInKg);
        Assert.Equal(0.0, s1.ActualKg);
        Assert.Null(s1.YieldPct);
        Assert.Null(s1.Pmi);
        Assert.Empty(s1.Ladder);
        Assert.Empty(s1.Equivalents);

        // AE is a property of the equation: 195.174 / (167.120 + 46.069) = 91.549 %.
        Close.Equal(100 * Mw.EthylNitrobenzoate / (Mw.NitrobenzoicAcid + Mw.Ethanol), s1.AtomEconomyPct, "AE");

        var s2 = outcome.Steps[1];
        Assert.True(s2.HasRows);
        Assert.Equal("ENB", s2.LimitingReactant);
        Close.Equal(100 * 148.8 / (197.0 / Mw.EthylNitrobenzoate * Mw.Benzocaine), s2.YieldPct, "S2 yield");
        Assert.DoesNotContain(s2.Flags, f => f.Code == FlagCode.StepMissing);
        Assert.Equal([flag], outcome.Flags.Where(f => f.Step == "S1"));
    }

    [Fact]
    public void Last_output_time_is_the_latest_recorded_output_row()
    {
        var outcome = BatchReconciler.Reconcile(OnlyStep2(), Recipe, Catalog, new ReconciliationSettings());
        Assert.Equal(Late, outcome.LastOutputAt);
    }

    [Fact]
    public void A_batch_of_another_recipe_is_a_caller_bug()
    {
        var other = Plant.Recipe("ENR-100", Recipe.Steps[1]);
        Assert.Throws<ArgumentException>(() => BatchReconciler.Reconcile(OnlyStep2(), other, Catalog, new ReconciliationSettings()));
    }
}
