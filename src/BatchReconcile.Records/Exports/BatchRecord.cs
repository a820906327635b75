namespace BatchReconcile.Records.Exports;

/// <summary>All rows of one batch in one export file, validated against the process definitions.</summary>
/// <param name="RecipeVersionSource">How <paramref name="RecipeVersion"/> was chosen: named by the export, in effect on the batch's date, or the newest (stated, flagged).</param>
/// <param name="FirstRecordedDate">The local calendar date (site time zone) of the batch's earliest <c>recorded_at</c>; null when no row has one.</param>
/// <param name="Warnings">Findings that do not reject the file (unknown columns, for instance).</param>
public sealed record BatchRecord(
    string BatchId,
    string RecipeCode,
    int RecipeVersion,
    RecipeVersionSource RecipeVersionSource,
    DateOnly? FirstRecordedDate,
    IReadOnlyList<RecordRow> Rows,
    IReadOnlyList<string> Warnings)
{
    public IEnumerable<RecordRow> RowsOfStep(string step) =>
        Rows.Where(r => string.Equals(r.Step, step, StringComparison.OrdinalIgnoreCase));
}
