using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Storage.Review;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Queries;

public sealed class QueryTests
{
    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Flags_of_one_day_come_most_severe_first_and_only_from_current_revisions(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        store.Commit(
        [
            Build.File("a.csv",
                Build.Ingest(Build.Batch("BZ-002"), Build.Day1, Build.Flag("S2", FlagCode.ProductInWaste, FlagSeverity.Minor)),
                Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1", FlagCode.YieldOverTheory, FlagSeverity.Critical), Build.Flag("S2"))),
            Build.File("b.csv", Build.Ingest(Build.Batch("BZ-003"), Build.Day2, Build.Flag("S1"))),
        ]);

        var day1 = store.ListFlags(Build.Day1);
        Assert.Equal(
            [("BZ-001", FlagCode.YieldOverTheory, FlagSeverity.Critical), ("BZ-001", FlagCode.YieldLow, FlagSeverity.Major), ("BZ-002", FlagCode.ProductInWaste, FlagSeverity.Minor)],
            day1.Select(f => (f.BatchId, f.Code, f.Severity)));
        Assert.All(day1, f => Assert.Equal((Build.Day1, "open", 1, true), (f.ProductionDay, f.State, f.Revision, f.IsCurrent)));
        Assert.Equal("BZ-003", Assert.Single(store.ListFlags(Build.Day2)).BatchId);
        Assert.Equal(4, store.ListFlags().Count);

        // A re-export that clears BZ-001's flags leaves day 1 with BZ-002's alone.
        store.Commit([Build.File("c.csv", Build.Ingest(Build.Batch("BZ-001", productKg: 99.0), Build.Day1))]);
        Assert.Equal(["BZ-002"], store.ListFlags(Build.Day1).Select(f => f.BatchId));

        var day2Flag = Assert.Single(store.ListFlags(Build.Day2)).Id;
        Assert.True(store.ReviewFlag(day2Flag, ReviewState.Closed, "A. Reviewer", "yield within the site's accepted range", CloseOutcome.Explained).Accepted);
        Assert.Empty(store.ListFlags(Build.Day2, unresolvedOnly: true));
        Assert.Single(store.ListFlags(Build.Day2));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Step_history_gives_the_last_n_current_results_oldest_first(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        for (var day = 1; day <= 6; day++)
        {
            var production = new DateOnly(2026, 11, day);
            store.Commit([Build.File($"d{day}.csv", Build.Ingest(Build.Batch($"BZ-{day:000}"), production))]);
        }

        // Day 6's batch is re-exported: its history point is revision 2, not both.
        store.Commit([Build.File("d6-fix.csv", Build.Ingest(Build.Batch("BZ-006", productKg: 91.0), new DateOnly(2026, 11, 6), Build.Flag("S1")))]);

        var history = store.StepHistory(Build.Recipe, "S1", 3);

        Assert.Equal([("BZ-004", 1, 0), ("BZ-005", 1, 0), ("BZ-006", 2, 1)], history.Select(p => (p.BatchId, p.Revision, p.FlagCount)));
        Assert.Equal([new DateOnly(2026, 11, 4), new DateOnly(2026, 11, 5), new DateOnly(2026, 11, 6)], history.Select(p => p.ProductionDay));
        Assert.All(history, p => Assert.Equal(94.04, p.YieldPct));
        Assert.Empty(store.StepHistory(Build.Recipe, "S7", 3));
        Assert.Empty(store.StepHistory("OTHER-1", "S1", 3));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Counts_of_a_day_and_the_batch_list_cover_current_revisions(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        store.Commit(
        [
            Build.File("a.csv",
                Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1", FlagCode.BalanceSurplus, FlagSeverity.Critical), Build.Flag("S2")),
                Build.Ingest(Build.Batch("BZ-002"), Build.Day1, Build.Flag("S2", FlagCode.EquivalentsOutOfRange, FlagSeverity.Minor))),
            Build.File("b.csv", Build.Ingest(Build.Batch("BZ-001", productKg: 90.0), Build.Day1, Build.Flag("S1"))),
            Build.File("c.csv", Build.Ingest(Build.Batch("BZ-003"), Build.Day2)),
        ]);

        Assert.Equal(new Storage.Queries.DayCounts(Build.Day1, 2, 0, 1, 1, 2, 4), store.CountsByDay(Build.Day1));
        Assert.Equal(new Storage.Queries.DayCounts(Build.Day2, 1, 0, 0, 0, 0, 2), store.CountsByDay(Build.Day2));
        Assert.Equal(
            [("BZ-001", 2, 1), ("BZ-002", 1, 1), ("BZ-003", 1, 0)],
            store.ListBatches().Select(b => (b.BatchId, b.Revision, b.FlagCount)));
        Assert.Equal(["BZ-003"], store.ListBatches(Build.Day2).Select(b => b.BatchId));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void An_unknown_batch_or_revision_is_null(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1))]);

        Assert.Null(store.GetLatestBatch("BZ-404"));
        Assert.Null(store.GetBatch("BZ-001", 2));
        Assert.Empty(store.GetRawRows("BZ-001", 2));
        Assert.NotNull(store.GetBatch("BZ-001", 1));
    }
}
