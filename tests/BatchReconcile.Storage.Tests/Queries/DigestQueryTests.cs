using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Storage.Ingest;
using BatchReconcile.Storage.Review;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Queries;

/// <summary>The questions the daily digest asks of the store.</summary>
public sealed class DigestQueryTests
{
    private static readonly DateOnly Nov20 = new(2026, 11, 20);
    private static readonly DateOnly Nov21 = new(2026, 11, 21);
    private static readonly DateOnly Nov22 = new(2026, 11, 22);

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Unresolved_flags_of_earlier_days_leave_out_closed_superseded_and_the_day_itself(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        store.Commit(
        [
            Build.File("d20.csv",
                Build.Ingest(Build.Batch("BZ-020"), Nov20, Build.Flag("S1"), Build.Flag("S2", FlagCode.BalanceGap, FlagSeverity.Critical)),
                Build.Ingest(Build.Batch("BZ-021"), Nov20, Build.Flag("S1", FlagCode.YieldHigh, FlagSeverity.Minor))),
            Build.File("d21.csv", Build.Ingest(Build.Batch("BZ-030"), Nov21, Build.Flag("S1"))),
            Build.File("d22.csv", Build.Ingest(Build.Batch("BZ-040"), Nov22, Build.Flag("S1"))),
        ]);
        var flags = store.ListFlags();
        var yieldLow20 = flags.Single(f => f.BatchId == "BZ-020" && f.Code == FlagCode.YieldLow).Id;
        Assert.True(store.ReviewFlag(yieldLow20, ReviewState.InReview, "A. Chen", "looking").Accepted);
        Assert.True(store.ReviewFlag(flags.Single(f => f.BatchId == "BZ-030").Id, ReviewState.Closed, "A. Chen", "explained", CloseOutcome.Explained).Accepted);
        // BZ-021 is re-exported clean: its flag is closed as superseded and the new revision has none.
        store.Commit([Build.File("d20-fix.csv", Build.Ingest(Build.Batch("BZ-021", productKg: 96.0), Nov20))]);

        var unresolved = store.UnresolvedFlagsBefore(Nov22);

        Assert.Equal(
            [("BZ-020", FlagCode.BalanceGap, ReviewState.Open), ("BZ-020", FlagCode.YieldLow, ReviewState.InReview)],
            unresolved.Select(f => (f.BatchId, f.Code, f.Review.State)));
        Assert.All(unresolved, f => Assert.Equal((Nov20, Build.Recipe), (f.ProductionDay, f.Recipe)));
        Assert.Equal(3, store.UnresolvedFlagsBefore(new DateOnly(2026, 11, 23)).Count);
        Assert.Empty(store.UnresolvedFlagsBefore(Nov20));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Flagged_steps_of_a_day_carry_their_figures_ladder_and_flags_with_review(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        store.Commit(
        [
            Build.File("a.csv",
                Build.Ingest(Build.Batch("BZ-002"), Nov21, Build.Flag("S2", FlagCode.BalanceGap, FlagSeverity.Critical, 6.1, 2.0, "kg"), Build.Flag("S2")),
                Build.Ingest(Build.Batch("BZ-001"), Nov21, Build.Flag("S1")),
                Build.Ingest(Build.Batch("BZ-003"), Nov21),
                Build.Ingest(Build.Batch("BZ-009"), Nov22, Build.Flag("S1"))),
        ]);
        // BZ-001 is re-exported with the flag moved to S2: only the current revision's step counts.
        store.Commit([Build.File("b.csv", Build.Ingest(Build.Batch("BZ-001", productKg: 93.0), Nov21, Build.Flag("S2", FlagCode.ProductInWaste, FlagSeverity.Minor)))]);

        var steps = store.FlaggedStepsOfDay(Nov21);

        Assert.Equal([("BZ-001", 2, "S2", 1), ("BZ-002", 1, "S2", 2)], steps.Select(s => (s.BatchId, s.Revision, s.Step.Outcome.Step, s.Step.Flags.Count)));
        var gap = steps[1].Step;
        var expected = Build.Step("S2", 77.0, []);
        Assert.Equal(
            (expected.MassInKg, expected.MassOutKg, expected.VentedKg, expected.GapKg, expected.ClosurePct, expected.CombinedUncertaintyKg),
            (gap.Outcome.MassInKg, gap.Outcome.MassOutKg, gap.Outcome.VentedKg, gap.Outcome.GapKg, gap.Outcome.ClosurePct, gap.Outcome.CombinedUncertaintyKg));
        Assert.Equal(expected.Ladder, gap.Outcome.Ladder);
        Assert.Equal([FlagCode.BalanceGap, FlagCode.YieldLow], gap.Flags.Select(f => f.Flag.Code));
        Assert.Equal(gap.Flags.Select(f => f.Flag), gap.Outcome.Flags);
        Assert.All(gap.Flags, f => Assert.Equal(FlagReview.Unreviewed, f.Review));
        Assert.All(steps, s => Assert.Equal((Build.Recipe, 1, Nov21), (s.Recipe, s.RecipeVersion, s.ProductionDay)));
        Assert.Empty(store.FlaggedStepsOfDay(Nov20));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Counts_of_a_day_include_the_steps_reconciled_and_recipe_steps_of_the_day_are_listed(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        var noRowsForS2 = new BatchOutcome(Build.Batch("BZ-002"), [Build.Step("S1", 10.0, []), Build.Step("S2", 20.0, [], nulls: true)], null);
        store.Commit(
        [
            Build.File("a.csv", Build.Ingest(Build.Batch("BZ-001"), Nov21, Build.Flag("S1")), new BatchIngest(noRowsForS2, Nov21)),
            Build.File("b.csv", Build.Ingest(Build.Batch("BZ-003"), Nov22)),
        ]);

        // Steps with rows only: BZ-001 S1 and S2, BZ-002 S1 (its S2 has no rows and is not reconciled).
        Assert.Equal(new Storage.Queries.DayCounts(Nov21, 2, 0, 1, 0, 1, 3), store.CountsByDay(Nov21));
        Assert.Equal([new Storage.Queries.RecipeStepKey(Build.Recipe, "S1"), new Storage.Queries.RecipeStepKey(Build.Recipe, "S2")], store.RecipeStepsOfDay(Nov21));
        Assert.Empty(store.RecipeStepsOfDay(Nov20));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Step_history_up_to_a_day_takes_the_last_n_batches_of_that_day_and_before(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        for (var day = 1; day <= 8; day++)
        {
            store.Commit([Build.File($"d{day}.csv", Build.Ingest(Build.Batch($"BZ-{day:000}"), new DateOnly(2026, 11, day)))]);
        }

        var history = store.StepHistory(Build.Recipe, "S1", 3, new DateOnly(2026, 11, 5));

        Assert.Equal(["BZ-003", "BZ-004", "BZ-005"], history.Select(p => p.BatchId));
        Assert.Equal(new DateOnly(2026, 11, 5), history[^1].ProductionDay);
        Assert.Equal(5, store.StepHistory(Build.Recipe, "S1", 30, new DateOnly(2026, 11, 5)).Count);
        Assert.Equal("BZ-008", store.StepHistory(Build.Recipe, "S1", 3)[^1].BatchId);
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void The_flag_list_carries_the_review_and_the_recipe(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        var clock = new FixedTime(new DateTimeOffset(2026, 11, 26, 9, 12, 0, TimeSpan.Zero));
        using var store = db.Open(time: clock);
        store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("BZ-001"), Nov21, Build.Flag("S1"), Build.Flag("S2")))]);
        var ids = store.ListFlags().Select(f => f.Id).ToList();
        store.ReviewFlag(ids[0], ReviewState.Closed, "A. Chen", "known sampling loss", CloseOutcome.Explained);

        var all = store.ListFlags(Nov21);
        Assert.Equal(["closed", "open"], all.Select(f => f.State));
        Assert.Equal(new FlagReview(ReviewState.Closed, CloseOutcome.Explained, "known sampling loss", null, "A. Chen", clock.Now), all[0].Review);
        Assert.All(all, f => Assert.Equal(Build.Recipe, f.Recipe));
        Assert.Equal([ids[1]], store.ListFlags(Nov21, unresolvedOnly: true).Select(f => f.Id));
    }
}
