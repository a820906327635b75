using BatchReconcile.Storage.Ingest;
using BatchReconcile.Storage.Queries;
using BatchReconcile.Storage.Sql;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Queries;

/// <summary>
/// Loss ladders summed by the store (<c>losses</c>, <c>report</c>) give exactly what summing the ladders read row by row
/// gives, rung by rung and part by part, for current revisions only; and the sums come from the recipe index.
/// </summary>
public sealed class LossTotalsTests
{
    private static readonly DateOnly Nov1 = new(2026, 11, 1);
    private static readonly DateOnly Nov2 = new(2026, 11, 2);
    private static readonly DateOnly Nov3 = new(2026, 11, 3);

    private static BatchStore Filled(TempDatabase db)
    {
        var store = db.Open();
        store.Commit(
        [
            Build.File("a.csv",
                Build.Ingest(Build.Batch("L-1", productKg: 91.0), Nov1),
                Build.Ingest(Build.Batch("L-2", productKg: 93.5), Nov2),
                Build.Ingest(Build.Batch("L-3", productKg: 97.0, recipeVersion: 2), Nov3)),
        ]);
        // L-2 is re-exported: only its second revision may count.
        store.Commit([Build.File("b.csv", Build.Ingest(Build.Batch("L-2", productKg: 95.25), Nov2))]);
        return store;
    }

    public static TheoryData<DateOnly?, DateOnly?> Periods => new()
    {
        { null, null },
        { Nov2, null },
        { null, Nov2 },
        { Nov2, Nov2 },
        { Nov1, Nov3 },
    };

    [Theory]
    [MemberData(nameof(Periods))]
    public void Totals_equal_the_ladders_of_the_current_step_rows_summed_one_by_one(DateOnly? from, DateOnly? to)
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        var totals = store.LossTotalsOfRecipe(Build.Recipe, from, to);
        var rows = store.StepsOfRecipe(Build.Recipe, from, to);

        Assert.Equal(rows.Select(r => r.BatchId).Distinct().Count(), totals.Batches);
        Assert.Equal(rows.Count, totals.StepRows);
        Assert.Equal(rows.Sum(r => r.Outcome.MassInKg), totals.ChargedKg, 9);
        var expected = rows
            .SelectMany(r => r.Outcome.Ladder.Select(g => (r.Outcome.Step, g.Key, g.Kg, g.Parts)))
            .GroupBy(x => (x.Step, x.Key))
            .ToDictionary(g => g.Key, g => (Kg: g.Sum(x => x.Kg), Parts: g.SelectMany(x => x.Parts).GroupBy(p => p.Material).ToDictionary(p => p.Key, p => p.Sum(q => q.Kg))));
        Assert.Equal(expected.Count, totals.Rungs.Count);
        foreach (var rung in totals.Rungs)
        {
            var (kg, parts) = expected[(rung.Step, rung.Key)];
            Assert.Equal(kg, rung.Kg, 9);
            Assert.Equal(parts.Keys.Order(StringComparer.Ordinal), rung.Parts.Select(p => p.Material));
            Assert.All(rung.Parts, p => Assert.Equal(parts[p.Material], p.Kg, 9));
        }

        // Step order first, then the ladder's own order within a step.
        Assert.Equal(totals.Rungs.OrderBy(r => r.StepOrder).Select(r => r.Step), totals.Rungs.Select(r => r.Step));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_period_without_batches_gives_zero_totals_and_no_rungs(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = Filled(db);

        var totals = store.LossTotalsOfRecipe(Build.Recipe, new DateOnly(2027, 1, 1), new DateOnly(2027, 12, 31));

        Assert.Equal(new RecipeLossTotals(0, 0, 0, []).Batches, totals.Batches);
        Assert.Equal(0, totals.StepRows);
        Assert.Equal(0, totals.ChargedKg);
        Assert.Empty(totals.Rungs);
    }

    [Theory]
    [InlineData(false, false)]
    [InlineData(true, false)]
    [InlineData(true, true)]
    public void The_sums_read_the_recipe_index_not_the_whole_step_table(bool from, bool to)
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        foreach (var sql in new[] { StoreQueries.LossRows(from, to) })
        {
            var plan = Db.QueryPlan(store.Connection, sql, ("$recipe", Build.Recipe), ("$from", "2026-11-02"), ("$to", "2026-11-03"));

            var range = from && to ? " AND production_day>? AND production_day<?)" : from ? " AND production_day>?)" : ")";
            Assert.Contains(plan, line => line.StartsWith("SEARCH s USING ", StringComparison.Ordinal)
                && line.Contains("INDEX ix_step_result_recipe (recipe=? AND is_current=?" + range, StringComparison.Ordinal));
            Assert.DoesNotContain(plan, line => line.StartsWith("SCAN s", StringComparison.Ordinal));
        }
    }
}
