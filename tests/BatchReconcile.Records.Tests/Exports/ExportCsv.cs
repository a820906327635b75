using System.Text;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports.Reading;

namespace BatchReconcile.Records.Tests.Exports;

/// <summary>Export files written in the tests, and reading them.</summary>
internal static class ExportCsv
{
    public const string FileName = "export.csv";

    public const string Header = "batch,recipe,recipe_version,step,entry,material,stream,quantity,unit,assay_pct,lot,recorded_at";

    /// <summary>A clean batch of step S1 (rows on lines 2 to 6 when it follows the header).</summary>
    public static string[] GoodBatch(string id) =>
    [
        $"{id},EST-7,1,S1,charge,NBA,,100.0,kg,99.5,L-1,2026-11-24T08:00:00+01:00",
        $"{id},EST-7,1,S1,charge,ETOH,,400,kg,,,",
        $"{id},EST-7,1,S1,product,ENB,,108.2,kg,,,2026-11-24T16:30:00+01:00",
        $"{id},EST-7,1,S1,waste,,mother liquor,380,kg,,,",
        $"{id},EST-7,1,S1,analysis,ENB,mother liquor,,,2.5,,",
    ];

    /// <summary>Header and rows joined with LF.</summary>
    public static string File(params IEnumerable<string> rows) => string.Join("\n", new[] { Header }.Concat(rows)) + "\n";

    public static ExportReadResult Read(string text) => Read(Encoding.UTF8.GetBytes(text));

    /// <summary>Read against <paramref name="catalog"/> with the site in <paramref name="zone"/>.</summary>
    public static ExportReadResult Read(string text, ProcessCatalog catalog, TimeZoneInfo zone)
    {
        using var stream = new MemoryStream(Encoding.UTF8.GetBytes(text));
        return ExportReader.Read(stream, FileName, catalog, zone);
    }

    public static ExportReadResult Read(byte[] bytes)
    {
        using var stream = new MemoryStream(bytes);
        return ExportReader.Read(stream, FileName, TestCatalog.Instance, TimeZoneInfo.Utc);
    }
}
