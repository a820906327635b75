using System.Text;
using BatchReconcile.Records.Exports.Reading;

namespace BatchReconcile.Records.Tests.Exports;

/// <summary>Hostile and broken input (issue 10, items 4 to 8): huge numbers, huge fields, control
/// characters, encodings the contract does not allow, and files that are not text at all. Each is a
/// contract error with its line (and column where there is one), never an internal error.</summary>
public class ExportHostileInputTests
{
    // Line 2 is a good row of batch B1; the row under test is line 3.
    private static ExportReadResult ReadWithGoodRowFirst(string badRow) =>
        ExportCsv.Read(ExportCsv.File(ExportCsv.GoodBatch("B1")[3], badRow));

    // ---- item 4: huge finite quantities ----

    public static TheoryData<string, string, bool> Quantities => new()
    {
        // The bound is 1,000,000 kg per row after conversion (ExportLimits.MaxRowKilograms).
        { "1000", "t", true },
        { "1000.001", "t", false },
        { "1000000", "kg", true },
        { "1000000.5", "kg", false },
        // 2,204,700 lb = 1,000,022.3 kg (1 lb = 0.45359237 kg exactly, international yard and pound agreement, 1959).
        { "2204700", "lb", false },
        { "999999999999", "mg", true },
        { "1" + new string('0', 308), "t", false }, // 1e308 t overflows to infinity in kg
        { "1" + new string('0', 308), "kg", false }, // finite, but sums of such rows would not be
    };

    [Theory]
    [MemberData(nameof(Quantities))]
    public void A_quantity_beyond_1000_t_per_row_is_a_contract_error_on_its_line_and_column(string quantity, string unit, bool accepted)
    {
        var result = ReadWithGoodRowFirst($"B1,EST-7,1,S1,charge,NBA,,{quantity},{unit},,,");

        if (accepted)
        {
            Assert.True(result.IsValid, string.Join("\n", result.Errors));
            return;
        }

        var error = Assert.Single(result.Errors);
        Assert.Equal((3, "quantity"), (error.Line, error.Column));
        Assert.Contains("1,000 t", error.Reason, StringComparison.Ordinal);
        Assert.True(error.Value.Length <= ExportLimits.QuotedValueChars + 3, error.Value);
    }

    // ---- item 5: huge fields and lines ----

    [Fact]
    public void A_field_longer_than_1000_characters_is_refused_and_quoted_by_a_short_prefix_only()
    {
        var lot = new string('L', ExportLimits.MaxFieldChars + 1);

        var result = ReadWithGoodRowFirst($"B1,EST-7,1,S1,charge,NBA,,100,kg,,{lot},");

        var error = Assert.Single(result.Errors);
        Assert.Equal((3, "lot"), (error.Line, error.Column));
        Assert.Contains("1,001 characters", error.Reason, StringComparison.Ordinal);
        Assert.Equal(ExportLimits.QuotedValueChars + 3, error.Value.Length);
        Assert.True(error.ToString().Length < 400, error.ToString());
    }

    [Fact]
    public void A_field_of_exactly_1000_characters_is_allowed()
    {
        var lot = new string('L', ExportLimits.MaxFieldChars);

        var result = ReadWithGoodRowFirst($"B1,EST-7,1,S1,charge,NBA,,100,kg,,{lot},");

        Assert.True(result.IsValid, string.Join("\n", result.Errors));
    }

    [Fact]
    public void A_header_name_longer_than_1000_characters_is_refused_not_carried_as_a_warning()
    {
        var text = ExportCsv.Header + "," + new string('n', 5000) + "\n" + ExportCsv.GoodBatch("B1")[3] + ",x\n";

        var result = ExportCsv.Read(text);

        var error = Assert.Single(result.Errors);
        Assert.Equal(1, error.Line);
        Assert.Contains("5,000 characters", error.Reason, StringComparison.Ordinal);
        Assert.True(error.ToString().Length < 400, error.ToString());
    }

    [Fact]
    public void A_64_MiB_field_on_one_line_stops_the_read_at_its_line_with_bounded_memory()
    {
        // The row starts on line 3 and is one line of 64 MiB: the line limit (1 MiB) stops it.
        var head = Encoding.UTF8.GetBytes(ExportCsv.File(ExportCsv.GoodBatch("B1")[3]) + "B1,EST-7,1,S1,charge,NBA,,100,kg,,\"");
        using var stream = new GeneratedStream(head, (byte)'x', 64L << 20, Encoding.UTF8.GetBytes("\",\n"));
        var before = GC.GetAllocatedBytesForCurrentThread();

        var result = ExportReader.Read(stream, ExportCsv.FileName, TestCatalog.Instance, TimeZoneInfo.Utc);

        var allocated = GC.GetAllocatedBytesForCurrentThread() - before;
        var error = Assert.Single(result.Errors);
        Assert.Equal(3, error.Line);
        Assert.Contains("longer than 1,048,576 bytes", error.Reason, StringComparison.Ordinal);
        Assert.True(stream.Served < 8L << 20, $"read {stream.Served:N0} bytes of a 64 MiB line");
        Assert.True(allocated < 32L << 20, $"allocated {allocated:N0} bytes for a 64 MiB line");
    }

    [Fact]
    public void A_quoted_field_of_many_short_lines_past_1_MiB_stops_the_read_where_the_row_starts()
    {
        // 40,000 lines of 80 bytes inside one quoted value: every line is short, the row is 3.2 MB.
        var head = Encoding.UTF8.GetBytes(ExportCsv.File(ExportCsv.GoodBatch("B1")[3]) + "B1,EST-7,1,S1,charge,NBA,,100,kg,,\"");
        var body = string.Concat(Enumerable.Repeat(new string('y', 79) + "\n", 40_000));
        var bytes = head.Concat(Encoding.UTF8.GetBytes(body + "\",\n")).ToArray();

        var result = ExportCsv.Read(bytes);

        var error = Assert.Single(result.Errors);
        Assert.Equal(3, error.Line);
        Assert.Contains("longer than 1 MiB", error.Reason, StringComparison.Ordinal);
    }

    // ---- item 6: control and bidirectional-control characters in identifiers ----

    public static TheoryData<string, string, string> ControlCharacters => new()
    {
        { "ESC sequence in batch", "B\u001B[31m2,EST-7,1,S1,charge,NBA,,100,kg,,,", "batch" },
        { "BEL in recipe", "B2,EST-7\u0007,1,S1,charge,NBA,,100,kg,,,", "recipe" },
        { "CR LF in a quoted batch", "\"B\r\n2\",EST-7,1,S1,charge,NBA,,100,kg,,,", "batch" },
        { "tab in step", "B2,EST-7,1,S\t1,charge,NBA,,100,kg,,,", "step" },
        { "DEL in material", "B2,EST-7,1,S1,charge,NBA\u007F,,100,kg,,,", "material" },
        { "C1 NEL in lot", "B2,EST-7,1,S1,charge,NBA,,100,kg,,L\u0085-1,", "lot" },
        { "right-to-left override in batch", "B\u202E2,EST-7,1,S1,charge,NBA,,100,kg,,,", "batch" },
        { "right-to-left mark in stream", "B2,EST-7,1,S1,waste,,mother\u200Fliquor,100,kg,,,", "stream" },
        { "first-strong isolate in lot", "B2,EST-7,1,S1,charge,NBA,,100,kg,,\u2068L-1,", "lot" },
        { "pop directional isolate in entry", "B2,EST-7,1,S1,charge\u2069,NBA,,100,kg,,,", "entry" },
    };

    [Theory]
    [MemberData(nameof(ControlCharacters))]
    public void A_control_or_bidi_character_in_an_identifier_is_a_contract_error_with_line_and_column(string kind, string badRow, string column)
    {
        var result = ReadWithGoodRowFirst(badRow);

        var error = Assert.Single(result.Errors);
        Assert.Equal((3, column), (error.Line, error.Column));
        Assert.Contains("control character U+", error.Reason, StringComparison.Ordinal);
        Assert.False(result.IsValid, kind);
    }

    [Fact]
    public void The_quarantine_report_prints_control_characters_escaped()
    {
        var result = ReadWithGoodRowFirst("B\u001B]0;owned\u0007\u202E2,EST-7,1,S1,charge,NBA,,100,kg,,,");

        var report = QuarantineReport.Render("export.csv", null, result.Errors, DateTimeOffset.UnixEpoch);

        Assert.DoesNotContain(report, c => c is '\u001B' or '\u0007' or '\u202E');
        Assert.Contains("B\\x1B]0;owned\\x07\\u202E2", report, StringComparison.Ordinal);
    }

    // ---- item 7: encodings as docs/export-format.md says ----

    [Fact]
    public void A_Latin_1_byte_in_a_header_name_is_refused_as_not_UTF_8_on_line_1()
    {
        // "recorded_at" spelt with a Latin-1 é (0xE9), which is not UTF-8 on its own.
        var bytes = Encoding.Latin1.GetBytes(ExportCsv.File(ExportCsv.GoodBatch("B1")).Replace("recorded_at", "recorded_\u00E9t", StringComparison.Ordinal));

        var result = ExportCsv.Read(bytes);

        Assert.False(result.IsValid);
        var error = Assert.Single(result.Errors, e => e.Reason.Contains("not valid UTF-8", StringComparison.Ordinal));
        Assert.Equal(1, error.Line);
    }

    [Fact]
    public void A_correctly_encoded_replacement_character_in_a_value_is_accepted()
    {
        var result = ExportCsv.Read(ExportCsv.File([.. ExportCsv.GoodBatch("B1")[..4], "B1,EST-7,1,S1,charge,NBA,,1,kg,,L-\uFFFD-2,"]));

        Assert.True(result.IsValid, string.Join("\n", result.Errors));
        Assert.Equal("L-\uFFFD-2", result.Batches.Single().Rows.Single(r => r.Line == 6).Lot);
    }

    [Theory]
    [InlineData("UTF-16 LE")]
    [InlineData("UTF-16 BE")]
    public void UTF_16_with_a_byte_order_mark_is_refused_saying_so(string encodingName)
    {
        var encoding = encodingName == "UTF-16 LE" ? new UnicodeEncoding(false, true) : new UnicodeEncoding(true, true);
        var bytes = encoding.GetPreamble().Concat(encoding.GetBytes(ExportCsv.File(ExportCsv.GoodBatch("B1")))).ToArray();

        var result = ExportCsv.Read(bytes);

        var error = Assert.Single(result.Errors);
        Assert.Equal(1, error.Line);
        Assert.Contains("UTF-16 byte-order mark", error.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void CR_only_line_ends_are_refused_saying_so()
    {
        var bytes = Encoding.UTF8.GetBytes(string.Join("\r", [ExportCsv.Header, .. ExportCsv.GoodBatch("B1")]) + "\r");

        var result = ExportCsv.Read(bytes);

        var error = Assert.Single(result.Errors);
        Assert.Equal(1, error.Line);
        Assert.Contains("CR-only line ends", error.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void A_CR_only_line_end_after_good_lines_is_reported_on_its_line()
    {
        var text = ExportCsv.File(ExportCsv.GoodBatch("B1")[..3]) + ExportCsv.GoodBatch("B1")[3] + "\r" + ExportCsv.GoodBatch("B1")[4] + "\n";

        var result = ExportCsv.Read(text);

        var error = Assert.Single(result.Errors);
        Assert.Equal(5, error.Line);
        Assert.Contains("carriage return (CR) that is not followed by LF", error.Reason, StringComparison.Ordinal);
    }

    // ---- item 8: files that are not text ----

    [Fact]
    public void Random_bytes_are_reported_as_not_text_after_reading_only_the_first_block()
    {
        var junk = new byte[16 << 20];
        new Random(20261203).NextBytes(junk);
        using var stream = new CountingStream(new MemoryStream(junk));

        var result = ExportReader.Read(stream, "junk.csv", TestCatalog.Instance, TimeZoneInfo.Utc);

        var error = Assert.Single(result.Errors);
        Assert.Equal(1, error.Line);
        Assert.Contains("not a text file", error.Reason, StringComparison.Ordinal);
        Assert.True(stream.Served < 1L << 20, $"read {stream.Served:N0} of {junk.Length:N0} bytes");
    }

    [Fact]
    public void A_file_of_NUL_bytes_is_reported_as_not_text()
    {
        var result = ExportCsv.Read(new byte[3 << 20]);

        var error = Assert.Single(result.Errors);
        Assert.Contains("not a text file", error.Reason, StringComparison.Ordinal);
    }

    /// <summary>Bytes: a head, then <c>count</c> copies of one byte, then a tail; generated as read, never held.</summary>
    private sealed class GeneratedStream(byte[] head, byte fill, long count, byte[] tail) : Stream
    {
        private readonly long _length = head.Length + count + tail.Length;

        public long Served { get; private set; }

        public override bool CanRead => true;

        public override bool CanSeek => false;

        public override bool CanWrite => false;

        public override long Length => _length;

        public override long Position { get => Served; set => throw new NotSupportedException(); }

        public override int Read(byte[] buffer, int offset, int length)
        {
            var n = 0;
            while (n < length && Served < _length)
            {
                var at = Served;
                buffer[offset + n] = at < head.Length ? head[at] : at < head.Length + count ? fill : tail[at - head.Length - count];
                n++;
                Served++;
            }

            return n;
        }

        public override void Flush()
        {
        }

        public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();

        public override void SetLength(long value) => throw new NotSupportedException();

        public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();
    }

    /// <summary>A seekable stream that counts the bytes read through it.</summary>
    private sealed class CountingStream(Stream inner) : Stream
    {
        public long Served { get; private set; }

        public override bool CanRead => true;

        public override bool CanSeek => inner.CanSeek;

        public override bool CanWrite => false;

        public override long Length => inner.Length;

        public override long Position { get => inner.Position; set => inner.Position = value; }

        public override int Read(byte[] buffer, int offset, int count)
        {
            var n = inner.Read(buffer, offset, count);
            Served += n;
            return n;
        }

        public override void Flush()
        {
        }

        public override long Seek(long offset, SeekOrigin origin) => inner.Seek(offset, origin);

        public override void SetLength(long value) => throw new NotSupportedException();

        public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();
    }
}
