using System.Globalization;
using BatchReconcile.Digests;
using BatchReconcile.Hosting;
using BatchReconcile.Intake.Inbox;
using BatchReconcile.Pipeline;
using BatchReconcile.Storage;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Time.Testing;

using BatchReconcile.Tests.Support;

namespace BatchReconcile.Tests.Digests;

/// <summary>
/// The digest schedule inside the host: a real data folder and database, the demo plant's settings
/// (Europe/Berlin, days from 06:00, digest at 07:30, catch-up 7 days) and a clock the test moves; on both stores
/// (one fixture, a subclass per provider at the end of the file).
/// </summary>
public abstract class DigestServiceTests : IDisposable
{
    private readonly FakeTimeProvider _clock = new(DateTimeOffset.Parse("2026-11-28T07:00:00+01:00", CultureInfo.InvariantCulture));
    private readonly HostSandbox _sandbox;

    protected DigestServiceTests(StoreProvider provider) => _sandbox = new HostSandbox(_clock, provider);

    [Fact]
    public void Missed_days_are_written_on_start_the_due_day_at_its_time_and_none_twice()
    {
        using (var host = StartWithScenario())
        {
            var service = host.Services.GetRequiredService<DigestService>();

            // 07:00 on the 28th: the seven days before are due except the 27th, whose digest is due at 07:30.
            var first = service.WriteDue(_clock.GetUtcNow());
            Assert.Equal(Days("2026-11-21", "2026-11-22", "2026-11-23", "2026-11-24", "2026-11-25", "2026-11-26"), first.Select(r => r.Day));
            Assert.All(first, r => Assert.True(r.Written));
            Assert.All(first.SelectMany(r => r.Files), f => Assert.True(new FileInfo(f).Length > 0, f));

            _clock.SetUtcNow(DateTimeOffset.Parse("2026-11-28T07:30:00+01:00", CultureInfo.InvariantCulture));
            var second = service.WriteDue(_clock.GetUtcNow());
            Assert.Equal(Days("2026-11-27"), second.Select(r => r.Day));
            Assert.Equal(3, second[0].Flags);

            Assert.Empty(service.WriteDue(_clock.GetUtcNow()));
        }

        // A restart finds them all written.
        using (var again = Start())
        {
            Assert.Empty(again.Services.GetRequiredService<DigestService>().WriteDue(_clock.GetUtcNow()));
            var store = again.Services.GetRequiredService<BatchStore>();
            Assert.Equal(7, store.DigestDays().Count);
            Assert.Equal(0, store.GetDigest(Days("2026-11-27")[0])!.RewriteCount);
        }
    }

    [Fact]
    public void A_rewrite_on_request_is_recorded_and_the_schedule_never_rewrites()
    {
        using var host = StartWithScenario();
        var writer = host.Services.GetRequiredService<DigestWriter>();
        var day = Days("2026-11-25")[0];

        Assert.True(writer.Write(day, rewrite: false, by: "system").Written);
        Assert.False(writer.Write(day, rewrite: false, by: "system").Written);
        var rewrite = writer.Write(day, rewrite: true, by: "A. Chen");

        Assert.True(rewrite.Written);
        Assert.True(rewrite.Rewrite);
        var store = host.Services.GetRequiredService<BatchStore>();
        Assert.Equal(1, store.GetDigest(day)!.RewriteCount);
        Assert.True(store.VerifyAudit().Intact);
    }

    [Fact]
    public void The_digest_shows_the_days_flags_and_the_open_ones_from_earlier_days_with_their_age()
    {
        using var host = StartWithScenario();

        var data = host.Services.GetRequiredService<DigestWriter>().Gather(Days("2026-11-27")[0]);

        // sample-data/README.md: on the 27th NB-0167 yield-high, NB-0168 balance-surplus, BZ-0416 S2 step-missing.
        Assert.Equal(
            new[] { ("KB3-BZ-0416", "StepMissing"), ("KB3-NB-0167", "YieldHigh"), ("KB3-NB-0168", "BalanceSurplus") },
            data.Exceptions.Select(e => (e.BatchId, e.Code.ToString())).Order().ToArray());
        Assert.Equal(6, data.BatchesCompleted);
        // Six flags of the 24th to the 26th are still open; the oldest (24th) is three days old.
        Assert.Equal(6, data.OpenEarlierCount);
        Assert.Equal(3, data.OpenEarlier.Max(f => f.AgeDays));
        Assert.Equal(TimeSpan.FromHours(24), data.Day.End - data.Day.Start);
    }

    private IHost StartWithScenario()
    {
        var host = Start();
        var inbox = host.Services.GetRequiredService<DataFolders>().Inbox;
        var samples = Path.Combine(HostSandbox.RepositoryRoot, "sample-data", "inbox");
        var ready = new List<ReadyFile>();
        foreach (var file in Directory.GetFiles(samples, "*.csv").Order(StringComparer.Ordinal))
        {
            var target = Path.Combine(inbox, Path.GetFileName(file));
            File.Copy(file, target);
            ready.Add(new ReadyFile(target, Path.GetFileName(target), _clock.GetUtcNow(), new FileInfo(target).Length, _clock.GetUtcNow()));
        }

        host.Services.GetRequiredService<IngestPipeline>().Process(ready);
        return host;
    }

    private IHost Start() => _sandbox.Start(service: true);

    private static DateOnly[] Days(params string[] days) =>
        days.Select(d => DateOnly.ParseExact(d, "yyyy-MM-dd", CultureInfo.InvariantCulture)).ToArray();


    public void Dispose()
    {
        _sandbox.Dispose();
        GC.SuppressFinalize(this);
    }
}

/// <summary>The tests above on the embedded store.</summary>
public sealed class DigestServiceTestsOnSqlite() : DigestServiceTests(StoreProvider.Sqlite);

/// <summary>The tests above on PostgreSQL (a site of its own on the tests' server).</summary>
public sealed class DigestServiceTestsOnPostgresql() : DigestServiceTests(StoreProvider.Postgresql);
