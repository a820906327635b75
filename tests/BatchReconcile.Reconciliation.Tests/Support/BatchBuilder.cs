using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Tests.Support;

/// <summary>Writes batch-record rows the way the export reader hands them over: quantity in its unit, converted to kg.</summary>
internal sealed class BatchBuilder(string batchId, string recipe)
{
    private readonly List<RecordRow> _rows = [];

    public BatchBuilder Charge(string step, string material, double quantity, MassUnit unit, double? assay = null) =>
        Add(step, EntryKind.Charge, material, null, quantity, unit, assay, null);

    public BatchBuilder Product(string step, string material, double quantity, MassUnit unit, double? assay = null, DateTimeOffset? at = null) =>
        Add(step, EntryKind.Product, material, null, quantity, unit, assay, at);

    public BatchBuilder Waste(string step, string stream, double quantity, MassUnit unit, string? material = null, double? assay = null, DateTimeOffset? at = null) =>
        Add(step, EntryKind.Waste, material, stream, quantity, unit, assay, at);

    public BatchBuilder Recovered(string step, string material, double quantity, MassUnit unit, DateTimeOffset? at = null) =>
        Add(step, EntryKind.Recovered, material, null, quantity, unit, null, at);

    public BatchBuilder Sample(string step, double quantity, MassUnit unit, string? material = null, double? assay = null, string? stream = null) =>
        Add(step, EntryKind.Sample, material, stream, quantity, unit, assay, null);

    public BatchBuilder Analysis(string step, string stream, string material, double assay) =>
        Add(step, EntryKind.Analysis, material, stream, null, null, assay, null);

    /// <summary>Drops every row matching the predicate (a scenario without a charge, for instance).</summary>
    public BatchBuilder Without(Func<RecordRow, bool> predicate)
    {
        _rows.RemoveAll(r => predicate(r));
        return this;
    }

    public BatchRecord Build() => new(batchId, recipe, 1, RecipeVersionSource.Export, null, _rows.ToArray(), []);

    private BatchBuilder Add(string step, EntryKind entry, string? material, string? stream, double? quantity, MassUnit? unit, double? assay, DateTimeOffset? at)
    {
        _rows.Add(new RecordRow(
            Line: _rows.Count + 2,
            Batch: batchId,
            Recipe: recipe,
            RecipeVersion: 1,
            Step: step,
            Entry: entry,
            Material: material,
            Stream: stream,
            QuantityKg: quantity is { } q ? unit!.ToKilograms(q) : null,
            Quantity: quantity,
            Unit: unit,
            AssayPct: assay,
            Lot: null,
            RecordedAt: at,
            Raw: []));
        return this;
    }
}
