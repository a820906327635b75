using System.Data.Common;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Digests;

public sealed class DigestRecordTests
{
    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_day_is_written_once_rewrites_are_recorded_and_each_write_is_in_the_trail(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        var clock = new FixedTime(new DateTimeOffset(2026, 11, 24, 6, 30, 0, TimeSpan.Zero));
        using var store = db.Open(time: clock);
        string[] files = ["digests/2026-11-23/digest.html", "digests/2026-11-23/digest.md", "digests/2026-11-23/exceptions.csv"];

        var first = store.RecordDigest(Build.Day1, files, 3, rewrite: false, "system");
        Assert.True(first.Recorded);

        clock.Now = clock.Now.AddHours(1);
        var again = store.RecordDigest(Build.Day1, files, 3, rewrite: false, "system");
        Assert.False(again.Recorded);
        Assert.Equal("the digest of 2026-11-23 was already written on 2026-11-24T06:30Z; ask for a rewrite to write it again", again.Refusal);

        clock.Now = clock.Now.AddHours(2);
        var rewrite = store.RecordDigest(Build.Day1, files[..2], 2, rewrite: true, "A. Chen");
        Assert.True(rewrite.Recorded);

        var record = store.GetDigest(Build.Day1);
        Assert.NotNull(record);
        Assert.Equal(1, record.RewriteCount);
        Assert.Equal((false, "system", 3, new DateTimeOffset(2026, 11, 24, 6, 30, 0, TimeSpan.Zero)), (record.First.IsRewrite, record.First.By, record.First.FlagCount, record.First.WrittenAt));
        Assert.Equal(files, record.First.Files);
        Assert.Equal((true, "A. Chen", 2, clock.Now), (record.Latest.IsRewrite, record.Latest.By, record.Latest.FlagCount, record.Latest.WrittenAt));
        Assert.Equal(files[..2], record.Latest.Files);

        var trail = store.AuditTrailOf("digest:2026-11-23");
        Assert.Equal([("digest.written", "system"), ("digest.rewritten", "A. Chen")], trail.Select(e => (e.Kind, e.Actor)));
        Assert.Equal([first.AuditId!.Value, rewrite.AuditId!.Value], trail.Select(e => e.Id));
        Assert.Contains("\"write\":2", trail[1].Detail, StringComparison.Ordinal);
        Assert.True(store.VerifyAudit().Intact);
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_rewrite_asked_for_a_day_without_a_digest_is_its_first_write(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();

        var result = store.RecordDigest(Build.Day2, ["digests/2026-11-24/digest.html"], 0, rewrite: true, "B. Okafor");

        Assert.False(result.Write!.IsRewrite);
        Assert.Equal("digest.written", Assert.Single(store.AuditTrailOf("digest:2026-11-24")).Kind);
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void The_database_refuses_a_second_first_write_of_a_day(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        store.RecordDigest(Build.Day1, ["a.html"], 0, rewrite: false, "system");

        Assert.ThrowsAny<DbException>(() => Db.Execute(store.Connection,
            "INSERT INTO digest (day, written_at, written_by, is_rewrite, files, flag_count) VALUES ('2026-11-23', '2026-11-24T09:00:00.0000000Z', 'x', 0, '[]', 0)"));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Digest_days_are_listed_in_order_and_within_a_range(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        foreach (var day in new[] { 20, 23, 21, 23 })
        {
            store.RecordDigest(new DateOnly(2026, 11, day), ["x.html"], 0, rewrite: true, "system");
        }

        Assert.Equal([new DateOnly(2026, 11, 20), new DateOnly(2026, 11, 21), new DateOnly(2026, 11, 23)], store.DigestDays());
        Assert.Equal([new DateOnly(2026, 11, 21), new DateOnly(2026, 11, 23)], store.DigestDays(new DateOnly(2026, 11, 21), new DateOnly(2026, 11, 23)));
        Assert.Empty(store.DigestDays(new DateOnly(2026, 11, 22), new DateOnly(2026, 11, 22)));
        Assert.Null(store.GetDigest(new DateOnly(2026, 11, 22)));
        Assert.Equal(1, store.GetDigest(new DateOnly(2026, 11, 23))!.RewriteCount);
    }
}
