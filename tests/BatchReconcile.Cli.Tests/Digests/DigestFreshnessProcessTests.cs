using System.Globalization;
using System.Text.Json;
using BatchReconcile.Cli.Tests.Ingestion;
using BatchReconcile.Cli.Tests.Support;

namespace BatchReconcile.Cli.Tests.Digests;

/// <summary>
/// Issue 9, point 1, through the real program: a late file reaches the digest of its day while <c>run</c> is up
/// and at the end of <c>ingest</c>; <c>digest --day</c> refuses a day that has not ended unless provisional.
/// The sample batch KB3-NB-0158 belongs to production day 2026-11-23 (sample-data/README.md).
/// </summary>
[Collection(ServiceCollection.Name)]
public sealed class DigestFreshnessProcessTests
{
    private const string Sample = "2026-11-23T1705_KB3-NB-0158.csv";
    private const string Day = "2026-11-23";
    private const string Stem = "digest-2026-11-23-kestrel-bay-fine-chemicals-building-3";

    [Fact]
    public async Task A_late_file_for_a_day_with_a_digest_changes_that_digest_within_one_pass_of_run()
    {
        using var sandbox = new ServiceSandbox();
        await WithDigestOfTheDay(sandbox);
        using var service = await sandbox.StartAsync();

        sandbox.Drop("late-export.csv", ExportText.FromSample(Sample).WithBatchId("E2E-LATE-RUN"));
        await sandbox.WaitUntilTakenAsync(1, service);
        // The service looks for stale days every 2 s; 30 s is generous on a shared machine and far below the next
        // due time, so only the freshness pass can have written it.
        await Poll.UntilAsync(
            () => sandbox.Data.Scalar($"SELECT count(*) FROM digest WHERE day = '{Day}'") == 2 || service.HasExited,
            TimeSpan.FromSeconds(30),
            () => $"the digest of {Day} was not rewritten; stderr:\n{service.Stderr}");

        var html = File.ReadAllText(Path.Combine(sandbox.Data.Path, "digests", Stem + ".html"));
        Assert.Contains("E2E-LATE-RUN", html, StringComparison.Ordinal);
        Assert.Contains($"Issue 2: replaces issue 1 written ", html, StringComparison.Ordinal);
        Assert.Contains($"(kept as {Stem}.1.html). Why: 1 batch arrived since that issue.", html, StringComparison.Ordinal);
        var kept = File.ReadAllText(Path.Combine(sandbox.Data.Path, "digests", Stem + ".1.html"));
        Assert.DoesNotContain("E2E-LATE-RUN", kept, StringComparison.Ordinal);
        Assert.Contains("KB3-NB-0158", kept, StringComparison.Ordinal);
        Assert.Equal(1, sandbox.Data.Scalar($"SELECT count(*) FROM audit_event WHERE kind = 'digest.rewritten' AND detail LIKE '%1 batch arrived since that issue%'"));
        Assert.Equal(0, await service.TerminateAsync(ServiceSandbox.Patience));
    }

    [Fact]
    public async Task Ingest_of_a_late_file_rewrites_the_days_digest_at_its_end()
    {
        using var sandbox = new ServiceSandbox();
        await WithDigestOfTheDay(sandbox);
        var late = Path.Combine(sandbox.Stage, "late-export.csv");
        ExportText.FromSample(Sample).WithBatchId("E2E-LATE-INGEST").WriteTo(late);

        var result = await ProgramRunner.RunExpectingAsync(0, "ingest", late, "--config", sandbox.Config, "--data", sandbox.Data.Path);

        var digest = Path.Combine(sandbox.Data.Path, "digests", Stem + ".html");
        Assert.Contains($"digest of {Day} rewritten as issue 2 (1 batch arrived since that issue): {digest}", result.Stdout, StringComparison.Ordinal);
        Assert.Contains("E2E-LATE-INGEST", File.ReadAllText(digest), StringComparison.Ordinal);
        Assert.True(File.Exists(Path.Combine(sandbox.Data.Path, "digests", Stem + ".1.md")));
        Assert.Equal(2, sandbox.Data.Scalar($"SELECT count(*) FROM digest WHERE day = '{Day}'"));

        // With --json stdout stays one JSON document; the note goes to stderr.
        var again = Path.Combine(sandbox.Stage, "later-export.csv");
        ExportText.FromSample(Sample).WithBatchId("E2E-LATE-JSON").WriteTo(again);
        var json = await ProgramRunner.RunExpectingAsync(0, "ingest", again, "--json", "--config", sandbox.Config, "--data", sandbox.Data.Path);
        Assert.Equal(JsonValueKind.Array, JsonDocument.Parse(json.Stdout).RootElement.ValueKind);
        Assert.Contains($"digest of {Day} rewritten as issue 3", json.Stderr, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(0, "has not ended yet")]
    [InlineData(2, "has not started yet")]
    public async Task Digest_day_of_today_or_a_future_day_exits_2_with_one_line_saying_why(int daysAhead, string why)
    {
        using var sandbox = new ServiceSandbox();
        var day = ProductionDayNow().AddDays(daysAhead).ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);

        var result = await ProgramRunner.RunAsync("digest", "--day", day, "--config", sandbox.Config, "--data", sandbox.Data.Path);

        Assert.Equal(2, result.ExitCode);
        var line = Assert.Single(result.Stderr.TrimEnd().Split('\n'));
        Assert.Contains($"digest --day {day}: that production day {why}", line, StringComparison.Ordinal);
        Assert.Contains("--provisional", line, StringComparison.Ordinal);
        Assert.Equal(0, sandbox.Data.Scalar("SELECT count(*) FROM digest"));
    }

    [Fact]
    public async Task A_provisional_digest_of_today_is_titled_so_written_apart_and_not_counted_as_the_days_digest()
    {
        using var sandbox = new ServiceSandbox();
        var day = ProductionDayNow().ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);

        var result = await ProgramRunner.RunExpectingAsync(0, "digest", "--day", day, "--provisional", "--json", "--config", sandbox.Config, "--data", sandbox.Data.Path);

        using var doc = JsonDocument.Parse(result.Stdout);
        Assert.True(doc.RootElement.GetProperty("provisional").GetBoolean());
        var html = doc.RootElement.GetProperty("files")[0].GetString()!;
        Assert.EndsWith($"digest-{day}-kestrel-bay-fine-chemicals-building-3.provisional.html", html, StringComparison.Ordinal);
        Assert.Contains("<h1>Provisional daily exception digest</h1>", File.ReadAllText(html), StringComparison.Ordinal);
        Assert.Equal(0, sandbox.Data.Scalar("SELECT count(*) FROM digest"));
        Assert.Equal(0, sandbox.Data.Scalar("SELECT count(*) FROM audit_event WHERE subject LIKE 'digest:%'"));
    }

    /// <summary>The sample batch of the 23rd stored and that day's digest written (issue 1).</summary>
    private static async Task WithDigestOfTheDay(ServiceSandbox sandbox)
    {
        var first = Path.Combine(sandbox.Stage, Sample);
        ExportText.FromSample(Sample).WriteTo(first);
        await ProgramRunner.RunExpectingAsync(0, "ingest", first, "--config", sandbox.Config, "--data", sandbox.Data.Path);
        await ProgramRunner.RunExpectingAsync(0, "digest", "--day", Day, "--config", sandbox.Config, "--data", sandbox.Data.Path);
        Assert.Equal(1, sandbox.Data.Scalar($"SELECT count(*) FROM digest WHERE day = '{Day}'"));
    }

    // The demo plant's production day now (config/appsettings.json: Europe/Berlin, days from 06:00).
    private static DateOnly ProductionDayNow()
    {
        var local = TimeZoneInfo.ConvertTime(DateTimeOffset.UtcNow, TimeZoneInfo.FindSystemTimeZoneById("Europe/Berlin"));
        return DateOnly.FromDateTime(local.AddHours(-6).DateTime);
    }
}
