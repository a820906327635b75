using System.Text.Json;
using BatchReconcile.Cli.Tests.Support;

namespace BatchReconcile.Cli.Tests.Ingestion;

/// <summary><c>check FILE [--json]</c>: validate and reconcile, store and move nothing (docs/cli.md).</summary>
public class CheckCommandTests
{
    private const string Benzocaine = "2026-11-23T2135_KB3-BZ-0411.csv";
    private const string ShiftB = "2026-11-27T2205_KB3-shift-B-export.csv";

    [Fact]
    public async Task A_valid_file_prints_the_reconciliation_and_stores_nothing()
    {
        using var temp = new TempFolder("brc-check");
        var file = temp.Sub(Benzocaine);
        var export = ExportText.FromSample(Benzocaine);
        export.WriteTo(file);
        var data = new DataRoot(temp.Sub("data"));

        var text = await ProgramRunner.RunAsync("check", file, "--data", data.Path);
        var json = await ProgramRunner.RunAsync("check", file, "--json", "--data", data.Path);

        Assert.True(text.ExitCode == 0, $"exit {text.ExitCode}; stderr:\n{text.Stderr}");
        // The export states recipe_version 2 (sample-data/README.md, "Recipe version 2 in the week").
        Assert.Contains("batch KB3-BZ-0411: recipe BZC-410 v2, production day 2026-11-23", text.Stdout, StringComparison.Ordinal);
        Assert.Contains("  step S1", text.Stdout, StringComparison.Ordinal);
        Assert.Contains("  step S2", text.Stdout, StringComparison.Ordinal);
        Assert.Equal(0, json.ExitCode);
        using var doc = JsonDocument.Parse(json.Stdout);
        Assert.True(doc.RootElement.GetProperty("valid").GetBoolean());
        Assert.Empty(doc.RootElement.GetProperty("errors").EnumerateArray());
        var batch = Assert.Single(doc.RootElement.GetProperty("batches").EnumerateArray());
        Assert.Equal("KB3-BZ-0411", batch.GetProperty("batch").GetString());
        Assert.Equal("2026-11-23", batch.GetProperty("productionDay").GetString());
        var steps = batch.GetProperty("steps").EnumerateArray().ToList();
        Assert.Equal(["S1", "S2"], steps.Select(s => s.GetProperty("step").GetString()));
        // Yields 92.4 % and 94.2 %: sample-data/README.md, expected results (recomputed from the rows
        // as written by sample-data/tools/generate.py, independently of the program).
        Assert.Equal(92.4, steps[0].GetProperty("yieldPct").GetDouble(), 0.05);
        Assert.Equal(94.2, steps[1].GetProperty("yieldPct").GetDouble(), 0.05);
        // The same figures in the text view (two decimals there).
        Assert.Contains(FormattableString.Invariant($"yield {steps[0].GetProperty("yieldPct").GetDouble():F2} %"), text.Stdout, StringComparison.Ordinal);

        await AssertNothingStoredAsync(data, ["KB3-BZ-0411"]);
        Assert.Equal(export.Bytes, File.ReadAllBytes(file));
    }

    /// <summary>Issue 10 item 4: "1" and 308 zeros in tonnes made check exit 1 with an internal error.</summary>
    [Fact]
    public async Task A_huge_finite_quantity_is_bad_input_with_its_line_and_column_not_an_internal_error()
    {
        using var temp = new TempFolder("brc-check");
        var file = temp.Sub(Benzocaine);
        ExportText.FromSample(Benzocaine).WithField(2, "quantity", "1" + new string('0', 308)).WithField(2, "unit", "t").WriteTo(file);

        var result = await ProgramRunner.RunAsync("check", file, "--data", temp.Sub("data"));

        Assert.True(result.ExitCode == 2, $"exit {result.ExitCode}; stderr:\n{result.Stderr}");
        Assert.Single(result.Stderr.TrimEnd().Split('\n'));
        Assert.Contains("first line 2 column quantity", result.Stderr, StringComparison.Ordinal);
        Assert.Contains("1,000 t", result.Stderr, StringComparison.Ordinal);
        Assert.DoesNotContain("internal", result.Stderr + result.Stdout, StringComparison.OrdinalIgnoreCase);
    }

    [Fact]
    public async Task Check_json_of_a_shift_export_reports_the_flags_of_each_batch()
    {
        // KB3-NB-0168 S1 balance-surplus and KB3-BZ-0416 S2 step-missing, KB3-PZ-0235 clean:
        // sample-data/README.md, expected results.
        using var temp = new TempFolder("brc-check");
        var file = temp.Sub(ShiftB);
        ExportText.FromSample(ShiftB).WriteTo(file);
        var data = new DataRoot(temp.Sub("data"));

        var result = await ProgramRunner.RunAsync("check", file, "--json", "--data", data.Path);

        Assert.Equal(0, result.ExitCode);
        using var doc = JsonDocument.Parse(result.Stdout);
        var flags = doc.RootElement.GetProperty("batches").EnumerateArray()
            .SelectMany(b => b.GetProperty("steps").EnumerateArray().SelectMany(s => s.GetProperty("flags").EnumerateArray()
                .Select(f => $"{b.GetProperty("batch").GetString()} {s.GetProperty("step").GetString()} {f.GetProperty("code").GetString()}")))
            .Order(StringComparer.Ordinal)
            .ToArray();
        Assert.Equal(["KB3-BZ-0416 S2 step-missing", "KB3-NB-0168 S1 balance-surplus"], flags);
        await AssertNothingStoredAsync(data, ["KB3-PZ-0235", "KB3-NB-0168", "KB3-BZ-0416"]);
    }

    [Fact]
    public async Task An_invalid_file_exits_2_with_one_stderr_line_naming_line_and_column()
    {
        using var temp = new TempFolder("brc-check");
        var file = temp.Sub("bad-unit.csv");
        var export = ExportText.FromSample(Benzocaine).WithField(5, "unit", "kgs");
        export.WriteTo(file);
        var data = new DataRoot(temp.Sub("data"));

        var text = await ProgramRunner.RunAsync("check", file, "--data", data.Path);
        var json = await ProgramRunner.RunAsync("check", file, "--json", "--data", data.Path);

        Assert.Equal(2, text.ExitCode);
        var line = Assert.Single(text.Stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries));
        Assert.Contains("line 5", line, StringComparison.Ordinal);
        Assert.Contains("column unit", line, StringComparison.Ordinal);
        Assert.Contains("bad-unit.csv", line, StringComparison.Ordinal);
        Assert.Equal(2, json.ExitCode);
        using var doc = JsonDocument.Parse(json.Stdout);
        Assert.False(doc.RootElement.GetProperty("valid").GetBoolean());
        var error = Assert.Single(doc.RootElement.GetProperty("errors").EnumerateArray());
        Assert.Equal(5, error.GetProperty("line").GetInt32());
        Assert.Equal("unit", error.GetProperty("column").GetString());
        Assert.Equal("kgs", error.GetProperty("value").GetString());
        Assert.Empty(doc.RootElement.GetProperty("batches").EnumerateArray());

        // check never quarantines: the file stays where it is, untouched.
        Assert.Equal(export.Bytes, File.ReadAllBytes(file));
        Assert.Empty(data.QuarantinedFiles());
        await AssertNothingStoredAsync(data, ["KB3-BZ-0411"]);
    }

    private static async Task AssertNothingStoredAsync(DataRoot data, IReadOnlyList<string> batchIds)
    {
        foreach (var id in batchIds)
        {
            var show = await ProgramRunner.RunAsync("batches", "show", id, "--data", data.Path);
            Assert.True(show.ExitCode == 2, $"batches show {id}: exit {show.ExitCode}, expected 2; stdout:\n{show.Stdout}");
        }

        Assert.Equal(0, data.StoredRowCount());
        Assert.Equal(0, data.Scalar("SELECT COUNT(*) FROM ingest_log"));
        Assert.Empty(data.ArchivedFiles());
        Assert.Empty(data.InboxFiles());
    }
}
