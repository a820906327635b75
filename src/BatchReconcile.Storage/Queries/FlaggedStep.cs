using BatchReconcile.Records.Exports;

namespace BatchReconcile.Storage.Queries;

/// <summary>A step of a current revision that carries at least one flag, with every figure (ladder, mass balance) and its flags.</summary>
public sealed record FlaggedStep(string BatchId, int Revision, string Recipe, int RecipeVersion, DateOnly ProductionDay, StoredStep Step)
{
    /// <summary>How <see cref="RecipeVersion"/> was chosen; null when unknown (stored before this was recorded).</summary>
    public RecipeVersionSource? RecipeVersionSource { get; init; }
}
