namespace BatchReconcile.Records.Exports;

/// <summary>One validated row of a batch-record export.</summary>
/// <param name="Line">Line number in the file (the header is line 1).</param>
/// <param name="QuantityKg">Gross mass in kg; null only for <see cref="EntryKind.Analysis"/>.</param>
/// <param name="Quantity">The quantity as written, in <paramref name="Unit"/>.</param>
/// <param name="AssayPct">Mass % of <paramref name="Material"/> in the quantity; null when not given (the default depends on the entry).</param>
/// <param name="Raw">The row as read: column name (as in the header) to text.</param>
public sealed record RecordRow(
    int Line,
    string Batch,
    string Recipe,
    int? RecipeVersion,
    string Step,
    EntryKind Entry,
    string? Material,
    string? Stream,
    double? QuantityKg,
    double? Quantity,
    MassUnit? Unit,
    double? AssayPct,
    string? Lot,
    DateTimeOffset? RecordedAt,
    IReadOnlyList<KeyValuePair<string, string>> Raw)
{
    /// <summary>Mass of the named material in the row: gross × assay; assay defaults to 100 %.</summary>
    /// <remarks>At 100 % the gross mass exactly: q · 100 / 100 can land one unit in the last place above q.</remarks>
    public double MaterialKg => AssayPct is null or >= 100 ? QuantityKg ?? 0 : (QuantityKg ?? 0) * AssayPct.Value / 100.0;
}
