using System.Buffers;
using System.IO.Compression;
using System.Text.Encodings.Web;
using System.Text.Json;

namespace BatchReconcile.Storage.Sql;

/// <summary>
/// The rows of one batch revision as read from its file (table <c>raw_rows</c>): the header, a JSON
/// array of column names in file order, and the lines, a JSON array of
/// <c>[line number, value, value, ...]</c> with one value per header column, compressed with zlib
/// (RFC 1950) because it is most of what the database holds.
/// </summary>
/// <remarks>
/// One record per revision rather than one per row: a batch's rows come from one file and share its
/// header, so the names are stored once, and storing a batch takes one statement instead of one per
/// row. Should a row ever have a column the first did not, the header grows and earlier lines are
/// shorter; a null value is a column the row did not have (a read value is never null). The JSON is
/// written with relaxed escaping (non-ASCII letters and <c>+</c> as they are): it is never placed in HTML.
/// </remarks>
internal static class RawRowsJson
{
    private static readonly JsonSerializerOptions RelaxedOptions = new() { Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping };

    private static readonly JsonWriterOptions Relaxed = new() { Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping };

    public static RawRowsText Encode<TRow>(IReadOnlyList<TRow> rows, Func<TRow, int> line, Func<TRow, IReadOnlyList<KeyValuePair<string, string>>> fields)
    {
        var header = new List<string>();
        var position = new Dictionary<string, int>(StringComparer.Ordinal);
        var buffer = new ArrayBufferWriter<byte>(256 + (rows.Count * 128));
        using (var writer = new Utf8JsonWriter(buffer, Relaxed))
        {
            writer.WriteStartArray();
            foreach (var row in rows)
            {
                var values = fields(row);
                writer.WriteStartArray();
                writer.WriteNumberValue(line(row));
                if (header.Count == 0)
                {
                    // The first row defines the header, as written (a repeated name stays repeated).
                    header.AddRange(values.Select(v => v.Key));
                }

                if (SameNames(header, values))
                {
                    foreach (var value in values)
                    {
                        writer.WriteStringValue(value.Value);
                    }
                }
                else
                {
                    WriteByName(writer, header, position, values);
                }

                writer.WriteEndArray();
            }

            writer.WriteEndArray();
        }

        using var compressed = new MemoryStream(buffer.WrittenCount / 3);
        using (var zlib = new ZLibStream(compressed, CompressionLevel.Fastest, leaveOpen: true))
        {
            zlib.Write(buffer.WrittenSpan);
        }

        return new RawRowsText(JsonSerializer.Serialize(header, RelaxedOptions), rows.Count, compressed.ToArray());
    }

    public static IReadOnlyList<(int Line, IReadOnlyList<KeyValuePair<string, string>> Fields)> Decode(string headerJson, byte[] compressedLines)
    {
        var header = JsonSerializer.Deserialize<string[]>(headerJson) ?? [];
        using var json = new MemoryStream();
        using (var zlib = new ZLibStream(new MemoryStream(compressedLines, writable: false), CompressionMode.Decompress))
        {
            zlib.CopyTo(json);
        }

        using var lines = JsonDocument.Parse(json.GetBuffer().AsMemory(0, (int)json.Length));
        var result = new List<(int, IReadOnlyList<KeyValuePair<string, string>>)>(lines.RootElement.GetArrayLength());
        foreach (var row in lines.RootElement.EnumerateArray())
        {
            var fields = new List<KeyValuePair<string, string>>(header.Length);
            var lineNumber = 0;
            var index = -1;
            foreach (var value in row.EnumerateArray())
            {
                if (index < 0)
                {
                    lineNumber = value.GetInt32();
                }
                else if (value.ValueKind != JsonValueKind.Null)
                {
                    fields.Add(new KeyValuePair<string, string>(header[index], value.GetString()!));
                }

                index++;
            }

            result.Add((lineNumber, fields));
        }

        return result;
    }

    // The common case, every row under the first row's header, costs one comparison per column (the
    // names are usually the same string instances, read once from the file's header).
    private static bool SameNames(List<string> header, IReadOnlyList<KeyValuePair<string, string>> values)
    {
        if (header.Count != values.Count)
        {
            return false;
        }

        for (var i = 0; i < values.Count; i++)
        {
            if (!string.Equals(header[i], values[i].Key, StringComparison.Ordinal))
            {
                return false;
            }
        }

        return true;
    }

    private static void WriteByName(Utf8JsonWriter writer, List<string> header, Dictionary<string, int> position, IReadOnlyList<KeyValuePair<string, string>> values)
    {
        if (position.Count != header.Count)
        {
            position.Clear();
            for (var i = 0; i < header.Count; i++)
            {
                position.TryAdd(header[i], i);
            }
        }

        var slots = new string?[header.Count + values.Count];
        foreach (var (name, value) in values)
        {
            if (!position.TryGetValue(name, out var at))
            {
                at = header.Count;
                header.Add(name);
                position[name] = at;
            }

            slots[at] = value;
        }

        for (var i = 0; i < header.Count; i++)
        {
            if (slots[i] is { } text)
            {
                writer.WriteStringValue(text);
            }
            else
            {
                writer.WriteNullValue();
            }
        }
    }
}

/// <summary>A revision's raw rows as stored (<see cref="RawRowsJson"/>): the header, how many lines, and the lines compressed.</summary>
internal sealed record RawRowsText(string Header, int LineCount, byte[] Lines)
{
    public static RawRowsText Of(IReadOnlyList<Records.Exports.RecordRow> rows) => RawRowsJson.Encode(rows, r => r.Line, r => r.Raw);
}
