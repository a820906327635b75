using System.Text.Json;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Storage.Sql;

/// <summary>The JSON held in text columns: equivalents, loss ladders and audit details (raw rows: <see cref="RawRowsJson"/>).</summary>
internal static class StoreJson
{
    private static readonly JsonSerializerOptions Options = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
        WriteIndented = false,
    };

    public static string Equivalents(IReadOnlyDictionary<string, double> equivalents) =>
        JsonSerializer.Serialize(equivalents.OrderBy(e => e.Key, StringComparer.Ordinal).ToDictionary(e => e.Key, e => e.Value), Options);

    // "{}" and "[]" are what StepsOfRecipe reads for the parts it was not asked for, once per row: not worth the parser.
    public static IReadOnlyDictionary<string, double> ParseEquivalents(string json) =>
        json == "{}" ? new Dictionary<string, double>() : JsonSerializer.Deserialize<Dictionary<string, double>>(json, Options) ?? [];

    /// <summary>Allowed equivalents by reagent, {"CODE":{"min":1.05,"max":1.2}}, in code order.</summary>
    public static string EquivalentsRanges(IReadOnlyDictionary<string, ValueRange> ranges) =>
        JsonSerializer.Serialize(ranges.OrderBy(e => e.Key, StringComparer.Ordinal).ToDictionary(e => e.Key, e => e.Value), Options);

    /// <summary>Null (unknown) stays null; "{}" is a step with no ranges.</summary>
    public static IReadOnlyDictionary<string, ValueRange>? ParseEquivalentsRanges(string? json) =>
        json is null ? null : JsonSerializer.Deserialize<Dictionary<string, ValueRange>>(json, Options) ?? [];

    public static string Ladder(IReadOnlyList<LadderRung> ladder) => JsonSerializer.Serialize(ladder, Options);

    public static IReadOnlyList<LadderRung> ParseLadder(string json) =>
        json == "[]" ? [] : JsonSerializer.Deserialize<List<LadderRung>>(json, Options) ?? [];

    public static string Links(IReadOnlyList<IntermediateLink> links) => JsonSerializer.Serialize(links, Options);

    /// <summary>The stored links; null when the revision was stored before links were kept (migration 7).</summary>
    public static IReadOnlyList<IntermediateLink>? ParseLinks(string? json) =>
        json is null ? null : JsonSerializer.Deserialize<List<IntermediateLink>>(json, Options) ?? [];

    /// <summary>One row as schema versions 1 to 4 stored it: [name, value] pairs in header order (read by migration 5).</summary>
    public static IReadOnlyList<KeyValuePair<string, string>> ParseRawFields(string json) =>
        (JsonSerializer.Deserialize<List<string[]>>(json, Options) ?? [])
            .Select(p => new KeyValuePair<string, string>(p[0], p[1]))
            .ToList();

    public static string Detail(object detail) => JsonSerializer.Serialize(detail, Options);

    /// <summary>
    /// The detail of a stored file's entry (<c>ingest.stored</c>, <c>ingest.revision</c>, ...), written directly: it is
    /// written once per file, and serialising anonymous objects cost more than the rest of the entry. The text is what
    /// <see cref="Detail"/> writes for <c>new { file, sha256, batches = [{ batch, disposition, revision }], batchCount, batchesNotListed }</c>
    /// (the last two only when some batches are not listed), so entries read the same whichever wrote them.
    /// </summary>
    public static string FileDetail(string file, string sha256, IEnumerable<(string Batch, string Disposition, int Revision)> listed, int? batchCount, int? notListed)
    {
        var buffer = new System.Buffers.ArrayBufferWriter<byte>(256);
        using (var writer = new Utf8JsonWriter(buffer))
        {
            writer.WriteStartObject();
            writer.WriteString("file", file);
            writer.WriteString("sha256", sha256);
            writer.WriteStartArray("batches");
            foreach (var (batch, disposition, revision) in listed)
            {
                writer.WriteStartObject();
                writer.WriteString("batch", batch);
                writer.WriteString("disposition", disposition);
                writer.WriteNumber("revision", revision);
                writer.WriteEndObject();
            }

            writer.WriteEndArray();
            if (batchCount is { } count)
            {
                writer.WriteNumber("batchCount", count);
            }

            if (notListed is { } rest)
            {
                writer.WriteNumber("batchesNotListed", rest);
            }

            writer.WriteEndObject();
        }

        return System.Text.Encoding.UTF8.GetString(buffer.WrittenSpan);
    }
}
