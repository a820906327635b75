using System.Globalization;
using BatchReconcile.Cli;
using BatchReconcile.Digests;
using BatchReconcile.Hosting;
using BatchReconcile.Intake.Inbox;
using BatchReconcile.Pipeline;
using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Reconciliation.ProductionDays;
using BatchReconcile.Storage;
using BatchReconcile.Tests.Support;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Time.Testing;

namespace BatchReconcile.Tests.Digests;

/// <summary>
/// Issue 9, point 1: a digest never goes stale. The demo plant (Europe/Berlin, days from 06:00, digest at 07:30)
/// with the sample week stored, and a clock the test moves; the service's pass is called as its loop calls it.
/// </summary>
public abstract class DigestFreshnessTests : IDisposable
{
    private const string Slug = "kestrel-bay-fine-chemicals-building-3";
    private static readonly DateTimeOffset Stored = DateTimeOffset.Parse("2026-11-28T07:00:00+01:00", CultureInfo.InvariantCulture);

    // The clock starts on the 27th (the provisional case) and is moved on to when the week is stored; it never goes back.
    private readonly FakeTimeProvider _clock = new(DateTimeOffset.Parse("2026-11-27T14:00:00+01:00", CultureInfo.InvariantCulture));
    private readonly HostSandbox _sandbox;

    protected DigestFreshnessTests(StoreProvider provider) => _sandbox = new HostSandbox(_clock, provider);

    [Fact]
    public void A_late_file_for_a_day_with_a_digest_is_in_it_after_the_next_pass_which_says_what_it_replaces_and_keeps_the_first_issue()
    {
        using var host = StartWithScenario();
        var service = host.Services.GetRequiredService<DigestService>();
        var store = host.Services.GetRequiredService<BatchStore>();
        var day = store.GetLatestBatch("KB3-PZ-0230")!.ProductionDay;
        Assert.Contains(service.Pass(_clock.GetUtcNow()), r => r.Day == day && r.Issue == 1);
        var html = Path.Combine(Digests(host), $"digest-{Iso(day)}-{Slug}.html");
        Assert.DoesNotContain("KB3-PZ-0230-LATE", File.ReadAllText(html), StringComparison.Ordinal);

        // Two hours later the same batch's export arrives again under another batch id (a late export of a
        // batch of that day), with the clock past nothing else due.
        _clock.Advance(TimeSpan.FromMinutes(20));
        Ingest(host, "2026-11-25T0025_KB3-PZ-0230.csv", "late-export.csv", text => text.Replace("KB3-PZ-0230", "KB3-PZ-0230-LATE", StringComparison.Ordinal));
        Assert.Equal([day], store.StaleDigestDays());

        var pass = service.Pass(_clock.GetUtcNow());

        var rewrite = Assert.Single(pass);
        Assert.Equal((day, true, 2, "1 batch arrived since that issue"), (rewrite.Day, rewrite.Rewrite, rewrite.Issue, rewrite.Reason));
        var text = File.ReadAllText(html);
        Assert.Contains("KB3-PZ-0230-LATE", text, StringComparison.Ordinal);
        Assert.Contains(
            $"Issue 2: replaces issue 1 written 2026-11-28 07:00 UTC+01:00 (kept as digest-{Iso(day)}-{Slug}.1.html). Why: 1 batch arrived since that issue.",
            text, StringComparison.Ordinal);
        Assert.Contains("(kept as digest-" + Iso(day) + "-" + Slug + ".1.md). Why: 1 batch arrived since that issue.",
            File.ReadAllText(Path.ChangeExtension(html, ".md")), StringComparison.Ordinal);
        Assert.Contains("KB3-PZ-0230-LATE", File.ReadAllText(Path.ChangeExtension(html, ".csv")), StringComparison.Ordinal);

        // The first issue is kept, numbered, as it was.
        foreach (var ext in new[] { "html", "md", "csv" })
        {
            var kept = Path.Combine(Digests(host), $"digest-{Iso(day)}-{Slug}.1.{ext}");
            Assert.True(File.Exists(kept), kept);
            Assert.DoesNotContain("KB3-PZ-0230-LATE", File.ReadAllText(kept), StringComparison.Ordinal);
        }

        var record = store.GetDigest(day)!;
        Assert.Equal(2, record.Writes.Count);
        Assert.Equal("1 batch arrived since that issue", record.Latest.Reason);
        var audit = store.AuditTrailOf("digest:" + Iso(day))[^1];
        Assert.Equal(("digest.rewritten", "system"), (audit.Kind, audit.Actor));
        Assert.Contains("\"reason\":\"1 batch arrived since that issue\"", audit.Detail, StringComparison.Ordinal);
        Assert.True(store.VerifyAudit().Intact);

        // Fresh now: the next pass writes nothing.
        Assert.Empty(service.Pass(_clock.GetUtcNow()));
    }

    [Fact]
    public void A_review_decision_makes_the_days_digest_stale_and_the_rewrite_shows_the_deviation_and_the_reviewer()
    {
        using var host = StartWithScenario();
        var service = host.Services.GetRequiredService<DigestService>();
        var store = host.Services.GetRequiredService<BatchStore>();
        _clock.SetUtcNow(DateTimeOffset.Parse("2026-11-28T07:30:00+01:00", CultureInfo.InvariantCulture));
        service.Pass(_clock.GetUtcNow());
        var day = DateOnly.Parse("2026-11-27", CultureInfo.InvariantCulture);
        Assert.Empty(service.Pass(_clock.GetUtcNow()));

        // sample-data/README.md: on the 27th NB-0168 has a balance-surplus flag.
        var flag = store.ListFlags(day).Single(f => f.BatchId == "KB3-NB-0168");
        Assert.True(store.ReviewFlag(flag.Id, ReviewState.Closed, "A. Chen", "a charge was missing from the record", CloseOutcome.Deviation, "DEV-2026-0142").Accepted);
        _clock.Advance(TimeSpan.FromSeconds(2));

        var rewrite = Assert.Single(service.Pass(_clock.GetUtcNow()));

        Assert.Equal((day, 2, "1 review decision was recorded since that issue"), (rewrite.Day, rewrite.Issue, rewrite.Reason));
        var html = File.ReadAllText(rewrite.Files[0]);
        Assert.Contains("closed: deviation DEV-2026-0142, by A. Chen", html, StringComparison.Ordinal);
        Assert.Contains("Why: 1 review decision was recorded since that issue.", html, StringComparison.Ordinal);
        Assert.Contains(",closed: deviation,DEV-2026-0142,A. Chen", File.ReadAllText(rewrite.Files[2]), StringComparison.Ordinal);
    }

    [Fact]
    public void A_rewrite_on_request_with_nothing_new_says_who_asked_and_keeps_each_earlier_issue()
    {
        using var host = StartWithScenario();
        var writer = host.Services.GetRequiredService<DigestWriter>();
        var day = DateOnly.Parse("2026-11-24", CultureInfo.InvariantCulture);
        writer.Write(day, rewrite: false, DigestService.By);
        writer.Write(day, rewrite: true, "B. Okafor");
        var third = writer.Write(day, rewrite: true, "B. Okafor");

        Assert.Equal((3, "rewritten at the request of B. Okafor; nothing was stored for the day since that issue"), (third.Issue, third.Reason));
        var folder = Digests(host);
        Assert.True(File.Exists(Path.Combine(folder, $"digest-2026-11-24-{Slug}.1.html")));
        Assert.True(File.Exists(Path.Combine(folder, $"digest-2026-11-24-{Slug}.2.html")));
        Assert.Contains("Issue 3: replaces issue 2", File.ReadAllText(third.Files[0]), StringComparison.Ordinal);
        Assert.Contains("Issue 2: replaces issue 1", File.ReadAllText(Path.Combine(folder, $"digest-2026-11-24-{Slug}.2.html")), StringComparison.Ordinal);
        Assert.DoesNotContain("replaces issue", File.ReadAllText(Path.Combine(folder, $"digest-2026-11-24-{Slug}.1.html")), StringComparison.Ordinal);
    }

    [Fact]
    public void A_provisional_digest_is_titled_so_has_its_own_names_and_the_schedule_still_writes_the_days_digest()
    {
        using var host = StartWithScenario(at: _clock.GetUtcNow());
        var writer = host.Services.GetRequiredService<DigestWriter>();
        var store = host.Services.GetRequiredService<BatchStore>();
        var day = DateOnly.Parse("2026-11-27", CultureInfo.InvariantCulture);

        var provisional = writer.WriteProvisional(day, "A. Chen");

        Assert.True(provisional.Provisional);
        Assert.Equal(Path.Combine(Digests(host), $"digest-2026-11-27-{Slug}.provisional.html"), provisional.Files[0]);
        Assert.Contains("<h1>Provisional daily exception digest</h1>", File.ReadAllText(provisional.Files[0]), StringComparison.Ordinal);
        Assert.Null(store.GetDigest(day));
        Assert.False(File.Exists(Path.Combine(Digests(host), $"digest-2026-11-27-{Slug}.html")));

        _clock.SetUtcNow(DateTimeOffset.Parse("2026-11-28T07:30:00+01:00", CultureInfo.InvariantCulture));
        var due = host.Services.GetRequiredService<DigestService>().WriteDue(_clock.GetUtcNow());

        var written = Assert.Single(due, r => r.Day == day);
        Assert.Equal(1, written.Issue);
        var html = File.ReadAllText(Path.Combine(Digests(host), $"digest-2026-11-27-{Slug}.html"));
        Assert.Contains("<h1>Daily exception digest</h1>", html, StringComparison.Ordinal);
        Assert.DoesNotContain("Provisional", html, StringComparison.Ordinal);
        Assert.True(File.Exists(provisional.Files[0]));
    }

    private static string Iso(DateOnly day) => day.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);

    private static string Digests(IHost host) => host.Services.GetRequiredService<DataFolders>().Digests;

    private void Ingest(IHost host, string sample, string name, Func<string, string> edit)
    {
        var inbox = host.Services.GetRequiredService<DataFolders>().Inbox;
        var target = Path.Combine(inbox, name);
        File.WriteAllText(target, edit(File.ReadAllText(Path.Combine(HostSandbox.RepositoryRoot, "sample-data", "inbox", sample))));
        var ready = new ReadyFile(target, name, _clock.GetUtcNow(), new FileInfo(target).Length, _clock.GetUtcNow());
        var outcome = Assert.Single(host.Services.GetRequiredService<IngestPipeline>().Process([ready]));
        Assert.Equal(BatchReconcile.Storage.Ingest.IngestOutcome.Stored, outcome.Outcome);
    }

    private IHost StartWithScenario(DateTimeOffset? at = null)
    {
        _clock.SetUtcNow(at ?? Stored);
        var host = _sandbox.Start(service: true);
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

    public void Dispose()
    {
        _sandbox.Dispose();
        GC.SuppressFinalize(this);
    }
}

/// <summary>The tests above on the embedded store.</summary>
public sealed class DigestFreshnessTestsOnSqlite() : DigestFreshnessTests(StoreProvider.Sqlite);

/// <summary>The tests above on PostgreSQL (a site of its own on the tests' server).</summary>
public sealed class DigestFreshnessTestsOnPostgresql() : DigestFreshnessTests(StoreProvider.Postgresql);

/// <summary>Which days <c>digest --day</c> takes, with and without --provisional: no store involved.</summary>
public sealed class DigestDayRefusalTests
{
    // The demo plant: days from 06:00 Europe/Berlin (UTC+01:00 in November). "now" is 2026-11-27 14:00 +01:00.
    [Theory]
    [InlineData("2026-11-26", false, true, null)]
    [InlineData("2026-11-27", false, null, "digest --day 2026-11-27: that production day has not ended yet (it ends 2026-11-28 06:00 +01:00); --provisional writes a provisional digest")]
    [InlineData("2026-11-29", false, null, "digest --day 2026-11-29: that production day has not started yet (it ends 2026-11-30 06:00 +01:00); --provisional writes a provisional digest")]
    [InlineData("2026-11-27", true, false, null)]
    [InlineData("2026-11-29", true, false, null)]
    [InlineData("2026-11-26", true, null, "--provisional: production day 2026-11-26 has ended (2026-11-27 06:00 +01:00); write its digest without --provisional")]
    public void Digest_day_refuses_a_day_that_has_not_ended_unless_provisional(string day, bool provisional, bool? ended, string? refusal)
    {
        var calendar = new ProductionDayCalendar(TimeZoneInfo.FindSystemTimeZoneById("Europe/Berlin"), new TimeOnly(6, 0));
        var now = DateTimeOffset.Parse("2026-11-27T14:00:00+01:00", CultureInfo.InvariantCulture);
        var target = DateOnly.Parse(day, CultureInfo.InvariantCulture);

        if (refusal is null)
        {
            Assert.Equal(ended, DigestCommand.EndedOrRefuse(calendar, target, now, provisional));
        }
        else
        {
            Assert.Equal(refusal, Assert.Throws<UsageException>(() => DigestCommand.EndedOrRefuse(calendar, target, now, provisional)).Message);
        }
    }
}
