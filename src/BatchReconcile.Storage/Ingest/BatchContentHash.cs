using System.Globalization;
using System.Security.Cryptography;
using System.Text;
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
/// </remarks>
public static class BatchContentHash
{
    private const string FormVersion = "batch-content/1";

    public static string Compute(BatchRecord batch)
    {
        ArgumentNullException.ThrowIfNull(batch);
        var rows = batch.Rows.Select(CanonicalRow).ToList();
        rows.Sort(StringComparer.Ordinal);

        var text = new StringBuilder();
        text.Append(FormVersion).Append('\n');
        text.Append(JsonSerializer.Serialize(new object[] { batch.BatchId, batch.RecipeCode, batch.RecipeVersion }));
        foreach (var row in rows)
        {
            text.Append('\n').Append(row);
        }

        return Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString())));
    }

    private static string CanonicalRow(RecordRow row) => JsonSerializer.Serialize(new object?[]
    {
        row.Step,
        row.Entry.ToString().ToLowerInvariant(),
        row.Material,
        row.Stream,
        Number(row.Quantity),
        row.Unit?.Symbol.ToLowerInvariant(),
        Number(row.AssayPct),
        row.Lot,
        row.RecordedAt?.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss.fffffff'Z'", CultureInfo.InvariantCulture),
    });

    private static string? Number(double? value) => value?.ToString("R", CultureInfo.InvariantCulture);
}
