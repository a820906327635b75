using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Storage.Ingest;
using BatchReconcile.Storage.Queries;
using BatchReconcile.Storage.Review;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Queries;

/// <summary>Lists of batches, one flag with its history, the audit trail, and a recipe's steps in production order.</summary>
public sealed class AcrossBatchesQueryTests
{
    private static readonly DateOnly Nov1 = new(2026, 11, 1);
    private static readonly DateOnly Nov2 = new(2026, 11, 2);
    private static readonly DateOnly Nov3 = new(2026, 11, 3);

    private static BatchIngest At(string batch, DateOnly day, DateTimeOffset? lastOutput, int version = 1, double yieldS1 = 90.0, double productKg = 95.0, params Flag[] flags)
    {
        var outcome = Build.Outcome(Build.Batch(batch, productKg, recipeVersion: version), flags);
        var steps = outcome.Steps.Select(s => s.Step == "S1" ? s with { YieldPct = yieldS1, Equivalents = new Dictionary<string, double> { ["ETOH"] = yieldS1 / 10 } } : s).ToList();
        return new BatchIngest(outcome with { Steps = steps, LastOutputAt = lastOutput, Route = new RouteYield(yieldS1 - 20, 100.0, null) }, day);
    }

    private static DateTimeOffset T(int day, int hour) => new(2026, 11, day, hour, 0, 0, TimeSpan.Zero);

    /// <summary>Six batches over three days; on Nov 2 two share their output time and one has none; one is re-exported.</summary>
    private static BatchStore Filled(TempDatabase db)
    {
        var store = db.Open();
        store.Commit(
        [
            Build.File("a.csv",
                At("B-20", Nov2, T(2, 9), yieldS1: 82.0),
                At("B-10", Nov1, T(1, 15), yieldS1: 81.0, flags: Build.Flag("S1")),
                At("B-22", Nov2, T(2, 7), version: 2, yieldS1: 83.0),
                At("B-21", Nov2, T(2, 7), version: 2, yieldS1: 84.0),
                At("B-23", Nov2, null, yieldS1: 85.0),
                At("B-30", Nov3, T(3, 6), version: 2, yieldS1: 86.0, flags: Build.Flag("S2"))),
        ]);
        // B-10 is re-exported with other figures: only revision 2 counts.
        store.Commit([Build.File("b.csv", At("B-10", Nov1, T(1, 16), yieldS1: 87.5, productKg: 96.0, flags: Build.Flag("S1")))]);
        return store;
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Step_series_is_in_production_order_of_current_revisions_with_days_and_version_filters(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = Filled(db);

        var all = store.StepSeries(Build.Recipe, "S1", StepMeasure.Yield);

        // Day, then last output (unknown first), then batch id for B-21/B-22 at the same time.
        Assert.Equal(
            [("B-10", 2, 87.5), ("B-23", 1, 85.0), ("B-21", 1, 84.0), ("B-22", 1, 83.0), ("B-20", 1, 82.0), ("B-30", 1, 86.0)],
            all.Select(p => (p.BatchId, p.Revision, p.Value!.Value)));
        // B-10 carries a flag on S1; B-30 carries its flag on S2, not here.
        Assert.Equal([1, 0, 0, 0, 0, 0], all.Select(p => p.OpenFlags));
        Assert.Equal([0, 0, 0, 0, 0, 1], store.StepSeries(Build.Recipe, "S2", StepMeasure.Yield).Select(p => p.OpenFlags));
        Assert.Equal(["B-21", "B-22", "B-30"], store.StepSeries(Build.Recipe, "S1", StepMeasure.Yield, version: 2).Select(p => p.BatchId));
        Assert.Equal(["B-23", "B-21", "B-22", "B-20"], store.StepSeries(Build.Recipe, "S1", StepMeasure.Yield, Nov2, Nov2).Select(p => p.BatchId));
        Assert.Equal(["B-30"], store.StepSeries(Build.Recipe, "S1", StepMeasure.Yield, from: Nov3).Select(p => p.BatchId));
        Assert.Empty(store.StepSeries(Build.Recipe, "S9", StepMeasure.Yield));
        Assert.Empty(store.StepSeries("NO-SUCH", "S1", StepMeasure.Yield));
    }

    public static TheoryData<string, double?> Measures() => new()
    {
        // Build.Step gives S2 of every batch figures seed 77 + an offset per column.
        { "yield", 77.04 },
        { "closure", 77.21 },
        { "rme", 77.07 },
        { "pmi", 77.10 },
        { "complete-e-factor", 77.11 },
        { "simple-e-factor", 77.12 },
        { "gap", -77.20 },
        { "equivalents:ETOH", 77.23 },
        { "equivalents:NONE", null },
    };

    [Theory]
    [MemberData(nameof(Measures))]
    public void Each_measure_reads_its_own_stored_figure(string text, double? expected)
    {
        using var db = new TempDatabase();
        using var store = Filled(db);
        Assert.True(StepMeasure.TryParse(text, out var measure));
        Assert.Equal(text, measure.ToText());

        var values = store.StepSeries(Build.Recipe, "S2", measure).Select(p => p.Value).Distinct().ToList();

        Assert.Equal(expected, Assert.Single(values));
    }

    [Theory]
    [InlineData("")]
    [InlineData("equivalents:")]
    [InlineData("mass")]
    public void Text_that_is_no_measure_is_refused(string text) => Assert.False(StepMeasure.TryParse(text, out _));

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Steps_of_a_recipe_come_per_batch_in_production_then_step_order_with_route_yield_and_flags(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = Filled(db);

        var rows = store.StepsOfRecipe(Build.Recipe);

        Assert.Equal(
            ["B-10/S1", "B-10/S2", "B-23/S1", "B-23/S2", "B-21/S1", "B-21/S2", "B-22/S1", "B-22/S2", "B-20/S1", "B-20/S2", "B-30/S1", "B-30/S2"],
            rows.Select(r => r.BatchId + "/" + r.Outcome.Step));
        var b10 = rows[0];
        Assert.Equal((2, 1, Nov1, 1, 1, 67.5), (b10.Revision, b10.RecipeVersion, b10.Day, b10.OpenFlags, b10.FlagCount, b10.Route.YieldPct!.Value));
        Assert.Equal(87.5, b10.Outcome.YieldPct);
        // Every figure comes back, the JSON-held ones included; the limits as stored.
        var s2 = rows[1].Outcome;
        var expected = Build.Step("S2", 77.0, []);
        Assert.Equal(expected with { Flags = s2.Flags, Equivalents = s2.Equivalents, Ladder = s2.Ladder, Limits = s2.Limits }, s2);
        Assert.Equal(expected.Ladder, s2.Ladder);
        Assert.Equal(expected.Equivalents, s2.Equivalents);
        Assert.Equal(expected.Limits.EquivalentsRanges, s2.Limits.EquivalentsRanges);
        Assert.Equal(expected.Limits with { EquivalentsRanges = null }, s2.Limits with { EquivalentsRanges = null });
        Assert.Equal(["B-21", "B-22", "B-30"], store.StepsOfRecipe(Build.Recipe, version: 2).Select(r => r.BatchId).Distinct());
        Assert.Equal(["B-30"], store.StepsOfRecipe(Build.Recipe, Nov3, Nov3).Select(r => r.BatchId).Distinct());
        Assert.Empty(store.StepsOfRecipe("NO-SUCH"));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Figures_only_leaves_the_json_held_figures_out_and_the_rest_alike(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = Filled(db);

        var all = store.StepsOfRecipe(Build.Recipe);
        var figures = store.StepsOfRecipe(Build.Recipe, parts: StepParts.Figures);

        Assert.Equal(all.Count, figures.Count);
        Assert.All(figures, r => Assert.Empty(r.Outcome.Ladder));
        Assert.All(figures, r => Assert.Empty(r.Outcome.Equivalents));
        Assert.All(figures, r => Assert.Null(r.Outcome.Limits.EquivalentsRanges));
        Assert.Equal(
            all.Select(r => (r.BatchId, r.Outcome.YieldPct, r.Outcome.Pmi, r.Outcome.MassInKg, r.Outcome.Limits.YieldMinPct)),
            figures.Select(r => (r.BatchId, r.Outcome.YieldPct, r.Outcome.Pmi, r.Outcome.MassInKg, r.Outcome.Limits.YieldMinPct)));
        Assert.All(store.StepsOfRecipe(Build.Recipe, parts: StepParts.Ladder), r => Assert.Equal(2, r.Outcome.Ladder.Count));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Batches_list_filters_by_days_recipe_and_open_flags_in_production_order(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = Filled(db);

        var all = store.ListBatches(BatchFilter.All);
        Assert.Equal(["B-10", "B-23", "B-21", "B-22", "B-20", "B-30"], all.Select(b => b.BatchId));
        var b10 = all[0];
        Assert.Equal((2, 1, 1, 2, 67.5), (b10.Revision, b10.FlagCount, b10.OpenFlagCount, b10.StepCount, b10.RouteYieldPct!.Value));

        Assert.Equal(["B-10", "B-30"], store.ListBatches(new BatchFilter(FlaggedOnly: true)).Select(b => b.BatchId));
        Assert.Equal(["B-23", "B-21", "B-22", "B-20"], store.ListBatches(new BatchFilter(Nov2, Nov2, Build.Recipe)).Select(b => b.BatchId));
        Assert.Empty(store.ListBatches(new BatchFilter(Recipe: "NO-SUCH")));

        // A closed flag no longer counts as open.
        var flag = store.ListFlags().Single(f => f.BatchId == "B-30").Id;
        store.ReviewFlag(flag, ReviewState.Closed, "A. Chen", "checked", CloseOutcome.Explained);
        Assert.Equal(["B-10"], store.ListBatches(new BatchFilter(FlaggedOnly: true)).Select(b => b.BatchId));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_flag_comes_with_its_step_limits_revision_and_review_history(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = Filled(db);
        var old = store.ListFlags(includeSuperseded: true).Single(f => f.BatchId == "B-10" && f.Revision == 1).Id;
        var current = store.ListFlags().Single(f => f.BatchId == "B-10").Id;
        store.ReviewFlag(current, ReviewState.InReview, "A. Chen", "looking at the drum weights");

        var detail = store.GetFlag(current)!;

        Assert.Equal(("B-10", 2, Build.Recipe, 1, Nov1, (int?)null), (detail.BatchId, detail.Revision, detail.Recipe, detail.RecipeVersion, detail.ProductionDay, detail.SupersededByRevision));
        Assert.Equal(FlagCode.YieldLow, detail.Flag.Flag.Code);
        Assert.Equal(("S1", 87.5, 94.26), (detail.Step.Outcome.Step, detail.Step.Outcome.YieldPct!.Value, detail.Step.Outcome.Limits.YieldMinPct!.Value));
        Assert.Equal([current], detail.Step.Flags.Select(f => f.Id));
        var entry = Assert.Single(detail.History);
        Assert.Equal(("flag.review", "A. Chen", "open", "in-review"), (entry.Kind, entry.Actor, entry.FromState, entry.ToState));

        // The superseded revision's flag: closed by the system when revision 2 arrived.
        var superseded = store.GetFlag(old)!;
        Assert.Equal((1, (int?)2, false), (superseded.Revision, superseded.SupersededByRevision, superseded.Flag.IsCurrent));
        Assert.Equal(("system", "closed"), (Assert.Single(superseded.History).Actor, superseded.History[0].ToState));
        Assert.Null(store.GetFlag(9999));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Audit_entries_filter_by_time_and_kind_or_family_of_kinds(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        var clock = new FixedTime(new DateTimeOffset(2026, 11, 24, 8, 0, 0, TimeSpan.Zero));
        using var store = db.Open(time: clock);
        store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("AU-1"), Build.Day1, Build.Flag("S1")))]);
        clock.Now = clock.Now.AddHours(2);
        store.Commit([Build.File("b.csv", Build.Ingest(Build.Batch("AU-1", productKg: 99.0), Build.Day1))]);

        var all = store.ListAudit(new AuditFilter());
        Assert.Equal(["ingest.stored", "batch.revision", "flag.review", "ingest.revision"], all.Select(e => e.Kind));
        Assert.Equal(["batch.revision", "flag.review", "ingest.revision"], store.ListAudit(new AuditFilter(From: clock.Now)).Select(e => e.Kind));
        Assert.Equal(["ingest.stored"], store.ListAudit(new AuditFilter(To: clock.Now)).Select(e => e.Kind));
        Assert.Equal(["ingest.stored", "ingest.revision"], store.ListAudit(new AuditFilter(Kind: "ingest")).Select(e => e.Kind));
        Assert.Equal(["flag.review"], store.ListAudit(new AuditFilter(Kind: "flag.review")).Select(e => e.Kind));
        Assert.Empty(store.ListAudit(new AuditFilter(Kind: "flag.rev")));
        Assert.Equal(["batch.revision", "flag.review", "ingest.revision", "ingest.stored"], store.AuditKinds());
        Assert.Equal(all[1], store.GetAuditEntry(all[1].Id));
        Assert.Null(store.GetAuditEntry(999));
    }
}
