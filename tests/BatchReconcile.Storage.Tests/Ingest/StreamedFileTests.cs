using BatchReconcile.Records.Exports;
using BatchReconcile.Storage.Ingest;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Ingest;

/// <summary>Files whose batches are produced while they are stored (<see cref="FileIngest.Streamed"/>).</summary>
public sealed class StreamedFileTests
{
    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Batches_handed_over_are_stored_and_listed_in_the_order_of_their_first_row(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        var calls = 0;

        // Interleaved batches are complete in another order than they start: BZ-002 (lines 30..39)
        // ends before BZ-001 (lines 2..11 in this stand-in), so it is handed over first.
        var file = FileIngest.Streamed("s.csv", Build.Sha("s.csv"), Build.ReceivedAt, storeBatch =>
        {
            calls++;
            storeBatch(Build.Ingest(Build.Batch("BZ-002", firstLine: 30), Build.Day1, Build.Flag("S1")));
            storeBatch(Build.Ingest(Build.Batch("BZ-001", firstLine: 2), Build.Day1));
            return StreamedFileEnd.Valid;
        });

        var result = Assert.Single(store.Commit([file]));

        Assert.Equal(1, calls);
        Assert.Equal(IngestOutcome.Stored, result.Outcome);
        Assert.Equal(["BZ-001", "BZ-002"], result.Batches.Select(b => b.BatchId));
        Assert.Equal([0, 1], result.Batches.Select(b => b.FlagIds.Count));
        Assert.Empty(result.Errors);
        Assert.Equal("2", Db.Scalar(store.Connection, "SELECT batch_count FROM ingest_log WHERE file_name = 's.csv'"));
        Assert.Equal(["BZ-001", "BZ-002"], store.ListBatches().Select(b => b.BatchId));
        Assert.Equal(20, Db.RawLineCount(store.Connection));
        Assert.True(store.VerifyAudit().Intact);
    }

    [Theory]
    [InlineData(0)]
    [InlineData(1)]
    [InlineData(3)]
    public void An_error_found_after_batches_were_stored_rolls_the_file_back_and_quarantines_it(int batchesBeforeTheError)
    {
        using var db = new TempDatabase();
        using var store = db.Open();
        var firstFlagId = Assert.Single(store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1")))])).Batches.Single().FlagIds.Single();
        var errors = new[] { new ExportError("late.csv", 9999, "quantity", "x", "expected a number") };

        // The broken file first re-exports BZ-001 (a revision that closes its open flag), then new batches.
        var late = FileIngest.Streamed("late.csv", Build.Sha("late.csv"), Build.ReceivedAt, storeBatch =>
        {
            for (var i = 0; i < batchesBeforeTheError; i++)
            {
                storeBatch(i == 0
                    ? Build.Ingest(Build.Batch("BZ-001", productKg: 96.5), Build.Day2, Build.Flag("S2"))
                    : Build.Ingest(Build.Batch($"BZ-1{i:D2}"), Build.Day2));
            }

            return StreamedFileEnd.Rejected(errors, "report of late.csv");
        });

        var results = store.Commit([late, Build.File("after.csv", Build.Ingest(Build.Batch("BZ-200"), Build.Day2))]);

        var quarantined = results[0];
        Assert.Equal((IngestOutcome.Quarantined, 1, "report of late.csv"), (quarantined.Outcome, quarantined.ErrorCount, quarantined.Report));
        Assert.Equal(errors, quarantined.Errors);
        Assert.Empty(quarantined.Batches);
        Assert.Equal(IngestOutcome.Stored, results[1].Outcome);

        // Nothing of the broken file stayed: BZ-001 is still at revision 1 with its flag open.
        Assert.Equal(["BZ-001", "BZ-200"], store.ListBatches().Select(b => b.BatchId));
        var current = store.GetLatestBatch("BZ-001");
        Assert.NotNull(current);
        Assert.Equal((1, 1), (current.Revision, current.RevisionCount));
        Assert.Equal((firstFlagId, "open"), (current.Flags.Single().Id, current.Flags.Single().State));
        Assert.Equal("0", Db.Scalar(store.Connection, "SELECT count(*) FROM audit_event WHERE kind = 'batch.revision'"));

        // It is logged once, as quarantined with its error count and report.
        var known = store.FindFile(Build.Sha("late.csv"));
        Assert.Equal((IngestOutcome.Quarantined, 1), (known?.Outcome, known?.ErrorCount));
        Assert.Equal("1", Db.Scalar(store.Connection, "SELECT count(*) FROM ingest_log WHERE file_name = 'late.csv'"));
        Assert.Equal("report of late.csv", Db.Scalar(store.Connection, "SELECT report FROM ingest_log WHERE file_name = 'late.csv'"));
        Assert.True(store.VerifyAudit().Intact);
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_batch_handed_over_twice_fails_only_its_file(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        var twice = FileIngest.Streamed("twice.csv", Build.Sha("twice.csv"), Build.ReceivedAt, storeBatch =>
        {
            storeBatch(Build.Ingest(Build.Batch("BZ-001"), Build.Day1));
            storeBatch(Build.Ingest(Build.Batch("BZ-001", productKg: 90.0), Build.Day1));
            return StreamedFileEnd.Valid;
        });

        var results = store.Commit([twice, Build.File("ok.csv", Build.Ingest(Build.Batch("BZ-002"), Build.Day1))]);

        Assert.False(results[0].Committed);
        Assert.Contains("BZ-001 appears twice", Assert.IsType<ArgumentException>(results[0].Failure).Message, StringComparison.Ordinal);
        Assert.False(store.IsKnown(Build.Sha("twice.csv")));
        Assert.Equal(["BZ-002"], store.ListBatches().Select(b => b.BatchId));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_known_file_is_a_duplicate_and_its_producer_is_never_called(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        store.Commit([Build.File("same.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1))]);
        var again = FileIngest.Streamed("same.csv", Build.Sha("same.csv"), Build.ReceivedAt, _ => throw new InvalidOperationException("read although known"));

        var result = Assert.Single(store.Commit([again]));

        Assert.Equal(IngestOutcome.Duplicate, result.Outcome);
    }
}
