using BatchReconcile.Records.Exports;
using BatchReconcile.Records.Exports.Reading;

namespace BatchReconcile.Records.Tests.Exports;

public class QuarantineReportTests
{
    private static readonly DateTimeOffset At = new(2026, 11, 24, 14, 5, 0, TimeSpan.FromHours(1));

    [Fact]
    public void The_report_says_what_file_when_how_many_problems_each_located_and_what_to_do()
    {
        var result = ExportCsv.Read(ExportCsv.File(
            "B1,EST-7,1,S1,charge,NBA,,\"100,5\",kg,,,",
            "B1,EST-7,1,S1,charge,NBQ,,100,kg,,,"));

        var report = QuarantineReport.Render("export.csv", "ab12cd", result.Errors, At);

        Assert.Contains("export.csv", report, StringComparison.Ordinal);
        Assert.Contains("SHA-256: ab12cd", report, StringComparison.Ordinal);
        Assert.Contains("Quarantined at: 2026-11-24T14:05:00+01:00", report, StringComparison.Ordinal);
        Assert.Contains("Problems: 2", report, StringComparison.Ordinal);
        Assert.Contains("| 2 | quantity | 100,5 | a comma is not allowed in a number", report, StringComparison.Ordinal);
        Assert.Contains("| 3 | material | NBQ | unknown material 'NBQ'", report, StringComparison.Ordinal);
        Assert.Contains("Nothing from this file was stored", report, StringComparison.Ordinal);
        Assert.Contains("export the file again", report, StringComparison.Ordinal);
    }

    [Fact]
    public void Values_cannot_break_the_table()
    {
        var errors = new[] { new ExportError("f.csv", 4, "lot", "a|b\nc", "bad") };

        var report = QuarantineReport.Render("f.csv", null, errors, At);

        Assert.Contains("| 4 | lot | a\\|b\u21B5c | bad |", report, StringComparison.Ordinal);
        Assert.DoesNotContain("SHA-256", report, StringComparison.Ordinal);
    }

    [Fact]
    public void A_capped_list_says_that_more_were_found()
    {
        var rows = Enumerable.Range(0, ExportReader.MaxErrors + 5).Select(_ => "B1,EST-7,1,S1,charge,NBA,,x,kg,,,");
        var errors = ExportCsv.Read(ExportCsv.File(rows)).Errors;

        var report = QuarantineReport.Render("f.csv", null, errors, At);

        Assert.Contains("Problems: 1000 listed, more not listed", report, StringComparison.Ordinal);
        Assert.Contains("... and 5 more problems not listed", report, StringComparison.Ordinal);
        Assert.Equal(ExportReader.MaxErrors, report.Split('\n').Count(l => l.StartsWith("| ", StringComparison.Ordinal)) - 1);
    }
}
