using System.Buffers;
using System.Globalization;
using System.Security.Cryptography;
using System.Text.Json;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Storage.Ingest;

/// <summary>
/// SHA-256 over the canonical form of one batch's rows: two exports of a batch with the same hash
/// say the same thing, however the files differ in layout.
/// </summary>
/// <remarks>
/// Canonical form, UTF-8, lines joined by LF:
/// <list type="number">
/// <item>the line <c>batch-content/1</c> (the form's version);</item>
/// <item>a JSON array [batch id, recipe code, recipe version in effect];</item>
/// <item>one JSON array per row [step, entry, material, stream, quantity, unit, assay %, lot,
/// recorded at], sorted by ordinal comparison of those lines.</item>
/// </list>
/// Numbers are the parsed values in shortest round-trip form (<c>1.50</c> and <c>1.5</c> are the
/// same), units lower-case as the contract spells them, times converted to UTC, absent values null.
/// Left out on purpose: line numbers, column order, quoting, line ends, columns outside the
/// contract, and the order of rows (a sum does not depend on it). A change to any contract value
/// makes a new revision; so does a change of recipe version, since it changes the reconciliation.
/// <para>Written with <see cref="Utf8JsonWriter"/> and its default encoder, which escapes everything
/// outside printable ASCII, so each line is ASCII and ordinal order of the bytes is ordinal order of the
/// text. The bytes are those the first implementation (JsonSerializer over object arrays) produced; the
/// tests pin hashes it computed, since stored revisions are compared with new exports by this hash.</para>
/// </remarks>
public static class BatchContentHash
{
    private static ReadOnlySpan<byte> FormVersion => "batch-content/1"u8;

    // The entry's name in lower case, made once rather than for every row.
    private static readonly Dictionary<EntryKind, string> EntryNames =
        Enum.GetValues<EntryKind>().ToDictionary(k => k, k => k.ToString().ToLowerInvariant());

    public static string Compute(BatchRecord batch)
    {
        ArgumentNullException.ThrowIfNull(batch);
        var buffer = new ArrayBufferWriter<byte>(256 + (batch.Rows.Count * 160));
        using var writer = new Utf8JsonWriter(buffer);

        writer.WriteStartArray();
        writer.WriteStringValue(batch.BatchId);
        writer.WriteStringValue(batch.RecipeCode);
        writer.WriteNumberValue(batch.RecipeVersion);
        writer.WriteEndArray();
        writer.Flush();
        var identity = buffer.WrittenCount;

        // Each row's line is written after the previous one into the same buffer; only their bounds are kept.
        var lines = new (int Start, int Length)[batch.Rows.Count];
        for (var i = 0; i < lines.Length; i++)
        {
            writer.Reset();
            var start = buffer.WrittenCount;
            WriteRow(writer, batch.Rows[i]);
            writer.Flush();
            lines[i] = (start, buffer.WrittenCount - start);
        }

        var written = buffer.WrittenMemory;
        Array.Sort(lines, (a, b) => written.Span.Slice(a.Start, a.Length).SequenceCompareTo(written.Span.Slice(b.Start, b.Length)));

        using var hash = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);
        hash.AppendData(FormVersion);
        hash.AppendData("\n"u8);
        hash.AppendData(written.Span[..identity]);
        foreach (var (start, length) in lines)
        {
            hash.AppendData("\n"u8);
            hash.AppendData(written.Span.Slice(start, length));
        }

        return Convert.ToHexStringLower(hash.GetHashAndReset());
    }

    private static void WriteRow(Utf8JsonWriter writer, RecordRow row)
    {
        writer.WriteStartArray();
        writer.WriteStringValue(row.Step);
        writer.WriteStringValue(EntryNames[row.Entry]);
        WriteTextOrNull(writer, row.Material);
        WriteTextOrNull(writer, row.Stream);
        WriteTextOrNull(writer, Number(row.Quantity));
        WriteTextOrNull(writer, row.Unit?.Symbol.ToLowerInvariant());
        WriteTextOrNull(writer, Number(row.AssayPct));
        WriteTextOrNull(writer, row.Lot);
        WriteTextOrNull(writer, row.RecordedAt?.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss.fffffff'Z'", CultureInfo.InvariantCulture));
        writer.WriteEndArray();
    }

    private static void WriteTextOrNull(Utf8JsonWriter writer, string? value)
    {
        if (value is null)
        {
            writer.WriteNullValue();
        }
        else
        {
            writer.WriteStringValue(value);
        }
    }

    private static string? Number(double? value) => value?.ToString("R", CultureInfo.InvariantCulture);
}
