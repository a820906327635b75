using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Queries;

/// <summary><c>LossTotalsOfRecipe</c>: the stored ladders summed per step, rung and material part, from the recipe index.</summary>
public sealed class LossTotalsQueryTests
{
    [Theory]
    [InlineData(false, false)]
    [InlineData(true, true)]
    public void The_rows_are_read_through_the_recipe_index(bool from, bool to)
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        var plan = Db.QueryPlan(store.Connection, BatchStore.LossTotalsOfRecipeSql(from, to), ("$recipe", Build.Recipe), ("$from", "2026-11-03"), ("$to", "2026-11-20"));

        Assert.Contains(plan, line => line.StartsWith("SEARCH s USING INDEX ix_step_result_recipe (recipe=? AND is_current=?", StringComparison.Ordinal));
        Assert.DoesNotContain(plan, line => line.StartsWith("SCAN", StringComparison.Ordinal));
    }

    [Fact]
    public void The_totals_are_the_sums_of_the_stored_ladders_and_parts()
    {
        using var db = new TempDatabase();
        using var store = Filled(db);
        var (first, last) = (new DateOnly(2026, 11, 3), new DateOnly(2026, 11, 12));

        var totals = store.LossTotalsOfRecipe(Build.Recipe, first, last);
        // The same sums from the rows as StepsOfRecipe gives them whole (an independent read of the same store).
        var rows = store.StepsOfRecipe(Build.Recipe, first, last);

        Assert.Equal(10, totals.Batches);
        Assert.Equal(rows.Sum(r => r.Outcome.MassInKg), totals.ChargedKg, 9);
        var expectedRungs = rows.SelectMany(r => r.Outcome.Ladder.Select(g => (r.Outcome.Step, g.Key, g.Kg)))
            .GroupBy(x => (x.Step, x.Key)).ToDictionary(g => g.Key, g => g.Sum(x => x.Kg));
        Assert.Equal(expectedRungs.Count, totals.Rungs.Count);
        Assert.All(totals.Rungs, r => Assert.Equal(expectedRungs[(r.Step, r.RungKey)], r.Kg, 9));
        var expectedParts = rows.SelectMany(r => r.Outcome.Ladder.SelectMany(g => g.Parts.Select(p => (r.Outcome.Step, g.Key, p.Material, p.Kg))))
            .GroupBy(x => (x.Step, x.Key, x.Material)).ToDictionary(g => g.Key, g => g.Sum(x => x.Kg));
        Assert.Equal(expectedParts.Count, totals.Parts.Count);
        Assert.All(totals.Parts, p => Assert.Equal(expectedParts[(p.Step, p.RungKey, p.Material)], p.Kg, 9));
        Assert.NotEmpty(totals.Parts);
        var none = store.LossTotalsOfRecipe("NO-SUCH");
        Assert.Equal((0, 0.0), (none.Batches, none.ChargedKg));
        Assert.Empty(none.Rungs);
        Assert.Empty(none.Parts);
    }

    private static BatchStore Filled(TempDatabase db)
    {
        var store = db.Open();
        store.Commit([.. Enumerable.Range(1, 20).Select(day => Build.File($"d{day}.csv", Build.Ingest(Build.Batch($"BZ-{day:000}", 90.0 + (day % 5)), new DateOnly(2026, 11, day))))]);
        return store;
    }
}
