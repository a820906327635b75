using BatchReconcile.Storage.Sql;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Queries;

/// <summary>The daily questions are answered from an index, not by reading whole tables (checked with EXPLAIN QUERY PLAN).</summary>
public sealed class QueryPlanTests
{
    [Theory]
    [InlineData(true, false)]
    [InlineData(true, true)]
    [InlineData(false, true)]
    public void Flags_of_one_day_use_the_day_index(bool currentOnly, bool unresolvedOnly)
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        var plan = Db.QueryPlan(store.Connection, StoreQueries.Flags(byDay: true, currentOnly, unresolvedOnly), ("$day", "2026-11-03"));

        // Either day index answers it: the day index, or the index of unresolved flags (also by day).
        Assert.Contains(plan, line => line.Contains("USING INDEX ix_flag_day (production_day=?", StringComparison.Ordinal)
            || (unresolvedOnly && line.Contains("USING INDEX ix_flag_unresolved (production_day=?", StringComparison.Ordinal)));
        Assert.DoesNotContain(plan, line => line.StartsWith("SCAN", StringComparison.Ordinal));
    }

    [Fact]
    public void Unresolved_flags_of_earlier_days_read_only_the_unresolved_index()
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        var plan = Db.QueryPlan(store.Connection, StoreQueries.UnresolvedBefore, ("$day", "2026-11-20"));

        Assert.Contains(plan, line => line.Contains("USING INDEX ix_flag_unresolved (production_day<?)", StringComparison.Ordinal));
        Assert.DoesNotContain(plan, line => line.StartsWith("SCAN", StringComparison.Ordinal));
    }

    [Fact]
    public void Flagged_steps_and_recipe_steps_of_a_day_use_the_step_day_index()
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        foreach (var sql in new[] { StoreQueries.FlaggedStepsOfDay, StoreQueries.RecipeStepsOfDay })
        {
            var plan = Db.QueryPlan(store.Connection, sql, ("$day", "2026-11-03"));
            Assert.Contains(plan, line => line.Contains("USING INDEX ix_step_result_day (production_day=? AND is_current=?)", StringComparison.Ordinal)
                || line.Contains("USING COVERING INDEX ix_step_result_day (production_day=? AND is_current=?)", StringComparison.Ordinal));
            Assert.DoesNotContain(plan, line => line.StartsWith("SCAN", StringComparison.Ordinal));
        }

        var flagsOfDay = Db.QueryPlan(store.Connection, StoreQueries.FlagsOfDay, ("$day", "2026-11-03"));
        Assert.Contains(flagsOfDay, line => line.Contains("USING INDEX ix_flag_day (production_day=? AND is_current=?)", StringComparison.Ordinal));
        Assert.DoesNotContain(flagsOfDay, line => line.StartsWith("SCAN", StringComparison.Ordinal));
    }

    [Fact]
    public void Step_history_up_to_a_day_uses_the_history_index_with_the_day_range()
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        var plan = Db.QueryPlan(store.Connection, StoreQueries.StepHistoryUpTo, ("$recipe", Build.Recipe), ("$step", "S1"), ("$limit", 30), ("$day", "2026-11-20"));

        Assert.Contains(plan, line => line.Contains("USING INDEX ix_step_result_history (recipe=? AND step=? AND is_current=? AND production_day<?)", StringComparison.Ordinal));
        Assert.DoesNotContain(plan, line => line.StartsWith("SCAN", StringComparison.Ordinal));
        Assert.DoesNotContain(plan, line => line == "USE TEMP B-TREE FOR ORDER BY");
    }

    [Fact]
    public void Step_history_uses_the_history_index_without_sorting_the_whole_step()
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        var plan = Db.QueryPlan(store.Connection, StoreQueries.StepHistory, ("$recipe", Build.Recipe), ("$step", "S1"), ("$limit", 30));

        Assert.Contains(plan, line => line.Contains("USING INDEX ix_step_result_history (recipe=? AND step=? AND is_current=?)", StringComparison.Ordinal));
        Assert.DoesNotContain(plan, line => line.StartsWith("SCAN", StringComparison.Ordinal));
        // Only the tie-break columns after the day may need sorting, never the day itself.
        Assert.DoesNotContain(plan, line => line == "USE TEMP B-TREE FOR ORDER BY");
    }

    [Fact]
    public void Counts_of_a_day_use_indexes()
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        var plan = Db.QueryPlan(store.Connection, StoreQueries.CountsOfDay, ("$day", "2026-11-03"));

        Assert.Contains(plan, line => line.Contains("ix_batch_revision_day", StringComparison.Ordinal));
        Assert.Contains(plan, line => line.Contains("ix_step_result_day", StringComparison.Ordinal));
        Assert.Equal(4, plan.Count(line => line.Contains("ix_flag_day", StringComparison.Ordinal) || line.Contains("ix_flag_unresolved", StringComparison.Ordinal)));
        // The outer SELECT of sub-selects reads one constant row; no table is scanned.
        Assert.DoesNotContain(plan, line => line.StartsWith("SCAN", StringComparison.Ordinal) && line != "SCAN CONSTANT ROW");
    }

    /// <summary>Thirty days of batches, each with flags, so that the planner has real tables to choose over.</summary>
    private static BatchStore Filled(TempDatabase db)
    {
        var store = db.Open();
        var files = new List<BatchReconcile.Storage.Ingest.FileIngest>();
        for (var day = 1; day <= 30; day++)
        {
            var production = new DateOnly(2026, 11, day);
            files.Add(Build.File($"d{day}.csv",
                Build.Ingest(Build.Batch($"BZ-{day:000}-A"), production, Build.Flag("S1")),
                Build.Ingest(Build.Batch($"BZ-{day:000}-B"), production, Build.Flag("S2"))));
        }

        store.Commit(files);
        return store;
    }
}
