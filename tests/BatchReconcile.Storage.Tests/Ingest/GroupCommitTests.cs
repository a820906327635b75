using System.Data.Common;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Storage.Ingest;
using BatchReconcile.Storage.Tests.Support;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Tests.Ingest;

public sealed class GroupCommitTests
{
    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_failure_midway_through_one_file_rolls_back_only_that_file(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();

        // File 3's first batch is fine; its second carries a flag on a step the outcome does not
        // have, which the database refuses after the first batch was already written.
        var good = Build.Ingest(Build.Batch("BZ-301"), Build.Day1, Build.Flag("S1"));
        var broken = Build.Outcome(Build.Batch("BZ-302"));
        broken = broken with { Steps = [broken.Steps[0], broken.Steps[1] with { Flags = [Build.Flag("S9")] }] };
        var files = new[]
        {
            Build.File("f1.csv", Build.Ingest(Build.Batch("BZ-101"), Build.Day1, Build.Flag("S1"))),
            Build.File("f2.csv", Build.Ingest(Build.Batch("BZ-201"), Build.Day1)),
            Build.File("f3.csv", good, new BatchIngest(broken, Build.Day1)),
            Build.Quarantined("f4.csv", errors: 2),
            Build.File("f5.csv", Build.Ingest(Build.Batch("BZ-501"), Build.Day1, Build.Flag("S2"))),
        };

        var results = store.Commit(files);

        Assert.Equal(
            [IngestOutcome.Stored, IngestOutcome.Stored, null, IngestOutcome.Quarantined, IngestOutcome.Stored],
            results.Select(r => r.Outcome));
        var failed = results[2];
        Assert.False(failed.Committed);
        Assert.Contains("FOREIGN KEY", Assert.IsAssignableFrom<DbException>(failed.Failure).Message, StringComparison.OrdinalIgnoreCase);
        Assert.Empty(failed.Batches);

        Assert.False(store.IsKnown(Build.Sha("f3.csv")));
        Assert.Null(store.GetLatestBatch("BZ-301"));
        Assert.Null(store.GetLatestBatch("BZ-302"));
        foreach (var name in new[] { "f1.csv", "f2.csv", "f4.csv", "f5.csv" })
        {
            Assert.True(store.IsKnown(Build.Sha(name)), name);
        }

        Assert.Equal(["BZ-101", "BZ-201", "BZ-501"], store.ListBatches().Select(b => b.BatchId));
        Assert.Equal(3, Db.Count(store.Connection, "batch_revision"));
        Assert.Equal(6, Db.Count(store.Connection, "step_result"));
        Assert.Equal(2, Db.Count(store.Connection, "flag"));
        Assert.Equal(30, Db.RawLineCount(store.Connection));

        // Once the broken file is fixed and sent again, it goes in.
        var retry = Assert.Single(store.Commit([Build.File("f3.csv", good, Build.Ingest(Build.Batch("BZ-302"), Build.Day1))]));
        Assert.Equal(IngestOutcome.Stored, retry.Outcome);
    }

    [Theory]
    [InlineData(StoreProvider.Sqlite)] // SQLite only: it counts commits with SQLite's commit hook.
    public void A_group_of_many_files_is_one_transaction(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        var commits = 0;
        SQLitePCL.raw.sqlite3_commit_hook(((Microsoft.Data.Sqlite.SqliteConnection)store.Connection).Handle, _ =>
        {
            commits++;
            return 0;
        }, null);

        var files = Enumerable.Range(1, 40)
            .Select(i => Build.File($"g{i:000}.csv", Build.Ingest(Build.Batch($"BZ-{i:000}"), Build.Day1, Build.Flag("S1"))))
            .ToList();
        var results = store.Commit(files);

        Assert.Equal(1, commits);
        Assert.All(results, r => Assert.Equal(IngestOutcome.Stored, r.Outcome));
        Assert.Equal(40, store.ListBatches(Build.Day1).Count);
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Files_of_one_group_see_each_other_in_order(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();

        var results = store.Commit(
        [
            Build.File("first.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1"))),
            Build.File("fix.csv", Build.Ingest(Build.Batch("BZ-001", productKg: 97.0), Build.Day1)),
            Build.File("first.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1"))),
        ]);

        Assert.Equal([IngestOutcome.Stored, IngestOutcome.Revision, IngestOutcome.Duplicate], results.Select(r => r.Outcome));
        Assert.Equal(2, store.GetLatestBatch("BZ-001")?.Revision);
        Assert.Empty(store.ListFlags());
        Assert.Equal(FlagCode.YieldLow, Assert.Single(store.ListFlags(includeSuperseded: true)).Code);
    }
}
