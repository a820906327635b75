using BatchReconcile.Cli.Tests.Support;
using System.Text.Json;
using System.Text.RegularExpressions;

namespace BatchReconcile.Browser.Tests.Support;

/// <summary>
/// The digest a user gets from <c>batchreconcile demo --data FOLDER</c>: the sample week ingested into a fresh
/// data folder, ending with the digest of the last production day. Made once for the browser tests.
/// </summary>
public sealed partial class DemoDigest : IAsyncLifetime
{
    private readonly TempFolder scratch = new();

    public string Data => scratch.Sub("data");

    /// <summary>The production day the demo says it wrote the digest for.</summary>
    public string Day { get; private set; } = string.Empty;

    public string HtmlPath { get; private set; } = string.Empty;

    /// <summary>The analysis report the demo ends with (empty when it printed none).</summary>
    public string ReportPath { get; private set; } = string.Empty;

    public string SiteName { get; private set; } = string.Empty;

    /// <summary>The day's flags as <c>flags list --day DAY --json</c> gives them.</summary>
    public IReadOnlyList<DayFlag> Flags { get; private set; } = [];

    public string DemoOutput { get; private set; } = string.Empty;

    public async Task InitializeAsync()
    {
        var demo = await ProgramRunner.RunExpectingAsync(0, "demo", "--data", Data);
        DemoOutput = demo.Stdout;
        var day = DigestDayLine().Match(demo.Stdout);
        if (!day.Success)
        {
            throw new InvalidOperationException($"demo did not name the digest's day:\n{demo.Stdout}");
        }

        Day = day.Groups["day"].Value;
        var htmlFiles = demo.Stdout.Split('\n').Select(l => l.Trim())
            .Where(l => l.EndsWith(".html", StringComparison.Ordinal) && Path.GetFileName(l).StartsWith("digest-", StringComparison.Ordinal)).ToList();
        ReportPath = demo.Stdout.Split('\n').Select(l => l.Trim())
            .SingleOrDefault(l => l.EndsWith(".html", StringComparison.Ordinal) && Path.GetFileName(l).StartsWith("report-", StringComparison.Ordinal)) ?? string.Empty;
        if (htmlFiles.Count != 1)
        {
            throw new InvalidOperationException($"demo printed {htmlFiles.Count} HTML digest paths, expected 1:\n{demo.Stdout}");
        }

        HtmlPath = htmlFiles[0];
        SiteName = ReadSiteName();
        Flags = await DayFlag.ListAsync(Data, Day);
    }

    public Task DisposeAsync()
    {
        scratch.Dispose();
        return Task.CompletedTask;
    }

    /// <summary>The site name the demo ran with: the repository's settings.</summary>
    private static string ReadSiteName()
    {
        using var settings = JsonDocument.Parse(File.ReadAllText(Path.Combine(RepoPaths.Root, "config", "appsettings.json")));
        return settings.RootElement.GetProperty("Site").GetProperty("Name").GetString()
            ?? throw new InvalidOperationException("config/appsettings.json has no Site:Name");
    }

    [GeneratedRegex(@"^Digest of the last production day, (?<day>\d{4}-\d{2}-\d{2})", RegexOptions.Multiline)]
    private static partial Regex DigestDayLine();
}
