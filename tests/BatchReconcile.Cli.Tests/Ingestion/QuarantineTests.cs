using System.Security.Cryptography;
using BatchReconcile.Cli.Tests.Support;

namespace BatchReconcile.Cli.Tests.Ingestion;

/// <summary>
/// Every kind of bad input the export contract names (docs/export-format.md, "What each batch must
/// satisfy"), through the real <c>ingest --json</c>: the file is quarantined whole, the problem is
/// located by line and column in the JSON and in the report beside the file, and nothing is stored.
/// </summary>
/// <remarks>
/// The files are sample exports (sample-data/inbox/, valid as committed) with one field changed.
/// In 2026-11-23T1705_KB3-NB-0158.csv line 4 is the benzylamine charge (154.0 kg, assay 99.4),
/// line 7 a process-water charge and line 11 the analysis of the "aqueous layer"; in
/// 2026-11-23T2135_KB3-BZ-0411.csv (recipe BZC-410, steps S1 and S2) line 2 is the first S1 charge.
/// </remarks>
public class QuarantineTests
{
    private const string Benzamide = "2026-11-23T1705_KB3-NB-0158.csv";
    private const string Benzocaine = "2026-11-23T2135_KB3-BZ-0411.csv";

    /// <summary>kind, sample, file line, column, field as written, expected value, part of the reason.</summary>
    public static TheoryData<string, string, int, string, string, string, string> BadFields => new()
    {
        { "decimal comma", Benzamide, 4, "quantity", "\"154,0\"", "154,0", "comma" },
        { "thousands separator", Benzamide, 7, "quantity", "\"1,440.0\"", "1,440.0", "comma" },
        { "decimal comma in assay", Benzamide, 4, "assay_pct", "\"99,4\"", "99,4", "comma" },
        { "unknown material", Benzamide, 4, "material", "BNZ", "BNZ", "unknown material" },
        { "unknown recipe", Benzamide, 4, "recipe", "NBB-510", "NBB-510", "unknown recipe" },
        { "one batch under two recipes", Benzamide, 4, "recipe", "PPZ-220", "PPZ-220", "a batch has one recipe" },
        { "unknown recipe version", Benzocaine, 2, "recipe_version", "7", "7", "no version 7" },
        { "unknown step of a two-step recipe", Benzocaine, 2, "step", "S3", "S3", "no step 'S3'" },
        { "unknown step of a one-step recipe", Benzamide, 4, "step", "S2", "S2", "no step 'S2'" },
        { "unknown unit kgs", Benzamide, 4, "unit", "kgs", "kgs", "unknown unit" },
        { "volume unit", Benzamide, 7, "unit", "L", "L", "unknown unit" },
        { "negative quantity", Benzamide, 4, "quantity", "-154.0", "-154.0", "negative" },
        { "NaN", Benzamide, 4, "quantity", "NaN", "NaN", "finite" },
        { "Infinity", Benzamide, 4, "quantity", "Infinity", "Infinity", "finite" },
        { "negative Infinity", Benzamide, 4, "quantity", "-Infinity", "-Infinity", "finite" },
        { "overflowing exponent", Benzamide, 4, "quantity", "1e999", "1e999", "finite" },
        // Errors quote a value by its first 80 characters (docs/export-format.md, "Limits").
        { "overflowing digits", Benzamide, 4, "quantity", "1" + new string('0', 400), "1" + new string('0', 79) + "...", "finite" },
        { "NaN assay", Benzamide, 4, "assay_pct", "NaN", "NaN", "finite" },
        { "assay above 100", Benzamide, 4, "assay_pct", "994", "994", "at most 100" },
        { "assay just above 100", Benzamide, 4, "assay_pct", "100.01", "100.01", "at most 100" },
        { "assay of zero", Benzamide, 4, "assay_pct", "0", "0", "more than 0" },
        { "negative assay", Benzamide, 4, "assay_pct", "-5", "-5", "more than 0" },
        { "analysis naming no stream", Benzamide, 11, "stream", "", "", "must name the stream" },
        { "analysis naming a stream that does not exist", Benzamide, 11, "stream", "organic layer", "organic layer", "'organic layer'" },
    };

    [Theory]
    [MemberData(nameof(BadFields))]
    public async Task A_bad_field_quarantines_the_file_and_the_report_names_line_and_column(
        string kind, string sample, int line, string column, string raw, string value, string reason)
    {
        using var temp = new TempFolder("brc-quarantine");
        var export = ExportText.FromSample(sample).WithField(line, column, raw);

        await AssertQuarantinedAsync(temp, export, $"bad-{kind.Replace(' ', '-')}.csv", line, column, value, reason);
    }

    [Fact]
    public async Task A_semicolon_delimited_file_is_quarantined_naming_the_header_and_the_delimiter()
    {
        using var temp = new TempFolder("brc-quarantine");
        var export = ExportText.FromSample(Benzamide).WithDelimiter(';');

        // The header line as a whole is at fault, so no single column is named (the report shows '-').
        var errors = await AssertQuarantinedAsync(temp, export, "semicolons.csv", 1, "", export.Line(1), "semicolon", batchIds: ["KB3-NB-0158"]);
        Assert.Single(errors);
        Assert.Contains("re-export", errors[0].Message, StringComparison.OrdinalIgnoreCase);
    }

    [Fact]
    public async Task An_unquoted_decimal_comma_is_refused_on_its_line_not_guessed()
    {
        // 154,0 without quotes splits into two fields: the row no longer fits the header. The program
        // cannot know which column was meant, so it names the line and says what to do.
        using var temp = new TempFolder("brc-quarantine");
        var export = ExportText.FromSample(Benzamide).WithField(4, "quantity", "154,0");

        var errors = await AssertQuarantinedAsync(temp, export, "unquoted-comma.csv", 4, "", null, "double quotes");
        Assert.Single(errors);
    }

    [Fact]
    public async Task One_bad_batch_among_good_ones_quarantines_the_whole_file_and_stores_none_of_them()
    {
        using var temp = new TempFolder("brc-quarantine");
        var sample = ExportText.FromSample(Benzamide);
        var bad = sample.WithBatchId("E2E-MIX-2");
        var badLine = sample.LineCount + 3; // the benzylamine charge (line 4 of its own file) of the second batch
        var export = sample.WithBatchId("E2E-MIX-1")
            .Then(bad)
            .Then(sample.WithBatchId("E2E-MIX-3"));
        export = export.WithField(badLine, "unit", "kgs");
        Assert.Equal(["E2E-MIX-1", "E2E-MIX-2", "E2E-MIX-3"], export.BatchIds);
        Assert.Contains(badLine, export.LinesOf("E2E-MIX-2"));

        var errors = await AssertQuarantinedAsync(temp, export, "three-batches-one-bad.csv", badLine, "unit", "kgs", "unknown unit");
        Assert.Single(errors);
    }

    [Fact]
    public async Task Every_problem_of_the_file_is_listed_not_only_the_first()
    {
        // The shift-C export of 25 Nov: KB3-NB-0162 has an unknown material TOL-R, an assay of 994 and
        // the unit kgs, KB3-NB-0161 is correct (sample-data/README.md, "The week").
        using var temp = new TempFolder("brc-quarantine");
        var name = "2026-11-25T0552_KB3-shift-C-export.csv";
        var export = ExportText.FromSample(name);
        Assert.Equal(["KB3-NB-0161", "KB3-NB-0162"], export.BatchIds);

        var errors = await AssertQuarantinedAsync(temp, export, name, 25, "material", "TOL-R", "unknown material");
        Assert.Equal(
            new[] { (25, "material", "TOL-R"), (27, "assay_pct", "994"), (30, "unit", "kgs") },
            errors.Select(e => (e.Line, e.Column, e.Value)).ToArray());
        var report = File.ReadAllText(Path.Combine(temp.Sub("data", "quarantine"), name + ".report.txt"));
        Assert.Contains("| 27 | assay_pct | 994 |", report, StringComparison.Ordinal);
        Assert.Contains("| 30 | unit | kgs |", report, StringComparison.Ordinal);
    }

    /// <summary>
    /// Ingests <paramref name="export"/> as <paramref name="fileName"/> into a fresh data folder and checks
    /// the whole quarantine contract; returns the errors of the JSON entry for further checks.
    /// </summary>
    /// <param name="value">The value the error quotes, or null not to check it.</param>
    internal static async Task<IReadOnlyList<IngestReport.Problem>> AssertQuarantinedAsync(
        TempFolder temp, ExportText export, string fileName, int line, string column, string? value, string reason, IReadOnlyList<string>? batchIds = null)
    {
        var drop = temp.Sub("drop");
        Directory.CreateDirectory(drop);
        var source = Path.Combine(drop, fileName);
        export.WriteTo(source);
        var data = new DataRoot(temp.Sub("data"));

        var result = await ProgramRunner.RunAsync("ingest", source, "--json", "--data", data.Path);

        Assert.True(result.ExitCode == 3, $"exit {result.ExitCode}, expected 3; stderr:\n{result.Stderr}");
        var entry = Assert.Single(IngestReport.ParseAll(result.Stdout));
        Assert.Equal(fileName, entry.File);
        Assert.Equal("quarantined", entry.Outcome);
        Assert.Empty(entry.Batches);
        Assert.Equal(Convert.ToHexStringLower(SHA256.HashData(export.Bytes)), entry.Sha256);
        var located = entry.Errors.Where(e => e.Line == line && e.Column == column).ToList();
        Assert.True(located.Count > 0, $"no error at line {line} column '{column}'; errors:\n{string.Join("\n", entry.Errors)}");
        Assert.Contains(located, e => e.Message.Contains(reason, StringComparison.OrdinalIgnoreCase) && (value is null || e.Value == value));

        // The original, byte for byte, in quarantine with the report beside it; nothing in the archive.
        Assert.False(File.Exists(source), "the file was left where it was");
        var quarantined = Path.Combine(data.Quarantine, fileName);
        Assert.Equal(export.Bytes, File.ReadAllBytes(quarantined));
        var report = File.ReadAllText(quarantined + ".report.txt");
        var columnCell = column.Length > 0 ? column : "-";
        Assert.Contains($"| {line} | {columnCell} |", report, StringComparison.Ordinal);
        Assert.Contains(located[0].Message, report, StringComparison.Ordinal);
        Assert.Contains(fileName, report, StringComparison.Ordinal);
        Assert.Empty(data.ArchivedFiles());

        // Nothing stored: no batch of the file can be shown, and the batch tables are empty.
        foreach (var batch in batchIds ?? export.BatchIds)
        {
            var show = await ProgramRunner.RunAsync("batches", "show", batch, "--data", data.Path);
            Assert.True(show.ExitCode == 2, $"batches show {batch}: exit {show.ExitCode}, expected 2 (not stored); stdout:\n{show.Stdout}");
            Assert.Contains("not stored", show.Stderr, StringComparison.Ordinal);
        }

        Assert.Equal(0, data.StoredRowCount());
        var log = Assert.Single(data.Rows("SELECT file_name, outcome, error_count, batch_count FROM ingest_log"));
        Assert.Equal([fileName, "quarantined", entry.Errors.Count.ToString(System.Globalization.CultureInfo.InvariantCulture), "0"], log);
        return entry.Errors;
    }
}
