namespace BatchReconcile.Storage.Queries;

/// <summary>
/// The production order of batches: production day, last output time (unknown first), batch id (ordinal), and within a
/// batch the step order. The queries read the first two from an index; the store breaks the ties.
/// </summary>
internal static class ProductionOrder
{
    /// <summary>Sorts each run of items that share <paramref name="key"/> (the list is in key order) by <paramref name="tie"/>.</summary>
    public static void SortTies<T>(List<T> items, Func<T, (DateOnly, DateTimeOffset?)> key, Func<T, (string BatchId, int StepOrder)> tie)
    {
        var start = 0;
        for (var i = 1; i <= items.Count; i++)
        {
            if (i < items.Count && key(items[i]) == key(items[start]))
            {
                continue;
            }

            if (i - start > 1)
            {
                items.Sort(start, i - start, Comparer<T>.Create((a, b) => CompareTie(tie(a), tie(b))));
            }

            start = i;
        }
    }

    public static int CompareTie((string BatchId, int StepOrder) a, (string BatchId, int StepOrder) b)
    {
        var byBatch = string.CompareOrdinal(a.BatchId, b.BatchId);
        return byBatch != 0 ? byBatch : a.StepOrder.CompareTo(b.StepOrder);
    }
}
