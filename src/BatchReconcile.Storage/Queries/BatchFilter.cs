namespace BatchReconcile.Storage.Queries;

/// <summary>Which current batch revisions <c>BatchStore.ListBatches</c> gives.</summary>
/// <param name="From">First production day, inclusive; null from the first.</param>
/// <param name="To">Last production day, inclusive; null up to the last.</param>
/// <param name="Recipe">Only this recipe code (exact); null for all.</param>
/// <param name="FlaggedOnly">Only batches with at least one flag that is not closed (open or in review).</param>
public sealed record BatchFilter(DateOnly? From = null, DateOnly? To = null, string? Recipe = null, bool FlaggedOnly = false)
{
    public static BatchFilter All { get; } = new();
}
