using System.Text.Json;

namespace BatchReconcile.Cli.Tests.Ingestion;

/// <summary>One entry of <c>ingest --json</c> (docs/cli.md), read back for assertions.</summary>
public sealed record IngestReport(string File, string Sha256, string Outcome, IReadOnlyList<string> Batches, IReadOnlyList<IngestReport.Problem> Errors)
{
    public sealed record Problem(int Line, string Column, string Value, string Message);

    /// <summary>Parses the whole stdout of <c>ingest --json</c>: one JSON array and nothing else.</summary>
    public static IReadOnlyList<IngestReport> ParseAll(string stdout)
    {
        using var doc = JsonDocument.Parse(stdout);
        return doc.RootElement.EnumerateArray().Select(e => new IngestReport(
            e.GetProperty("file").GetString()!,
            e.GetProperty("sha256").GetString()!,
            e.GetProperty("outcome").GetString()!,
            e.GetProperty("batches").EnumerateArray().Select(b => b.GetString()!).ToList(),
            e.GetProperty("errors").EnumerateArray().Select(p => new Problem(
                p.GetProperty("line").GetInt32(),
                p.GetProperty("column").GetString()!,
                p.GetProperty("value").GetString()!,
                p.GetProperty("message").GetString()!)).ToList())).ToList();
    }
}
