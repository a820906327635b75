namespace BatchReconcile.Bench.Harness.Generation;

/// <summary>One row of a batch-record export, in the harness's fixed column order (<see cref="Header"/>).</summary>
internal sealed record ExportRow(
    string Step,
    string Entry,
    string Material,
    string Stream,
    string Quantity,
    string Unit,
    string Assay,
    string Lot,
    DateTimeOffset RecordedAt)
{
    public const string Header = "batch,recipe,recipe_version,step,entry,material,stream,quantity,unit,assay_pct,lot,recorded_at";
}
