using System.Globalization;
using System.Text;
using BatchReconcile.Records.Exports;
using BatchReconcile.Records.Exports.Reading;

namespace BatchReconcile.Records.Tests.Exports;

/// <summary>
/// A small file already in memory is read in one pass (<see cref="ExportReader.Scan(byte[], string, Definitions.ProcessCatalog, TimeZoneInfo, Action{BatchRecord})"/>);
/// what it finds must be what the two-pass read of the same bytes from disk finds: the same batches in the same
/// order when the file is valid, the same errors when it is not.
/// </summary>
public sealed class ExportReaderInMemoryTests
{
    private static readonly string Header = ExportCsv.Header;

    private static string Row(string batch, int i, string unit = "kg", string material = "NBA") =>
        string.Create(CultureInfo.InvariantCulture, $"{batch},EST-7,1,S1,charge,{material},,{i}.000,{unit},,L-{i},2026-11-24T08:{i:D2}:00+01:00");

    private static IEnumerable<string> Batch(string id)
    {
        for (var i = 1; i <= 8; i++)
        {
            yield return Row(id, i);
        }

        yield return $"{id},EST-7,1,S1,product,ENB,,30,kg,,,";
        yield return $"{id},EST-7,1,S1,waste,,mother liquor,6000,g,,,";
    }

    public static TheoryData<string, byte[]> Files()
    {
        static byte[] Text(IEnumerable<string> rows) => Encoding.UTF8.GetBytes(string.Join("\r\n", rows.Prepend(Header)) + "\r\n");
        var one = Batch("AP-000001").ToList();
        var two = Batch("AP-000002").ToList();
        var interleaved = one.Zip(two).SelectMany(p => new[] { p.First, p.Second }).ToList();
        var badUnit = one.Select((r, i) => i == 3 ? r.Replace(",kg,", ",kgs,", StringComparison.Ordinal) : r).ToList();
        var unknownMaterial = one.Concat(two).Select((r, i) => i == 12 ? r.Replace("NBA", "NBQ", StringComparison.Ordinal) : r).ToList();
        var notUtf8 = Text(one).ToList();
        notUtf8.InsertRange(Header.Length + 12, new byte[] { 0xC3, 0x28 });
        var nul = Text(one).ToList();
        nul.Insert(Header.Length + 20, 0);
        return new TheoryData<string, byte[]>
        {
            { "one batch", Text(one) },
            { "two batches", Text(one.Concat(two)) },
            { "interleaved batches", Text(interleaved) },
            { "bad unit", Text(badUnit) },
            { "unknown material in the second batch", Text(unknownMaterial) },
            { "bytes that are not UTF-8", notUtf8.ToArray() },
            { "a NUL byte", nul.ToArray() },
            { "CR-only line ends", Encoding.UTF8.GetBytes(string.Join("\r", one.Prepend(Header)) + "\r") },
            { "header only", Encoding.UTF8.GetBytes(Header + "\r\n") },
            { "empty", [] },
        };
    }

    private static string Shown(RecordRow row) => row + " | " + string.Join(";", row.Raw.Select(f => f.Key + "=" + f.Value));

    [Theory]
    [MemberData(nameof(Files))]
    public void One_pass_over_the_bytes_finds_what_two_passes_over_the_file_find(string what, byte[] content)
    {
        var path = Path.Combine(Path.GetTempPath(), $"in-memory-{Guid.NewGuid():N}.csv");
        File.WriteAllBytes(path, content);
        try
        {
            var fromDisk = new List<BatchRecord>();
            var disk = ExportReader.Scan(path, "x.csv", TestCatalog.Instance, TimeZoneInfo.Utc, fromDisk.Add);
            var inMemory = new List<BatchRecord>();
            var memory = ExportReader.Scan(content, "x.csv", TestCatalog.Instance, TimeZoneInfo.Utc, inMemory.Add);

            Assert.Equal(disk.Errors, memory.Errors);
            Assert.Equal(disk.DataRows, memory.DataRows);
            Assert.True(disk.IsValid == memory.IsValid, what);
            if (disk.IsValid)
            {
                // The two-pass read hands batches on as they end; the file's order is that of their first row.
                Assert.Equal(fromDisk.OrderBy(b => b.Rows[0].Line).Select(b => b.BatchId), inMemory.Select(b => b.BatchId));
                foreach (var (expected, actual) in fromDisk.OrderBy(b => b.Rows[0].Line).Zip(inMemory))
                {
                    // Rows compare as records except their raw fields, an array compared here by its items.
                    Assert.Equal(expected.Rows.Select(Shown), actual.Rows.Select(Shown));
                    Assert.Equal((expected.RecipeCode, expected.RecipeVersion, expected.RecipeVersionSource), (actual.RecipeCode, actual.RecipeVersion, actual.RecipeVersionSource));
                }
            }
        }
        finally
        {
            File.Delete(path);
        }
    }
}
