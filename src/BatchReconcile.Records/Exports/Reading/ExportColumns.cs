namespace BatchReconcile.Records.Exports.Reading;

/// <summary>The column names of the export contract, spelled as the contract spells them.</summary>
public static class ExportColumns
{
    public const string Batch = "batch";
    public const string Recipe = "recipe";
    public const string RecipeVersion = "recipe_version";
    public const string Step = "step";
    public const string Entry = "entry";
    public const string Material = "material";
    public const string Stream = "stream";
    public const string Quantity = "quantity";
    public const string Unit = "unit";
    public const string AssayPct = "assay_pct";
    public const string Lot = "lot";
    public const string RecordedAt = "recorded_at";

    /// <summary>Every column the contract defines, in the contract's order.</summary>
    public static IReadOnlyList<string> All { get; } =
        [Batch, Recipe, RecipeVersion, Step, Entry, Material, Stream, Quantity, Unit, AssayPct, Lot, RecordedAt];

    /// <summary>The columns a header must have. <c>material</c>, <c>quantity</c> and the rest are
    /// required per entry, not per file, so a file of analysis rows only needs no quantity column.</summary>
    public static IReadOnlyList<string> Required { get; } = [Batch, Recipe, Step, Entry];
}
