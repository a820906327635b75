using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Storage.Digests;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Digests;

/// <summary>Issue 9: the store knows when a day's digest no longer shows what it holds.</summary>
public sealed class DigestFreshnessTests
{
    private static readonly string[] Files = ["digests/digest-2026-11-23.html"];

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_batch_stored_for_a_day_after_its_digest_makes_the_day_stale_until_a_digest_covers_it(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        var clock = new FixedTime(new DateTimeOffset(2026, 11, 24, 6, 30, 0, TimeSpan.Zero));
        using var store = db.Open(time: clock);
        store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("B-1"), Build.Day1, Build.Flag("S1")))]);
        Assert.True(store.RecordDigest(Build.Day1, Files, 1, rewrite: false, "system").Recorded);
        Assert.Empty(store.StaleDigestDays());

        // The same clock reading for the late file: freshness never depends on two times being apart.
        store.Commit([Build.File("late.csv", Build.Ingest(Build.Batch("B-2"), Build.Day1), Build.Ingest(Build.Batch("B-3"), Build.Day2))]);

        Assert.Equal([Build.Day1], store.StaleDigestDays());
        Assert.Equal(new DayChanges(2, 0, 0, 0), store.DayChangesOf(Build.Day1));
        Assert.Equal(new DayChanges(1, 0, 0, 0), store.GetDigest(Build.Day1)!.Latest.Seen);

        var seen = store.DayChangesOf(Build.Day1);
        var rewrite = store.RecordDigest(new DigestWriteRequest(Build.Day1, Files, 1, Rewrite: true, "system")
        {
            Seen = seen, Reason = "1 batch arrived since that issue", Kept = ["digests/digest-2026-11-23.1.html"], ExpectedEarlierWrites = 1,
        });
        Assert.True(rewrite.Recorded);
        Assert.Equal(2, rewrite.Write!.Issue);
        Assert.Empty(store.StaleDigestDays());

        var entry = store.AuditTrailOf("digest:2026-11-23")[^1];
        Assert.Equal("digest.rewritten", entry.Kind);
        Assert.Contains("\"reason\":\"1 batch arrived since that issue\"", entry.Detail, StringComparison.Ordinal);
        Assert.Contains("\"replaces\":{\"write\":1,\"writtenAt\":\"2026-11-24T06:30:00.0000000Z\"}", entry.Detail, StringComparison.Ordinal);
        Assert.Contains("\"kept\":[\"digests/digest-2026-11-23.1.html\"]", entry.Detail, StringComparison.Ordinal);
        Assert.Equal("1 batch arrived since that issue", store.GetDigest(Build.Day1)!.Latest.Reason);
        Assert.True(store.VerifyAudit().Intact);
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_review_decision_on_a_flag_of_the_day_makes_it_stale_a_decision_on_a_day_without_digest_does_not(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        var day1 = store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("B-1"), Build.Day1, Build.Flag("S1")))]).Single().Batches.Single().FlagIds.Single();
        var day2 = store.Commit([Build.File("b.csv", Build.Ingest(Build.Batch("B-2"), Build.Day2, Build.Flag("S1")))]).Single().Batches.Single().FlagIds.Single();
        store.RecordDigest(Build.Day1, Files, 1, rewrite: false, "system");

        Assert.True(store.ReviewFlag(day2, ReviewState.InReview, "A. Chen", "looking at the weighing").Accepted);
        Assert.Empty(store.StaleDigestDays());

        Assert.True(store.ReviewFlag(day1, ReviewState.Closed, "A. Chen", "raised as a deviation", CloseOutcome.Deviation, "DEV-2026-0142").Accepted);
        Assert.Equal([Build.Day1], store.StaleDigestDays());
        Assert.Equal(new DayChanges(1, 0, 0, 1), store.DayChangesOf(Build.Day1));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_re_export_counts_once_as_a_revision_and_a_batch_moved_to_another_day_is_counted_on_the_day_it_left(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("B-1"), Build.Day1, Build.Flag("S1")))]);
        store.RecordDigest(Build.Day1, Files, 1, rewrite: false, "system");

        // Same day: one revision stored; the system's closing of the old revision's flag is no review decision.
        store.Commit([Build.File("a-rev2.csv", Build.Ingest(Build.Batch("B-1", productKg: 96.0), Build.Day1, Build.Flag("S1")))]);
        Assert.Equal(new DayChanges(1, 1, 0, 0), store.DayChangesOf(Build.Day1));

        // A later revision whose production day is the next one: day 1 lost the batch, day 2 gained a revision.
        store.Commit([Build.File("a-rev3.csv", Build.Ingest(Build.Batch("B-1", productKg: 97.0), Build.Day2))]);
        Assert.Equal(new DayChanges(1, 1, 1, 0), store.DayChangesOf(Build.Day1));
        Assert.Equal(new DayChanges(0, 1, 0, 0), store.DayChangesOf(Build.Day2));
        Assert.Equal([Build.Day1], store.StaleDigestDays());
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_write_that_another_process_got_to_first_is_refused_and_its_files_are_not_written(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        store.RecordDigest(Build.Day1, Files, 0, rewrite: false, "system");
        var wrote = false;

        var result = store.RecordDigest(new DigestWriteRequest(Build.Day1, Files, 0, Rewrite: true, "system")
        {
            ExpectedEarlierWrites = 0, WriteFiles = () => wrote = true,
        });

        Assert.False(result.Recorded);
        Assert.False(wrote);
        Assert.Equal("the digest of 2026-11-23 was written by another process meanwhile (1 writes, 0 expected)", result.Refusal);
        Assert.Single(store.GetDigest(Build.Day1)!.Writes);
    }
}
