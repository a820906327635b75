using System.Text.RegularExpressions;
using BatchReconcile.Cli.Tests.Support;

namespace BatchReconcile.Cli.Tests.Ingestion;

/// <summary><c>ingest FOLDER</c> with many files, its output redirected (as in these tests): one plain line per file.</summary>
public partial class IngestFolderTests
{
    private const string Benzamide = "2026-11-23T1705_KB3-NB-0158.csv";

    /// <summary>Issue 10 item 11: links and folders in the inbox are never read, and ingest says so.</summary>
    [Fact]
    public async Task Ingest_of_a_folder_lists_the_links_and_folders_it_does_not_read()
    {
        using var temp = new TempFolder("brc-ingest-ignored");
        var config = TestConfig.Write(temp.Sub("config"));
        var folder = temp.Sub("exports");
        Directory.CreateDirectory(Path.Combine(folder, "old exports"));
        var elsewhere = temp.Sub("elsewhere.csv");
        ExportText.FromSample(Benzamide).WriteTo(elsewhere);
        File.CreateSymbolicLink(Path.Combine(folder, "linked.csv"), elsewhere);
        var file = Path.Combine(folder, Benzamide);
        ExportText.FromSample(Benzamide).WithBatchId("E2E-IGN-1").WriteTo(file);
        File.SetLastWriteTimeUtc(file, DateTime.UtcNow.AddHours(-1));

        var result = await ProgramRunner.RunAsync("ingest", folder, "--config", config, "--data", temp.Sub("data"));

        Assert.True(result.ExitCode == 0, $"exit {result.ExitCode}; stderr:\n{result.Stderr}");
        Assert.Contains($"{Path.Combine(folder, "linked.csv")}: never read (a symbolic link)", result.Stdout, StringComparison.Ordinal);
        Assert.Contains($"{Path.Combine(folder, "old exports")}: never read (a folder)", result.Stdout, StringComparison.Ordinal);
        Assert.EndsWith("1 stored, 2 ignored", result.Stdout.TrimEnd(), StringComparison.Ordinal);
        Assert.True(File.Exists(elsewhere));
        Assert.True(File.Exists(Path.Combine(folder, "linked.csv")));
    }

    [Fact]
    public async Task Ingest_of_a_folder_prints_one_line_per_file_in_arrival_order_when_output_is_redirected()
    {
        using var temp = new TempFolder("brc-ingest-folder");
        var config = TestConfig.Write(temp.Sub("config"));
        var folder = temp.Sub("exports");
        Directory.CreateDirectory(folder);
        var sample = ExportText.FromSample(Benzamide);

        // 12 files: 10 batches, one with a bad unit, and a byte-identical copy of the first.
        // Names sort the other way round from arrival, so the order printed must come from the files' times.
        var expected = new List<(string Name, string Outcome)>();
        var first = sample.WithBatchId("E2E-F-01");
        for (var i = 1; i <= 10; i++)
        {
            expected.Add(($"{20 - i:D2}-batch-{i:D2}.csv", "stored"));
        }

        expected.Add(("05-bad-unit.csv", "quarantined"));
        expected.Add(("04-resend-of-batch-01.csv", "duplicate"));
        var arrival = DateTime.UtcNow.AddHours(-2);
        for (var i = 0; i < expected.Count; i++)
        {
            var export = i < 10 ? sample.WithBatchId($"E2E-F-{i + 1:D2}")
                : i == 10 ? sample.WithBatchId("E2E-F-BAD").WithField(4, "unit", "kgs")
                : first;
            var path = Path.Combine(folder, expected[i].Name);
            export.WriteTo(path);
            File.SetLastWriteTimeUtc(path, arrival.AddMinutes(i));
        }

        var data = new DataRoot(temp.Sub("data"));
        var result = await ProgramRunner.RunAsync("ingest", folder, "--config", config, "--data", data.Path);

        Assert.True(result.ExitCode == 3, $"exit {result.ExitCode}, expected 3 (one file quarantined); stderr:\n{result.Stderr}");
        var lines = result.Stdout.Split('\n').Select(l => l.TrimEnd('\r')).Where(l => ProgressLine().IsMatch(l)).ToList();
        var n = expected.Count;
        Assert.Equal(
            expected.Select((e, k) => $"[{k + 1}/{n}] {e.Name}: {e.Outcome}").ToArray(),
            lines.ToArray());
        // No terminal control sequences in redirected output.
        Assert.DoesNotContain('\u001b', result.Stdout);

        Assert.Equal(10, data.Scalar("SELECT COUNT(*) FROM batch"));
        Assert.Equal(11, data.ArchivedFiles().Count);
        Assert.Equal(["05-bad-unit.csv", "05-bad-unit.csv.report.txt"], data.QuarantinedFiles());
        Assert.Empty(Directory.EnumerateFileSystemEntries(folder));
    }

    [GeneratedRegex(@"^\[\d+/\d+\] ")]
    private static partial Regex ProgressLine();
}
