namespace BatchReconcile.Cli;

/// <summary>A plain text table: a header line and one line per row, columns as wide as their widest cell.</summary>
public static class TextTable
{
    /// <param name="rightAligned">Per column: numbers are right-aligned, text left-aligned.</param>
    public static void Write(TextWriter o, IReadOnlyList<string> header, IReadOnlyList<bool> rightAligned, IReadOnlyList<string[]> rows)
    {
        var widths = header.Select((h, i) => Math.Max(h.Length, rows.Count == 0 ? 0 : rows.Max(r => r[i].Length))).ToArray();
        string Line(IReadOnlyList<string> cells) =>
            string.Join("  ", cells.Select((c, i) => i == cells.Count - 1 && !rightAligned[i] ? c : rightAligned[i] ? c.PadLeft(widths[i]) : c.PadRight(widths[i])));
        o.WriteLine(Line(header));
        foreach (var row in rows)
        {
            o.WriteLine(Line(row));
        }
    }
}
