using BatchReconcile.Records.Exports;

namespace BatchReconcile.Storage.Ingest;

/// <summary>What was stored for one batch of a committed file.</summary>
/// <param name="Revision">The batch's current revision after the commit.</param>
/// <param name="FlagIds">Ids of the flags stored with a new revision (empty when unchanged).</param>
/// <param name="Recipe">The recipe of the batch as read from the file.</param>
/// <param name="RecipeVersion">Its version, chosen as <paramref name="RecipeVersionSource"/> says.</param>
public sealed record BatchCommitResult(
    string BatchId,
    BatchDisposition Disposition,
    int Revision,
    IReadOnlyList<long> FlagIds,
    string Recipe,
    int RecipeVersion,
    RecipeVersionSource RecipeVersionSource);
