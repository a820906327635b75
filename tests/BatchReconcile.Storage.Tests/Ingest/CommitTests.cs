using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Storage.Ingest;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Ingest;

public sealed class CommitTests
{
    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_file_stores_its_batches_raw_rows_every_step_figure_and_flags(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        var first = Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1"), Build.Flag("S2", FlagCode.EquivalentsOutOfRange, FlagSeverity.Minor, 1.42, 1.2, "equiv", "H2"));
        var nullSteps = new BatchOutcome(
            Build.Batch("BZ-002"),
            [Build.Step("S1", 10.0, [Build.Flag("S1", FlagCode.ReactantMissing, FlagSeverity.Critical, null, null, "", "NBA")], nulls: true), Build.Step("S2", 20.0, [])],
            null);
        var second = new BatchIngest(nullSteps, Build.Day2);

        var result = Assert.Single(store.Commit([Build.File("day1.csv", first, second)]));

        Assert.True(result.Committed);
        Assert.Equal(IngestOutcome.Stored, result.Outcome);
        Assert.Equal(["BZ-001", "BZ-002"], result.Batches.Select(b => b.BatchId));
        Assert.All(result.Batches, b => Assert.Equal((BatchDisposition.New, 1), (b.Disposition, b.Revision)));
        Assert.True(store.IsKnown(Build.Sha("day1.csv")));

        foreach (var (ingest, committed) in new[] { first, second }.Zip(result.Batches))
        {
            var view = store.GetLatestBatch(ingest.BatchId);
            Assert.NotNull(view);
            Assert.Equal((1, 1, Build.Recipe, 1, ingest.ProductionDay), (view.Revision, view.RevisionCount, view.Recipe, view.RecipeVersion, view.ProductionDay));
            Assert.Equal(ingest.Outcome.LastOutputAt, view.LastOutputAt);
            Assert.Equal(("day1.csv", Build.Sha("day1.csv")), (view.SourceFile, view.SourceSha256));
            Assert.Equal(BatchContentHash.Compute(ingest.Outcome.Batch), view.ContentSha256);
            Assert.True(view.IsCurrent);
            Assert.Equal(ingest.Outcome.Steps.Count, view.Steps.Count);
            foreach (var (expected, stored) in ingest.Outcome.Steps.Zip(view.Steps))
            {
                AssertSameStep(expected, stored.Outcome);
                Assert.All(stored.Flags, f => Assert.Equal(("open", ingest.ProductionDay, true), (f.State, f.ProductionDay, f.IsCurrent)));
            }

            Assert.Equal(committed.FlagIds, view.Flags.Select(f => f.Id));
            Assert.Equal(ingest.Outcome.Flags, view.Flags.Select(f => f.Flag));

            var raw = store.GetRawRows(ingest.BatchId);
            Assert.Equal(ingest.Outcome.Batch.Rows.Select(r => r.Line), raw.Select(r => r.Line));
            Assert.Equal(ingest.Outcome.Batch.Rows.Select(r => r.Raw), raw.Select(r => r.Fields));
        }

        Assert.Equal(3, result.Batches.SelectMany(b => b.FlagIds).Distinct().Count());
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_file_with_the_same_sha256_is_a_duplicate_and_stores_nothing_more(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1")))]);

        var plan = store.Classify(Build.Sha("a.csv"), [Build.Batch("BZ-001")]);
        Assert.True(plan.IsDuplicate);
        Assert.Equal(IngestOutcome.Stored, plan.KnownAs?.Outcome);

        // Same bytes under another name: the hash decides.
        var again = FileIngest.Accepted("a (copy).csv", Build.Sha("a.csv").ToUpperInvariant(), Build.ReceivedAt, [Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1"))]);
        var result = Assert.Single(store.Commit([again]));

        Assert.Equal(IngestOutcome.Duplicate, result.Outcome);
        Assert.Empty(result.Batches);
        Assert.Equal(1, Db.Count(store.Connection, "batch_revision"));
        Assert.Equal(1, Db.Count(store.Connection, "flag"));
        Assert.Equal(2, Db.Count(store.Connection, "ingest_log"));
        Assert.Equal(IngestOutcome.Stored, store.FindFile(Build.Sha("a.csv"))?.Outcome);
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_changed_batch_becomes_revision_two_and_revision_one_is_kept_superseded_with_its_flags(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        var first = Assert.Single(store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1")))]));
        var oldFlagId = first.Batches.Single().FlagIds.Single();

        var corrected = Build.Batch("BZ-001", productKg: 96.5);
        var plan = store.Classify(Build.Sha("b.csv"), [corrected]);
        Assert.Equal((BatchDisposition.Revision, 2), (plan.Batches.Single().Disposition, plan.Batches.Single().Revision));

        var second = Assert.Single(store.Commit([Build.File("b.csv", Build.Ingest(corrected, Build.Day2, Build.Flag("S2", FlagCode.BalanceGap, measured: 6.1, limit: 2.0, unit: "kg")))]));

        Assert.Equal(IngestOutcome.Revision, second.Outcome);
        var batch = second.Batches.Single();
        Assert.Equal((BatchDisposition.Revision, 2), (batch.Disposition, batch.Revision));

        var latest = store.GetLatestBatch("BZ-001");
        Assert.NotNull(latest);
        Assert.Equal((2, 2, Build.Day2, "b.csv"), (latest.Revision, latest.RevisionCount, latest.ProductionDay, latest.SourceFile));
        Assert.Equal(batch.FlagIds, latest.Flags.Select(f => f.Id));

        var old = store.GetBatch("BZ-001", 1);
        Assert.NotNull(old);
        Assert.False(old.IsCurrent);
        Assert.Equal(2, old.SupersededByRevision);
        Assert.Equal(Build.ProcessedAt, old.SupersededAt);
        var oldFlag = Assert.Single(old.Flags);
        // An open flag of the replaced revision is closed by the system (see ReviewTests for the trail).
        Assert.Equal((oldFlagId, "closed", Reconciliation.Flags.CloseOutcome.Superseded, false), (oldFlag.Id, oldFlag.State, oldFlag.Review.Outcome, oldFlag.IsCurrent));
        Assert.Equal(10, store.GetRawRows("BZ-001", 1).Count);

        Assert.Equal(batch.FlagIds, store.ListFlags().Select(f => f.Id));
        Assert.Equal([oldFlagId, batch.FlagIds.Single()], store.ListFlags(includeSuperseded: true).Select(f => f.Id));

        Assert.Equal("1", Db.Scalar(store.Connection, "SELECT count(*) FROM audit_event WHERE kind = 'batch.revision' AND subject = 'batch:BZ-001'"));
        Assert.Contains("\"supersededRevision\":1", Db.Scalar(store.Connection, "SELECT detail FROM audit_event WHERE kind = 'batch.revision'"), StringComparison.Ordinal);
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void The_same_batch_content_in_a_different_file_is_not_a_new_revision(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1")))]);

        // Re-exported among other rows: different lines, rows in reverse order, "95.0" for 95.
        var original = Build.Batch("BZ-001", firstLine: 40);
        var rows = original.Rows.Reverse().Select(r => r.Entry == Records.Exports.EntryKind.Product && r.Step == "S1"
            ? Build.Row(r.Line, r.Batch, r.Step, r.Entry, r.Material, 95.0, recordedAt: r.RecordedAt!.Value.ToOffset(TimeSpan.Zero), quantityText: "95.0")
            : r).ToList();
        var reExport = original with { Rows = rows };
        var result = Assert.Single(store.Commit([Build.File("b.csv", Build.Ingest(reExport, Build.Day1, Build.Flag("S1")), Build.Ingest(Build.Batch("BZ-002"), Build.Day1))]));

        Assert.Equal(IngestOutcome.Stored, result.Outcome);
        Assert.Equal(
            [("BZ-001", BatchDisposition.Unchanged, 1, 0), ("BZ-002", BatchDisposition.New, 1, 0)],
            result.Batches.Select(b => (b.BatchId, b.Disposition, b.Revision, b.FlagIds.Count)));
        Assert.Equal(1, Db.Count(store.Connection, "batch_revision", "batch_ref = (SELECT id FROM batch WHERE batch_id = 'BZ-001')"));
        Assert.Single(store.ListFlags());

        // A file of nothing but unchanged batches is a duplicate, and its hash is known from then on.
        var only = Assert.Single(store.Commit([Build.File("c.csv", Build.Ingest(reExport, Build.Day1, Build.Flag("S1")))]));
        Assert.Equal(IngestOutcome.Duplicate, only.Outcome);
        Assert.True(store.IsKnown(Build.Sha("c.csv")));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_quarantined_file_stores_only_its_ingest_log_entry_and_a_resend_is_a_duplicate(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        var result = Assert.Single(store.Commit([Build.Quarantined("bad.csv", errors: 3)]));

        Assert.Equal((IngestOutcome.Quarantined, 3), (result.Outcome, result.ErrorCount));
        foreach (var table in new[] { "batch", "batch_revision", "raw_rows", "step_result", "flag" })
        {
            Assert.Equal(0, Db.Count(store.Connection, table));
        }

        Assert.Equal("quarantined|3|0", Db.Scalar(store.Connection, "SELECT outcome || '|' || error_count || '|' || batch_count FROM ingest_log"));
        Assert.Contains("decimal comma", Db.Scalar(store.Connection, "SELECT report FROM ingest_log"), StringComparison.Ordinal);

        var resent = Assert.Single(store.Commit([Build.Quarantined("bad.csv", errors: 3)]));
        Assert.Equal(IngestOutcome.Duplicate, resent.Outcome);
        // The host routes a known file by its first outcome (back to quarantine, not to the archive).
        Assert.Equal((IngestOutcome.Quarantined, 3), (store.FindFile(Build.Sha("bad.csv"))?.Outcome, store.FindFile(Build.Sha("bad.csv"))?.ErrorCount));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void What_was_committed_is_on_disk_for_another_connection_and_after_reopening(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using (var store = db.Open())
        {
            store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1")))]);
            using var other = db.Open();
            Assert.True(other.IsKnown(Build.Sha("a.csv")));
        }

        using var reopened = db.Open();
        Assert.Equal(1, reopened.GetLatestBatch("BZ-001")?.Revision);
        Assert.False(reopened.IsKnown(Build.Sha("never-sent.csv")));
    }

    [Theory]
    [InlineData("")]
    [InlineData("abc")]
    [InlineData("zz00000000000000000000000000000000000000000000000000000000000000")]
    public void A_malformed_sha256_is_refused(string sha)
    {
        Assert.Throws<ArgumentException>(() => FileIngest.Accepted("a.csv", sha, Build.ReceivedAt, []));
    }

    [Fact]
    public void A_file_builder_refuses_the_same_batch_twice_and_a_quarantine_without_errors()
    {
        var batch = Build.Ingest(Build.Batch("BZ-001"), Build.Day1);
        Assert.Throws<ArgumentException>(() => FileIngest.Accepted("a.csv", Build.Sha("a"), Build.ReceivedAt, [batch, batch]));
        Assert.Throws<ArgumentException>(() => FileIngest.Quarantined("a.csv", Build.Sha("a"), Build.ReceivedAt, []));
    }

    private static void AssertSameStep(StepOutcome expected, StepOutcome actual)
    {
        foreach (var property in typeof(StepOutcome).GetProperties())
        {
            var (e, a) = (property.GetValue(expected), property.GetValue(actual));
            switch (e)
            {
                case IReadOnlyDictionary<string, double> equivalents:
                    Assert.Equal(equivalents.OrderBy(p => p.Key), ((IReadOnlyDictionary<string, double>)a!).OrderBy(p => p.Key));
                    break;
                case StepLimits limits:
                    var stored = (StepLimits)a!;
                    Assert.Equal(limits with { EquivalentsRanges = null }, stored with { EquivalentsRanges = null });
                    Assert.Equal(limits.EquivalentsRanges?.OrderBy(p => p.Key), stored.EquivalentsRanges?.OrderBy(p => p.Key));
                    break;
                case IReadOnlyList<LadderRung> ladder:
                    Assert.Equal(ladder, (IReadOnlyList<LadderRung>)a!);
                    break;
                case System.Collections.IEnumerable when e is not string:
                    Assert.Equal(((System.Collections.IEnumerable)e).Cast<object>(), ((System.Collections.IEnumerable)a!).Cast<object>());
                    break;
                default:
                    Assert.True(Equals(e, a), $"{property.Name}: expected {e}, stored {a}");
                    break;
            }
        }
    }
}
