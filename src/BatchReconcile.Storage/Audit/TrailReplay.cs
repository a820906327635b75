using System.Globalization;
using System.Text.Json;

namespace BatchReconcile.Storage.Audit;

/// <summary>
/// What the audit trail implies about the live review state, gathered entry by entry while the chain
/// is walked: each reviewed flag's last review (state, outcome, deviation reference, reviewer, time,
/// note) and each batch's newest revision. <see cref="BatchStore.VerifyAudit"/> compares it with the
/// flag and revision tables.
/// </summary>
/// <remarks>
/// A flag with no <c>flag.review</c> entry must still be as the commit stored it: open, with no review.
/// A batch's revisions come from the <c>ingest.stored</c> / <c>ingest.revision</c> entries of its files
/// (which list their batches, up to <c>MaxAuditedBatches</c>) and from the <c>batch.revision</c> entry
/// written for every revision after the first.
/// </remarks>
internal sealed class TrailReplay
{
    private readonly Dictionary<long, FlagReplay> _flags = [];
    private readonly Dictionary<string, (int Revision, long EntryId)> _batches = new(StringComparer.Ordinal);
    private readonly HashSet<string> _filesListingAllBatches = new(StringComparer.Ordinal);

    /// <summary>The last review of a flag as its last <c>flag.review</c> entry records it.</summary>
    public sealed record FlagReplay(long EntryId, string? State, string? Outcome, string? DeviationRef, string Actor, string At, string? Note);

    public IReadOnlyDictionary<long, FlagReplay> Flags => _flags;

    /// <summary>The newest revision of each batch the trail names, with the entry that named it.</summary>
    public IReadOnlyDictionary<string, (int Revision, long EntryId)> Batches => _batches;

    /// <summary>
    /// SHA-256 of the files whose ingest entry lists every batch stored from them. Not among them: files of more
    /// batches than an entry lists, and files stored before the trail listed batches (schema version 3 and older).
    /// </summary>
    public IReadOnlySet<string> FilesListingAllBatches => _filesListingAllBatches;

    public void Add(AuditEntry entry)
    {
        if (entry.Kind is not ("flag.review" or "batch.revision" or "ingest.stored" or "ingest.revision"))
        {
            return;
        }

        using var document = Parse(entry.Detail);
        var detail = document?.RootElement ?? default;
        switch (entry.Kind)
        {
            case "flag.review" when TryId(entry.Subject, "flag:", out var flagId):
                _flags[flagId] = new FlagReplay(entry.Id, entry.ToState, Text(detail, "outcome"), entry.DeviationRef, entry.Actor, entry.At, entry.Note);
                break;
            case "batch.revision" when Text(detail, "batch") is { } batch && Number(detail, "revision") is { } revision:
                Revision(batch, revision, entry.Id);
                break;
            case "ingest.stored" or "ingest.revision":
                ReadIngest(entry, detail);
                break;
        }
    }

    private void ReadIngest(AuditEntry entry, JsonElement detail)
    {
        if (detail.ValueKind != JsonValueKind.Object || !detail.TryGetProperty("batches", out var batches) || batches.ValueKind != JsonValueKind.Array)
        {
            return;
        }

        if (!(Number(detail, "batchesNotListed") > 0) && entry.Subject.StartsWith("file:", StringComparison.Ordinal))
        {
            _filesListingAllBatches.Add(entry.Subject["file:".Length..]);
        }

        foreach (var item in batches.EnumerateArray())
        {
            if (Text(item, "batch") is { } batch && Number(item, "revision") is { } revision)
            {
                Revision(batch, revision, entry.Id);
            }
        }
    }

    private void Revision(string batch, int revision, long entryId)
    {
        if (!_batches.TryGetValue(batch, out var known) || revision > known.Revision)
        {
            _batches[batch] = (revision, entryId);
        }
    }

    private static bool TryId(string subject, string prefix, out long id)
    {
        id = 0;
        return subject.StartsWith(prefix, StringComparison.Ordinal)
            && long.TryParse(subject.AsSpan(prefix.Length), NumberStyles.None, CultureInfo.InvariantCulture, out id);
    }

    private static JsonDocument? Parse(string json)
    {
        try
        {
            return JsonDocument.Parse(json);
        }
        catch (JsonException)
        {
            // A detail that is not JSON implies nothing; its hash was checked already.
            return null;
        }
    }

    private static string? Text(JsonElement element, string name) =>
        element.ValueKind == JsonValueKind.Object && element.TryGetProperty(name, out var value) && value.ValueKind == JsonValueKind.String
            ? value.GetString()
            : null;

    private static int? Number(JsonElement element, string name) =>
        element.ValueKind == JsonValueKind.Object && element.TryGetProperty(name, out var value) && value.ValueKind == JsonValueKind.Number
            && value.TryGetInt32(out var number)
            ? number
            : null;
}
