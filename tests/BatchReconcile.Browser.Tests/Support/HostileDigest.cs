using BatchReconcile.Cli.Tests.Support;
using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;

namespace BatchReconcile.Browser.Tests.Support;

/// <summary>
/// A digest written from hostile data the way a user gets one: a valid export whose batch id and stream names
/// carry markup, quotes, a spreadsheet formula and path pieces (the export contract allows free-text batch ids
/// and stream labels), ingested with <c>ingest FILE --json</c> under a site whose name is just as hostile,
/// then <c>digest --day</c> for that batch's production day.
/// </summary>
public sealed class HostileDigest : IAsyncLifetime
{
    /// <summary>A batch id that is a formula, a script, quotes and a path all at once.</summary>
    public const string BatchId = "=cmd|' /C calc'!A0 <script>alert(1)</script> \"quotes\" ../..\\b/x";

    public const string StreamName = "<script>alert(2)</script> \"residue\" =1+1 ../r";

    public const string SiteName = "../<script>alert(3)</script> \"Site\"\\..";

    // A valid export of one batch of the scenario's last day: its batch id and one stream are replaced below.
    private const string SampleExport = "2026-11-27T1652_KB3-NB-0167.csv";
    private const string SampleBatch = "KB3-NB-0167";
    private const string SampleStream = "distillation residue";

    private readonly TempFolder scratch = new();

    public string Data => scratch.Sub("data");

    public string Config { get; private set; } = string.Empty;

    public string Day { get; private set; } = string.Empty;

    /// <summary>The batch ids that <c>ingest --json</c> reports it stored.</summary>
    public IReadOnlyList<string> IngestedBatches { get; private set; } = [];

    public IReadOnlyList<DayFlag> BatchFlags { get; private set; } = [];

    /// <summary>The files <c>digest --json</c> says it wrote.</summary>
    public IReadOnlyList<string> Files { get; private set; } = [];

    public string DigestsFolder => Path.Combine(Data, "digests");

    public string HtmlPath => Files.Single(f => f.EndsWith(".html", StringComparison.Ordinal));

    public string CsvPath => Files.Single(f => f.EndsWith(".csv", StringComparison.Ordinal));

    public string MarkdownPath => Files.Single(f => f.EndsWith(".md", StringComparison.Ordinal));

    public async Task InitializeAsync()
    {
        Config = TestConfig.CopyVerbatim(scratch.Sub("config"));
        var settingsPath = Path.Combine(Config, "appsettings.json");
        var settings = JsonNode.Parse(await File.ReadAllTextAsync(settingsPath))!;
        settings["Site"]!["Name"] = SiteName;
        await File.WriteAllTextAsync(settingsPath, settings.ToJsonString());

        var export = scratch.Sub("hostile-export.csv");
        await File.WriteAllTextAsync(export, HostileExport(), new UTF8Encoding(false));

        var ingest = await ProgramRunner.RunExpectingAsync(0, "ingest", export, "--json", "--data", Data, "--config", Config);
        using (var json = JsonDocument.Parse(ingest.Stdout))
        {
            IngestedBatches = [.. json.RootElement.EnumerateArray().SelectMany(f => f.GetProperty("batches").EnumerateArray()).Select(b => b.GetString()!)];
        }

        BatchFlags = [.. (await DayFlag.ListAsync(Data, config: Config)).Where(f => f.Batch == BatchId)];
        if (BatchFlags.Count == 0)
        {
            throw new InvalidOperationException($"the hostile batch raised no flag, so its digest would have no exception row:\n{ingest.Stdout}");
        }

        Day = BatchFlags[0].Day;
        var digest = await ProgramRunner.RunExpectingAsync(0, "digest", "--day", Day, "--json", "--by", "browser test", "--data", Data, "--config", Config);
        using (var json = JsonDocument.Parse(digest.Stdout))
        {
            Files = [.. json.RootElement.GetProperty("files").EnumerateArray().Select(f => f.GetString()!)];
        }
    }

    public Task DisposeAsync()
    {
        scratch.Dispose();
        return Task.CompletedTask;
    }

    /// <summary>The sample export with the batch id and one stream replaced; every other field as exported.</summary>
    private static string HostileExport()
    {
        var lines = File.ReadAllLines(Path.Combine(RepoPaths.Root, "sample-data", "inbox", SampleExport));
        var text = new StringBuilder();
        text.Append(lines[0]).Append('\n');
        foreach (var line in lines.Skip(1).Where(l => l.Length > 0))
        {
            var fields = line.Split(',');
            if (fields[0] != SampleBatch || line.Contains('"', StringComparison.Ordinal))
            {
                throw new InvalidOperationException($"{SampleExport} changed: expected plain rows of {SampleBatch}, got {line}");
            }

            fields[0] = BatchId;
            if (fields[6] == SampleStream)
            {
                fields[6] = StreamName;
            }

            text.AppendJoin(',', fields.Select(CsvRecords.Quote)).Append('\n');
        }

        return text.ToString();
    }
}
