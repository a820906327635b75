using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Queries;

/// <summary><c>StepLinksOfRecipe</c> (the intermediates each batch's steps charged, for compare's route figures): one row a batch, from the recipe index.</summary>
public sealed class StepLinksQueryTests
{
    [Theory]
    [InlineData(false, false)]
    [InlineData(true, true)]
    public void The_links_are_read_through_the_recipe_index_one_row_a_batch(bool from, bool to)
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        var plan = Db.QueryPlan(store.Connection, BatchStore.StepLinksOfRecipeSql(from, to), ("$recipe", Build.Recipe), ("$from", "2026-11-03"), ("$to", "2026-11-20"));

        Assert.Contains(plan, line => line.StartsWith("SEARCH s USING INDEX ix_step_result_recipe (recipe=? AND is_current=?", StringComparison.Ordinal));
        Assert.DoesNotContain(plan, line => line.StartsWith("SCAN", StringComparison.Ordinal));
        Assert.DoesNotContain(plan, line => line.Contains("TEMP B-TREE", StringComparison.Ordinal));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Every_current_batch_of_the_recipe_in_the_period_has_its_links(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = Filled(db);

        var all = store.StepLinksOfRecipe(Build.Recipe);
        var some = store.StepLinksOfRecipe(Build.Recipe, new DateOnly(2026, 11, 3), new DateOnly(2026, 11, 5));

        Assert.Equal(20, all.Count);
        Assert.Equal(["BZ-003", "BZ-004", "BZ-005"], some.Keys.Order(StringComparer.Ordinal));
        Assert.All(all.Values, links => Assert.NotNull(links)); // stored with links ('[]' when no step charged an earlier product)
        Assert.Empty(store.StepLinksOfRecipe("NO-SUCH"));
    }

    private static BatchStore Filled(TempDatabase db)
    {
        var store = db.Open();
        store.Commit([.. Enumerable.Range(1, 20).Select(day => Build.File($"d{day}.csv", Build.Ingest(Build.Batch($"BZ-{day:000}"), new DateOnly(2026, 11, day))))]);
        return store;
    }
}
