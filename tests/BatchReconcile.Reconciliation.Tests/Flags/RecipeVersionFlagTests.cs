using BatchReconcile.Reconciliation.Settings;
using BatchReconcile.Reconciliation.Tests.Support;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Tests.Flags;

/// <summary>recipe-version-unstated: raised when neither the export nor an effective date chose the version (docs/computation.md).</summary>
public class RecipeVersionFlagTests
{
    public static TheoryData<RecipeVersionSource, bool> Sources => new()
    {
        { RecipeVersionSource.Export, false },
        { RecipeVersionSource.EffectiveDate, false },
        { RecipeVersionSource.Newest, true },
    };

    [Theory]
    [MemberData(nameof(Sources))]
    public void Only_a_batch_whose_version_nothing_decided_is_flagged(RecipeVersionSource source, bool flagged)
    {
        var batch = Hydrogenation.Rows().Build() with { RecipeVersionSource = source, FirstRecordedDate = new DateOnly(2026, 11, 24) };

        var outcome = BatchReconciler.Reconcile(batch, Plant.Recipe(Hydrogenation.RecipeCode, Hydrogenation.Step()), Hydrogenation.Catalog, new ReconciliationSettings());

        var flags = outcome.Flags.Where(f => f.Code == FlagCode.RecipeVersionUnstated).ToList();
        Assert.Equal(flagged ? 1 : 0, flags.Count);
        if (flagged)
        {
            var flag = flags[0];
            Assert.Equal((FlagSeverity.Major, Hydrogenation.S), (flag.Severity, flag.Step));
            Assert.Contains("reconciled against the newest version, ENR-100 v1", flag.Message, StringComparison.Ordinal);
            Assert.Contains("no version of recipe ENR-100 has an effectiveFrom date", flag.Message, StringComparison.Ordinal);
            Assert.Equal("recipe-version-unstated", flag.Code.ToText());
        }
    }

    [Fact]
    public void The_flag_goes_with_the_first_step_and_its_severity_is_the_sites_to_set()
    {
        var batch = Hydrogenation.Rows().Build() with { RecipeVersionSource = RecipeVersionSource.Newest, FirstRecordedDate = null };
        var settings = new ReconciliationSettings { Severities = new(StringComparer.OrdinalIgnoreCase) { ["recipe-version-unstated"] = "critical" } };
        var second = Plant.Step("S2", "second", Plant.Reaction([(1, "ENB"), (3, "H2")], [(1, "BZC"), (2, "WATER")]), "BZC", 88, 98, 2.0);

        var outcome = BatchReconciler.Reconcile(batch, Plant.Recipe(Hydrogenation.RecipeCode, Hydrogenation.Step(), second), Hydrogenation.Catalog, settings);

        var flag = Assert.Single(outcome.Flags, f => f.Code == FlagCode.RecipeVersionUnstated);
        Assert.Equal((FlagSeverity.Critical, "S1"), (flag.Severity, flag.Step));
        Assert.Contains("none of its rows has a recorded_at", flag.Message, StringComparison.Ordinal);
        Assert.DoesNotContain(outcome.Steps[1].Flags, f => f.Code == FlagCode.RecipeVersionUnstated);
    }

    [Fact]
    public void The_limits_that_decided_the_flags_are_kept_with_the_step()
    {
        var settings = new ReconciliationSettings { CoverageFactor = 3.0, ProductInWasteMaxPct = 1.5 };

        var step = Hydrogenation.Reconcile(Hydrogenation.Rows(), settings: settings);

        var l = step.Limits;
        Assert.Equal((88.0, 98.0, 2.0, 3.0, 1.5), (l.YieldMinPct!.Value, l.YieldMaxPct!.Value, l.BalanceTolerancePct!.Value, l.CoverageFactor!.Value, l.ProductInWasteMaxPct!.Value));
        Assert.Equal(3.0 * step.CombinedUncertaintyKg, l.ExpandedUncertaintyKg!.Value, 1e-12);
        Assert.Equal(new ValueRange(3.0, 3.6), l.EquivalentsRanges!["H2"]);
    }
}
