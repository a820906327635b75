using System.Globalization;
using System.Text;
using static System.FormattableString;

namespace BatchReconcile.Records.Exports.Reading;

/// <summary>The report written beside a quarantined export (Markdown, readable as plain text).</summary>
public static class QuarantineReport
{
    private const int MaxValueLength = 80;

    public static string Render(string fileName, string? sha256, IReadOnlyList<ExportError> errors, DateTimeOffset quarantinedAt)
    {
        ArgumentNullException.ThrowIfNull(errors);
        var listed = errors.Count(e => !IsSummary(e));
        var summary = errors.FirstOrDefault(IsSummary);

        var text = new StringBuilder();
        text.Append("# Export quarantined: ").AppendLine(Cell(fileName)).AppendLine();
        text.Append("- File: ").AppendLine(SafeText.Escape(fileName));
        if (!string.IsNullOrEmpty(sha256))
        {
            text.Append("- SHA-256: ").AppendLine(sha256);
        }

        text.Append("- Quarantined at: ").AppendLine(quarantinedAt.ToString("yyyy-MM-dd'T'HH:mm:sszzz", CultureInfo.InvariantCulture));
        text.AppendLine(Invariant($"- Problems: {listed}{(summary is null ? "" : " listed, more not listed")}")).AppendLine();
        text.AppendLine("Nothing from this file was stored: an export is taken whole or not at all.").AppendLine();

        text.AppendLine("| Line | Column | Value | Problem |");
        text.AppendLine("|---:|---|---|---|");
        foreach (var error in errors.Where(e => !IsSummary(e)))
        {
            var line = error.Line > 0 ? error.Line.ToString(CultureInfo.InvariantCulture) : "-";
            var column = error.Column.Length > 0 ? error.Column : "-";
            text.AppendLine($"| {line} | {Cell(column)} | {Cell(Shorten(error.Value))} | {Cell(error.Reason)} |");
        }

        if (summary is not null)
        {
            text.AppendLine().AppendLine(summary.Reason);
        }

        text.AppendLine();
        text.AppendLine("What to do: correct these rows in the batch-record system (or fix its export settings), " +
                        "export the file again and put the new export in the inbox. Line 1 is the header; " +
                        "lines count every line of the file, including those inside quoted values.");
        return text.ToString();
    }

    // The summary entry of a capped list ("... and N more") is not a located problem.
    private static bool IsSummary(ExportError error) =>
        error.Line == 0 && error.Column.Length == 0 && error.Reason.StartsWith("... and ", StringComparison.Ordinal);

    private static string Shorten(string value) =>
        value.Length <= MaxValueLength ? value : string.Concat(value.AsSpan(0, MaxValueLength), "...");

    // A cell must stay on one line and must not split the table; other control and bidirectional
    // characters are escaped (SafeText), so that the report is safe to print on a terminal.
    private static string Cell(string text) =>
        SafeText.Escape(text.Replace("\\", "\\\\", StringComparison.Ordinal)
            .Replace("|", "\\|", StringComparison.Ordinal)
            .Replace("\r\n", "\u21B5", StringComparison.Ordinal)
            .Replace("\n", "\u21B5", StringComparison.Ordinal)
            .Replace("\r", "\u21B5", StringComparison.Ordinal));
}
