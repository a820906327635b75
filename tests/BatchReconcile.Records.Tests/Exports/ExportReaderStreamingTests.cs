using System.Globalization;
using System.Text;
using BatchReconcile.Records.Exports;
using BatchReconcile.Records.Exports.Reading;

namespace BatchReconcile.Records.Tests.Exports;

/// <summary>The streaming read holds one batch at a time (contiguous batches), whatever the file size.</summary>
public class ExportReaderStreamingTests
{
    private const int RowsPerBatch = 10;

    // Each batch: 8 charges of 1..8 kg, a product of 30 kg, a waste of 6 kg; 10 rows.
    private static IEnumerable<string> GeneratedRows(int batches, bool interleavePairs)
    {
        IEnumerable<string> Batch(int b)
        {
            var id = string.Create(CultureInfo.InvariantCulture, $"AP-{b:D6}");
            for (var i = 1; i <= 8; i++)
            {
                yield return string.Create(CultureInfo.InvariantCulture, $"{id},EST-7,1,S1,charge,NBA,,{i}.000,kg,,L-{b}-{i},2026-11-24T08:{i:D2}:00+01:00");
            }

            yield return $"{id},EST-7,1,S1,product,ENB,,30,kg,,,";
            yield return $"{id},EST-7,1,S1,waste,,mother liquor,6000,g,,,";
        }

        for (var b = 0; b < batches; b += interleavePairs ? 2 : 1)
        {
            if (!interleavePairs)
            {
                foreach (var row in Batch(b))
                {
                    yield return row;
                }

                continue;
            }

            foreach (var (x, y) in Batch(b).Zip(Batch(b + 1)))
            {
                yield return x;
                yield return y;
            }
        }
    }

    private static string WriteTemp(IEnumerable<string> rows)
    {
        var path = Path.Combine(Path.GetTempPath(), $"export-{Guid.NewGuid():N}.csv");
        using var writer = new StreamWriter(path, false, new UTF8Encoding(false));
        writer.Write(ExportCsv.Header + "\r\n");
        foreach (var row in rows)
        {
            writer.Write(row);
            writer.Write("\r\n");
        }

        return path;
    }

    [Theory]
    // Interleaved pairs: the first batch of a pair is handed on at its last row, before the other's last row is read.
    [InlineData(false, 1, RowsPerBatch)]
    [InlineData(true, 2, 2 * RowsPerBatch - 1)]
    public void A_large_file_is_read_holding_only_the_open_batches(bool interleavePairs, int expectedBatchesHeld, int expectedRowsHeld)
    {
        const int batches = 5000; // 50,000 rows
        var path = WriteTemp(GeneratedRows(batches, interleavePairs));
        try
        {
            var count = 0;
            var chargedKg = 0.0;
            var outKg = 0.0;
            var ids = new HashSet<string>(StringComparer.Ordinal);
            var scan = ExportReader.Scan(path, "big.csv", TestCatalog.Instance, TimeZoneInfo.Utc, batch =>
            {
                count++;
                ids.Add(batch.BatchId);
                Assert.Equal(RowsPerBatch, batch.Rows.Count);
                chargedKg += batch.Rows.Where(r => r.Entry == EntryKind.Charge).Sum(r => r.QuantityKg!.Value);
                outKg += batch.Rows.Where(r => r.Entry != EntryKind.Charge).Sum(r => r.QuantityKg!.Value);
            });

            Assert.True(scan.IsValid, string.Join("\n", scan.Errors.Take(5)));
            Assert.Equal(batches, count);
            Assert.Equal(batches, ids.Count);
            Assert.Equal(batches * RowsPerBatch, scan.DataRows);
            Assert.Equal(batches * 36.0, chargedKg, 6); // 1 + 2 + ... + 8 kg per batch
            Assert.Equal(batches * 36.0, outKg, 6);     // 30 kg + 6000 g per batch
            Assert.Equal(expectedBatchesHeld, scan.PeakBatchesHeld);
            Assert.Equal(expectedRowsHeld, scan.PeakRowsHeld);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void An_error_late_in_a_large_file_rejects_it_and_rows_stop_being_held()
    {
        var rows = GeneratedRows(2000, interleavePairs: false).ToList();
        rows[500] = rows[500].Replace(",kg,", ",kgs,", StringComparison.Ordinal); // line 502
        rows[15_000] = rows[15_000].Replace("NBA", "NBQ", StringComparison.Ordinal); // line 15002
        var path = WriteTemp(rows);
        try
        {
            var delivered = 0;
            var scan = ExportReader.Scan(path, "big.csv", TestCatalog.Instance, TimeZoneInfo.Utc, _ => delivered++);

            Assert.Equal([(502, "unit"), (15_002, "material")], scan.Errors.Select(e => (e.Line, e.Column)));
            Assert.Equal(50, delivered); // the 50 batches before the first error; the caller discards them
            Assert.Equal(RowsPerBatch, scan.PeakRowsHeld);

            var read = ExportReader.Read(path, "big.csv", TestCatalog.Instance, TimeZoneInfo.Utc);
            Assert.Empty(read.Batches);
            Assert.Equal(scan.Errors, read.Errors);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void A_stream_that_cannot_seek_is_read_once_holding_every_batch_to_the_end()
    {
        var bytes = Encoding.UTF8.GetBytes(ExportCsv.File(GeneratedRows(20, interleavePairs: false)));
        using var stream = new ForwardOnlyStream(bytes);

        var batches = new List<BatchRecord>();
        var scan = ExportReader.Scan(stream, "pipe.csv", TestCatalog.Instance, TimeZoneInfo.Utc, batches.Add);

        Assert.True(scan.IsValid);
        Assert.Equal(20, batches.Count);
        Assert.Equal(20, scan.PeakBatchesHeld);
        Assert.Equal(Enumerable.Range(0, 20).Select(b => $"AP-{b:D6}"), batches.Select(b => b.BatchId));
    }

    [Fact]
    public void A_seekable_stream_is_read_from_its_current_position()
    {
        var prefix = Encoding.UTF8.GetBytes("not part of the export\n");
        var bytes = prefix.Concat(Encoding.UTF8.GetBytes(ExportCsv.File(ExportCsv.GoodBatch("B1")))).ToArray();
        using var stream = new MemoryStream(bytes);
        stream.Position = prefix.Length;

        var result = ExportReader.Read(stream, "s.csv", TestCatalog.Instance, TimeZoneInfo.Utc);

        Assert.Equal("B1", Assert.Single(result.Batches).BatchId);
    }

    private sealed class ForwardOnlyStream(byte[] bytes) : Stream
    {
        private readonly MemoryStream _inner = new(bytes);

        public override bool CanRead => true;

        public override bool CanSeek => false;

        public override bool CanWrite => false;

        public override long Length => throw new NotSupportedException();

        public override long Position
        {
            get => throw new NotSupportedException();
            set => throw new NotSupportedException();
        }

        public override int Read(byte[] buffer, int offset, int count) => _inner.Read(buffer, offset, count);

        public override void Flush()
        {
        }

        public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();

        public override void SetLength(long value) => throw new NotSupportedException();

        public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();

        protected override void Dispose(bool disposing)
        {
            _inner.Dispose();
            base.Dispose(disposing);
        }
    }
}
