namespace BatchReconcile.Records.Exports;

/// <summary>One problem found in an export file: where, what was there, and why it is wrong.</summary>
/// <param name="Line">Line number in the file (header = 1); 0 for the file as a whole.</param>
/// <param name="Column">Column name as the contract spells it; empty for the file or row as a whole.</param>
/// <param name="Value">The text found there (may be empty).</param>
public sealed record ExportError(string File, int Line, string Column, string Value, string Reason)
{
    public override string ToString()
    {
        var where = Line > 0 ? $"{File}:{Line}" : File;
        if (Column.Length > 0)
        {
            where += $", column {Column}";
        }

        return Value.Length > 0 ? $"{where} ('{Value}'): {Reason}" : $"{where}: {Reason}";
    }
}
