namespace BatchReconcile.Records.Exports;

/// <summary>All rows of one batch in one export file, validated against the process definitions.</summary>
/// <param name="Warnings">Findings that do not reject the file (unknown columns, for instance).</param>
public sealed record BatchRecord(
    string BatchId,
    string RecipeCode,
    int RecipeVersion,
    IReadOnlyList<RecordRow> Rows,
    IReadOnlyList<string> Warnings)
{
    public IEnumerable<RecordRow> RowsOfStep(string step) =>
        Rows.Where(r => string.Equals(r.Step, step, StringComparison.OrdinalIgnoreCase));
}
