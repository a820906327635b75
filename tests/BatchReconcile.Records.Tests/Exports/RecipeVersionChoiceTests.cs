using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Records.Tests.Exports;

/// <summary>
/// An export without recipe_version gets the version in effect on the local calendar date (site time zone) of
/// the batch's earliest recorded_at; where no effective date decides it, the newest, stated (docs/export-format.md).
/// </summary>
/// <remarks>
/// Daylight-saving dates of Europe/Berlin (EU rule, Directive 2000/84/EC: last Sunday of March and of October at
/// 01:00 UTC): 2026-03-29 (CET +01:00 to CEST +02:00) and 2026-10-25 (CEST +02:00 back to CET +01:00).
/// </remarks>
public class RecipeVersionChoiceTests
{
    private static readonly TimeZoneInfo Berlin = TimeZoneInfo.FindSystemTimeZoneById("Europe/Berlin");

    public static TheoryData<string, string, string, string, int, RecipeVersionSource> Cases => new()
    {
        // case, v1 from, v2 from, first recorded_at, expected version, how chosen
        { "well before v2", "2026-01-01", "2026-03-10", "2026-02-15T08:00:00+01:00", 1, RecipeVersionSource.EffectiveDate },
        { "on v2's first day", "2026-01-01", "2026-03-10", "2026-03-10T08:00:00+01:00", 2, RecipeVersionSource.EffectiveDate },
        { "last minute before v2, local", "2026-01-01", "2026-03-10", "2026-03-09T23:59:00+01:00", 1, RecipeVersionSource.EffectiveDate },
        // 23:30 UTC on the 9th is 00:30 on the 10th in Berlin: the local date decides, not the UTC date.
        { "UTC date is the day before", "2026-01-01", "2026-03-10", "2026-03-09T23:30:00Z", 2, RecipeVersionSource.EffectiveDate },
        // Spring forward: local midnight of 2026-03-29 is still CET, 23:00 UTC on the 28th.
        { "spring night, first instant of the day", "2026-01-01", "2026-03-29", "2026-03-28T23:00:00Z", 2, RecipeVersionSource.EffectiveDate },
        { "spring night, last second before", "2026-01-01", "2026-03-29", "2026-03-28T22:59:59Z", 1, RecipeVersionSource.EffectiveDate },
        // Fall back: local midnight of 2026-10-25 is still CEST, 22:00 UTC on the 24th; a fixed +01:00 would say 23:00 on the 24th.
        { "autumn night, first instant of the day", "2026-01-01", "2026-10-25", "2026-10-24T22:00:00Z", 2, RecipeVersionSource.EffectiveDate },
        { "autumn night, written with the summer offset", "2026-01-01", "2026-10-25", "2026-10-25T00:30:00+02:00", 2, RecipeVersionSource.EffectiveDate },
        { "autumn night, last second before", "2026-01-01", "2026-10-25", "2026-10-24T21:59:59Z", 1, RecipeVersionSource.EffectiveDate },
        // Only v2 dated: before it nothing is in effect, so the newest is used and said so.
        { "before every effective date", "", "2026-03-10", "2026-03-01T08:00:00+01:00", 2, RecipeVersionSource.Newest },
        { "no version dated", "", "", "2026-03-01T08:00:00+01:00", 2, RecipeVersionSource.Newest },
        { "v1 dated only, after it", "2026-01-01", "", "2026-05-01T08:00:00+02:00", 1, RecipeVersionSource.EffectiveDate },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void The_version_in_effect_on_the_local_date_of_the_first_recorded_time_is_used(
        string name, string v1From, string v2From, string firstRecorded, int version, RecipeVersionSource source)
    {
        _ = name;
        var catalog = Dated(v1From, v2From);

        // The later row comes first in the file: "first recorded" is by instant, not by line.
        var result = ExportCsv.Read(ExportCsv.File(
            "B1,EST-7,,S1,product,ENB,,108,kg,,,2026-12-31T12:00:00+01:00",
            $"B1,EST-7,,S1,charge,NBA,,100,kg,,,{firstRecorded}"), catalog, Berlin);

        var batch = Assert.Single(result.Batches);
        Assert.Equal((version, source), (batch.RecipeVersion, batch.RecipeVersionSource));
    }

    [Fact]
    public void Without_any_recorded_time_the_newest_is_used_and_said()
    {
        var result = ExportCsv.Read(ExportCsv.File("B1,EST-7,,S1,charge,NBA,,100,kg,,,"), Dated("2026-01-01", "2026-03-10"), Berlin);

        var batch = Assert.Single(result.Batches);
        Assert.Equal((2, RecipeVersionSource.Newest, (DateOnly?)null), (batch.RecipeVersion, batch.RecipeVersionSource, batch.FirstRecordedDate));
    }

    [Fact]
    public void A_version_given_by_the_export_wins_over_the_dates_and_rows_without_one_take_it()
    {
        // 2026-05-01 is in v2's time, but the export says version 1 on its first row.
        var result = ExportCsv.Read(ExportCsv.File(
            "B1,EST-7,1,S1,charge,NBA,,100,kg,,,2026-05-01T08:00:00+02:00",
            "B1,EST-7,,S1,product,ENB,,108,kg,,,"), Dated("2026-01-01", "2026-03-10"), Berlin);

        var batch = Assert.Single(result.Batches);
        Assert.Equal((1, RecipeVersionSource.Export), (batch.RecipeVersion, batch.RecipeVersionSource));
    }

    [Fact]
    public void A_row_without_a_version_naming_a_step_the_chosen_version_lacks_is_an_error_on_its_line()
    {
        // S3 exists only in v2; on 2026-02-15 v1 is in effect.
        var result = ExportCsv.Read(ExportCsv.File(
            "B1,EST-7,,S1,charge,NBA,,100,kg,,,2026-02-15T08:00:00+01:00",
            "B1,EST-7,,S3,charge,BZC,,70,kg,,,"), Dated("2026-01-01", "2026-03-10"), Berlin);

        var error = Assert.Single(result.Errors);
        Assert.Equal((3, "step", "S3"), (error.Line, error.Column, error.Value));
        Assert.Contains("recipe EST-7 version 1 (in effect on 2026-02-15", error.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void A_step_of_no_version_is_refused_at_once()
    {
        var result = ExportCsv.Read(ExportCsv.File("B1,EST-7,,S9,charge,NBA,,100,kg,,,"), Dated("2026-01-01", "2026-03-10"), Berlin);

        var error = Assert.Single(result.Errors);
        Assert.Equal((2, "step"), (error.Line, error.Column));
        Assert.Contains("recipe EST-7 has no step 'S9' in any version", error.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void The_step_of_a_row_without_a_version_is_spelled_as_the_chosen_version_spells_it()
    {
        var result = ExportCsv.Read(ExportCsv.File("B1,est-7,,s1,charge,NBA,,100,kg,,,2026-05-01T08:00:00+02:00"), Dated("2026-01-01", "2026-03-10"), Berlin);

        var row = Assert.Single(Assert.Single(result.Batches).Rows);
        Assert.Equal(("EST-7", "S1"), (row.Recipe, row.Step));
    }

    private static ProcessCatalog Dated(string v1, string v2)
    {
        static DateOnly? Date(string text) => text.Length == 0 ? null : DateOnly.ParseExact(text, "yyyy-MM-dd", System.Globalization.CultureInfo.InvariantCulture);
        var source = TestCatalog.Instance;
        return new ProcessCatalog(
            source.Materials,
            source.Recipes.Select(r => r.Code == "EST-7" ? r with { EffectiveFrom = Date(r.Version == 1 ? v1 : v2) } : r));
    }
}
