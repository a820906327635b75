using System.Globalization;
using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;
using BatchReconcile.Cli;
using BatchReconcile.Digest.Rendering;
using BatchReconcile.Digests;
using BatchReconcile.Hosting;
using BatchReconcile.Intake.Inbox;
using BatchReconcile.Pipeline;
using BatchReconcile.Reconciliation.ProductionDays;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Queries;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Time.Testing;

namespace BatchReconcile.Tests.Pipeline;

/// <summary>
/// Exports without recipe_version through the whole pipeline, against the repository's benzocaine recipe given
/// a second version with a narrower hydrogen range (config/processes/benzocaine.json, changed in the test only: its own
/// version 2 from 2026-10-26 is replaced by the test's).
/// The rows are those of sample-data/inbox/2026-11-23T2135_KB3-BZ-0411.csv (first recorded 2026-11-22T06:50+01:00),
/// moved in time. The site is Europe/Berlin with production days from 06:00 (config/appsettings.json).
/// </summary>
public sealed class RecipeVersionIngestTests : IDisposable
{
    private const string Sample = "2026-11-23T2135_KB3-BZ-0411.csv";
    private const string SampleBatch = "KB3-BZ-0411";

    private readonly FakeTimeProvider _clock = new(DateTimeOffset.Parse("2026-12-01T07:00:00+01:00", CultureInfo.InvariantCulture));
    private readonly string _root = Path.Combine(Path.GetTempPath(), "batchreconcile-tests", Guid.NewGuid().ToString("N"));

    private static string RepositoryRoot => Support.HostSandbox.RepositoryRoot;

    [Fact]
    public void Each_batch_is_reconciled_with_the_version_in_effect_on_its_date_and_says_how_it_was_chosen()
    {
        var config = WriteConfig("config-a", v2From: "2026-11-23", v1S2Tolerance: null);
        using var host = Start(config);

        // OLD: first recorded 2026-11-22 06:50 local: v1 (H2 3.0 to 3.6 equiv). NEW: moved by 19 h 10 min to
        // 2026-11-23 02:00 local, which the plant counts to production day 2026-11-22 (day starts 06:00) but whose
        // calendar date is the 23rd: v2 (H2 3.9 to 4.5 equiv, which this batch's hydrogen is below).
        // STATED: as OLD with recipe_version 2 given. EARLY: moved 400 days back, before v1's effectiveFrom.
        var outcome = Assert.Single(host.Services.GetRequiredService<IngestPipeline>().Process([Write(host, "mixed.csv",
            ("OLD", TimeSpan.Zero, ""),
            ("NEW", new TimeSpan(19, 10, 0), ""),
            ("STATED", TimeSpan.Zero, "2"),
            ("EARLY", TimeSpan.FromDays(-400), ""))]));
        Assert.Empty(outcome.Errors);

        var store = host.Services.GetRequiredService<BatchStore>();
        var calendar = host.Services.GetRequiredService<ProductionDayCalendar>();
        Assert.Equal(new DateOnly(2026, 11, 22), calendar.DayOf(DateTimeOffset.Parse("2026-11-23T02:00:00+01:00", CultureInfo.InvariantCulture)));

        var cases = new (string Batch, int Version, string Source, bool EquivalentsFlag, bool UnstatedFlag)[]
        {
            ("OLD", 1, "effective-date", false, false),
            ("NEW", 2, "effective-date", true, false),
            ("STATED", 2, "export", true, false),
            ("EARLY", 2, "newest", true, true),
        };
        foreach (var c in cases)
        {
            var view = store.GetLatestBatch(c.Batch)!;
            using var json = JsonDocument.Parse(JsonSerializer.Serialize(BatchJson.From(view), JsonOutput.Options));
            var root = json.RootElement;
            Assert.Equal((c.Batch, c.Version, c.Source), (c.Batch, root.GetProperty("recipeVersion").GetInt32(), root.GetProperty("recipeVersionSource").GetString()));
            var codes = root.GetProperty("flags").EnumerateArray().Select(f => f.GetProperty("code").GetString()).ToList();
            Assert.True(c.EquivalentsFlag == codes.Contains("equivalents-out-of-range"), $"{c.Batch}: {string.Join(", ", codes)}");
            Assert.True(c.UnstatedFlag == codes.Contains("recipe-version-unstated"), $"{c.Batch}: {string.Join(", ", codes)}");

            var h2 = root.GetProperty("steps")[1].GetProperty("limits").GetProperty("equivalentsRanges").GetProperty("H2");
            Assert.Equal(c.Version == 1 ? 3.0 : 3.9, h2.GetProperty("min").GetDouble());
        }

        var unstated = Assert.Single(store.GetLatestBatch("EARLY")!.Flags, f => f.Flag.Code.ToText() == "recipe-version-unstated");
        Assert.Equal(("major", "S1"), (unstated.Flag.Severity.ToText(), unstated.Flag.Step));
        Assert.Contains("before the earliest effectiveFrom of recipe BZC-410 (2026-01-01)", unstated.Flag.Message, StringComparison.Ordinal);
        Assert.Contains("BZC-410 v2", unstated.Flag.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Changing_the_definitions_after_ingest_changes_nothing_that_was_stored_or_shown()
    {
        DateOnly day;
        string batchText;
        string html;
        var dataRoot = Path.Combine(_root, "data");
        using (var host = Start(WriteConfig("config-a", v2From: "2026-11-23", v1S2Tolerance: null), dataRoot))
        {
            host.Services.GetRequiredService<IngestPipeline>().Process([Write(host, "new.csv", ("NEW", new TimeSpan(19, 10, 0), ""))]);
            var stored = host.Services.GetRequiredService<BatchStore>().GetLatestBatch("NEW")!;
            day = stored.ProductionDay;
            batchText = Show(stored);
            html = HtmlDigestRenderer.Render(host.Services.GetRequiredService<DigestWriter>().Gather(day));
        }

        // Today's definitions: v2 dropped, v1's S2 tolerance widened to 7.5 %; site k changed to 3.
        using (var host = Start(WriteConfig("config-b", v2From: null, v1S2Tolerance: 7.5, coverageFactor: 3.0), dataRoot))
        {
            var view = host.Services.GetRequiredService<BatchStore>().GetLatestBatch("NEW")!;
            var shown = Show(view);
            var digest = host.Services.GetRequiredService<DigestWriter>().Gather(day);
            var again = HtmlDigestRenderer.Render(digest);

            Assert.Equal(batchText, shown);
            Assert.Contains("recipe BZC-410 v2", shown, StringComparison.Ordinal);
            Assert.Contains("balance tolerance 2 %", shown, StringComparison.Ordinal);
            Assert.Contains(", k 2)", shown, StringComparison.Ordinal);
            Assert.Contains("equivalents H2 3.9 to 4.5", shown, StringComparison.Ordinal);

            var step = Assert.Single(digest.FlaggedSteps, s => s.BatchId == "NEW" && s.Step == "S2");
            Assert.Equal((2.0, 2.0), (step.TolerancePct, step.CoverageFactor));
            Assert.Contains("<dt>Tolerance</dt><dd>± 2.0 % of charged</dd>", again, StringComparison.Ordinal);
            Assert.DoesNotContain("7.5 %", again, StringComparison.Ordinal);
            Assert.Contains("recipe BZC-410 v2 (version source: effective-date)", again, StringComparison.Ordinal);
            Assert.Equal(Strip(html), Strip(again));
        }
    }

    public void Dispose()
    {
        try
        {
            Directory.Delete(_root, recursive: true);
        }
        catch (IOException)
        {
            // A file still held by a disposing host; the temp folder is cleaned up later.
        }
    }

    /// <summary>The digest without its "generated at" time, which is the only thing allowed to differ.</summary>
    private static string Strip(string html) => string.Join("\n", html.Split('\n').Where(l => !l.Contains("enerated", StringComparison.Ordinal)));

    private static string Show(BatchView view)
    {
        using var o = new StringWriter();
        BatchText.Write(
            o,
            BatchText.Header(view.BatchId, view.Recipe, view.RecipeVersion, view.RecipeVersionSource, view.ProductionDay, null),
            [],
            view.Steps.Select(s => (s.Outcome, (IReadOnlyList<(Reconciliation.Flags.Flag, long?)>)s.Flags.Select(f => (f.Flag, (long?)f.Id)).ToList())));
        return o.ToString();
    }

    private IHost Start(string config, string? dataRoot = null)
    {
        var host = AppHost.Build(new AppContextOptions(config, dataRoot ?? Path.Combine(_root, "data")), service: false, quietConsole: true, time: _clock);
        AppHost.Validate(host.Services);
        return host;
    }

    /// <summary>The repository's config with BZC-410 v1 in effect from 2026-01-01 and, unless null, a v2 from <paramref name="v2From"/>.</summary>
    private string WriteConfig(string name, string? v2From, double? v1S2Tolerance, double? coverageFactor = null)
    {
        var folder = Path.Combine(_root, name);
        var processes = Path.Combine(folder, "processes");
        Directory.CreateDirectory(processes);
        foreach (var file in Directory.EnumerateFiles(Path.Combine(RepositoryRoot, "config", "processes"), "*.json"))
        {
            File.Copy(file, Path.Combine(processes, Path.GetFileName(file)));
        }

        var settings = JsonNode.Parse(File.ReadAllText(Path.Combine(RepositoryRoot, "config", "appsettings.json")))!.AsObject();
        if (coverageFactor is { } k)
        {
            settings["Reconciliation"]!["CoverageFactor"] = k;
        }

        File.WriteAllText(Path.Combine(folder, "appsettings.json"), settings.ToJsonString());

        var path = Path.Combine(processes, "benzocaine.json");
        var doc = JsonNode.Parse(File.ReadAllText(path))!.AsObject();
        var recipes = doc["recipes"]!.AsArray();

        // The repository's own later versions (version 2 from 2026-10-26) are taken out: this test sets its own.
        foreach (var later in recipes.Where(r => (string?)r!["code"] == "BZC-410" && (int)r!["version"]! != 1).ToList())
        {
            recipes.Remove(later);
        }

        var v1 = recipes.Single(r => (string?)r!["code"] == "BZC-410")!.AsObject();
        v1["effectiveFrom"] = "2026-01-01";
        if (v2From is not null)
        {
            var v2 = JsonNode.Parse(v1.ToJsonString())!.AsObject();
            v2["version"] = 2;
            v2["effectiveFrom"] = v2From;
            v2["steps"]![1]!["equivalents"]!["H2"] = new JsonObject { ["min"] = 3.9, ["max"] = 4.5 };
            recipes.Add(v2);
        }

        if (v1S2Tolerance is { } tolerance)
        {
            v1["steps"]![1]!["balanceTolerancePct"] = tolerance;
        }

        File.WriteAllText(path, doc.ToJsonString());
        return folder;
    }

    /// <summary>The sample batch under new ids, each moved in time by its shift, with recipe_version as given.</summary>
    private ReadyFile Write(IHost host, string name, params (string Batch, TimeSpan Shift, string Version)[] batches)
    {
        var sample = File.ReadAllLines(Path.Combine(RepositoryRoot, "sample-data", "inbox", Sample), Encoding.UTF8);
        var path = Path.Combine(host.Services.GetRequiredService<DataFolders>().Inbox, name);
        var lines = new List<string> { sample[0] };
        foreach (var (batch, shift, version) in batches)
        {
            foreach (var row in sample.Skip(1).Where(l => l.Length > 0))
            {
                var fields = row.Split(',');
                fields[0] = fields[0].Replace(SampleBatch, batch, StringComparison.Ordinal);
                fields[2] = version;
                if (fields[11].Length > 0)
                {
                    var at = DateTimeOffset.Parse(fields[11], CultureInfo.InvariantCulture) + shift;
                    fields[11] = at.ToString("yyyy-MM-dd'T'HH:mm:sszzz", CultureInfo.InvariantCulture);
                }

                lines.Add(string.Join(',', fields));
            }
        }

        File.WriteAllText(path, string.Join("\n", lines) + "\n", new UTF8Encoding(false));
        var info = new FileInfo(path);
        return new ReadyFile(path, name, _clock.GetUtcNow(), info.Length, _clock.GetUtcNow());
    }
}

/// <summary>A step stored before its limits were kept (migration 6) shows them as unknown, never as 0.</summary>
public sealed class UnknownLimitsTextTests
{
    [Fact]
    public void Batch_text_and_json_show_unknown_limits_as_unknown()
    {
        var step = new Reconciliation.Outcomes.StepOutcome(
            "S1", true, "NBA", 1000, 100, 90, 90, 80, 1.1, 70, null, null, 5, null, null, 500, 120, 110, 0, 490, 0, 0, 10, 98, 0.7,
            new Dictionary<string, double>(), [], [], Reconciliation.Outcomes.StepLimits.Unknown);
        using var o = new StringWriter();

        BatchText.Write(o, BatchText.Header("OLD-1", "R", 1, null, new DateOnly(2026, 11, 23), null), [], [(step, [])]);
        var json = JsonSerializer.Serialize(BatchJson.Step(step, []), JsonOutput.Options);

        var text = o.ToString();
        Assert.Contains("recipe version source: unknown", text, StringComparison.Ordinal);
        Assert.Contains("(U unknown, k unknown)", text, StringComparison.Ordinal);
        Assert.Contains("limits: yield unknown, balance tolerance unknown, product in waste unknown, equivalents unknown", text, StringComparison.Ordinal);
        Assert.DoesNotContain(" 0 %", text, StringComparison.Ordinal);
        using var doc = JsonDocument.Parse(json);
        var limits = doc.RootElement.GetProperty("limits");
        Assert.All(limits.EnumerateObject(), p => Assert.Equal(JsonValueKind.Null, p.Value.ValueKind));
    }
}
