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

    public static TheoryData<bool, bool, bool> Filters() => new()
    {
        { false, false, false },
        { true, true, false },
        { true, false, true },
        { false, true, true },
    };

    [Theory]
    [MemberData(nameof(Filters))]
    public void A_step_series_searches_the_history_index_in_production_order_and_never_scans_step_results(bool from, bool to, bool version)
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        var plan = Db.QueryPlan(store.Connection, StoreQueries.StepSeries("s.yield_pct", from, to, version),
            ("$recipe", Build.Recipe), ("$step", "S1"), ("$from", "2026-11-03"), ("$to", "2026-11-20"), ("$version", 1));

        var range = from && to ? " AND production_day>? AND production_day<?)" : from ? " AND production_day>?)" : to ? " AND production_day<?)" : ")";
        Assert.Contains(plan, line => line == "SEARCH s USING INDEX ix_step_result_history (recipe=? AND step=? AND is_current=?" + range);
        Assert.DoesNotContain(plan, line => line.StartsWith("SCAN", StringComparison.Ordinal));
        // The order comes from the index: nothing is sorted.
        Assert.DoesNotContain(plan, line => line.Contains("TEMP B-TREE", StringComparison.Ordinal));
    }

    [Theory]
    [MemberData(nameof(Filters))]
    public void Steps_of_a_recipe_search_the_recipe_index_in_production_order_and_never_scan_step_results(bool from, bool to, bool version)
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        foreach (var parts in new[] { Storage.Queries.StepParts.All, Storage.Queries.StepParts.Figures })
        {
            var plan = Db.QueryPlan(store.Connection, StoreQueries.StepsOfRecipe(from, to, version, parts),
                ("$recipe", Build.Recipe), ("$from", "2026-11-03"), ("$to", "2026-11-20"), ("$version", 1));

            var range = from && to ? " AND production_day>? AND production_day<?)" : from ? " AND production_day>?)" : to ? " AND production_day<?)" : ")";
            Assert.Contains(plan, line => line == "SEARCH s USING INDEX ix_step_result_recipe (recipe=? AND is_current=?" + range);
            Assert.DoesNotContain(plan, line => line.StartsWith("SCAN", StringComparison.Ordinal));
            Assert.DoesNotContain(plan, line => line.Contains("TEMP B-TREE", StringComparison.Ordinal));
        }
    }

    [Fact]
    public void The_steps_of_a_recipe_are_found_by_seeks_not_by_reading_the_recipes_rows()
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        var plan = Db.QueryPlan(store.Connection, StoreQueries.RecipeSteps, ("$recipe", Build.Recipe));

        Assert.Contains(plan, line => line.Contains("USING COVERING INDEX ix_step_result_history (recipe=?)", StringComparison.Ordinal));
        Assert.Contains(plan, line => line.Contains("USING COVERING INDEX ix_step_result_history (recipe=? AND step>?)", StringComparison.Ordinal));
        // The only scans are of the one-row-per-step walk itself.
        Assert.All(plan.Where(line => line.StartsWith("SCAN", StringComparison.Ordinal)), line => Assert.True(line is "SCAN steps" or "SCAN CONSTANT ROW", line));
    }

    [Theory]
    [InlineData(true, true, false)]
    [InlineData(false, true, true)]
    [InlineData(true, false, true)]
    public void Batches_of_a_recipe_or_of_days_and_audit_entries_by_kind_or_time_use_their_indexes(bool days, bool recipe, bool flagged)
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        var batches = Db.QueryPlan(store.Connection, StoreQueries.Batches(days, days, recipe, flagged),
            ("$from", "2026-11-03"), ("$to", "2026-11-20"), ("$recipe", Build.Recipe));
        Assert.Contains(batches, line => line.StartsWith("SEARCH r USING INDEX " + (recipe ? "ix_batch_revision_recipe (recipe=?" : "ix_batch_revision_day (production_day>? AND production_day<?)"), StringComparison.Ordinal));
        Assert.DoesNotContain(batches, line => line.StartsWith("SCAN", StringComparison.Ordinal));

        var audit = Db.QueryPlan(store.Connection, StoreQueries.Audit(days, days, recipe),
            ("$from", "2026-11-03T00:00:00.0000000Z"), ("$to", "2026-11-20T00:00:00.0000000Z"), ("$kind", "flag"), ("$kindPrefix", "flag."), ("$kindEnd", "flag/"));
        Assert.Contains(audit, line => line.Contains(recipe ? "INDEX ix_audit_event_kind (kind=?" : "INDEX ix_audit_event_at (at>? AND at<?)", StringComparison.Ordinal));
        Assert.DoesNotContain(audit, line => line.StartsWith("SCAN audit_event", StringComparison.Ordinal));
    }

    [Fact]
    public void An_export_of_every_recipe_over_days_reads_the_day_index()
    {
        using var db = new TempDatabase();
        using var store = Filled(db);

        var plan = Db.QueryPlan(store.Connection, StoreQueries.StepsForExport(recipe: false, from: true, to: true), ("$from", "2026-11-03"), ("$to", "2026-11-20"));

        Assert.Contains(plan, line => line.Contains("USING INDEX ix_step_result_day (production_day>? AND production_day<?)", StringComparison.Ordinal));
        Assert.DoesNotContain(plan, line => line.StartsWith("SCAN", StringComparison.Ordinal));
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
