using BatchReconcile.Records.Exports;
using BatchReconcile.Storage.Schema;
using BatchReconcile.Storage.Sql;
using BatchReconcile.Storage.Tests.Support;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Tests.Schema;

/// <summary>
/// Migration 6: the recipe version source per revision and the deciding limits per step. Rows stored before
/// it are filled only from what the store holds (raw rows, the limits their flags carry); the rest is unknown
/// (NULL), never 0.
/// </summary>
public sealed class DecidingLimitsMigrationTests
{
    [Fact]
    public void Old_rows_get_what_the_store_knows_and_unknown_for_the_rest()
    {
        using var db = new TempDatabase();
        using (var connection = db.OpenRaw())
        {
            Assert.Equal(Enumerable.Range(1, 5), SchemaMigrator.MigrateTo(connection, 5));
            SeedVersion5(connection);
            Assert.Equal([6], SchemaMigrator.MigrateTo(connection, 6));
        }

        using var store = db.Open();

        // Source from the stored rows: a recipe_version on a row is "export"; none anywhere was the newest; no rows, unknown.
        Assert.Equal(RecipeVersionSource.Export, store.GetLatestBatch("OLD-A")!.RecipeVersionSource);
        Assert.Equal(RecipeVersionSource.Newest, store.GetLatestBatch("OLD-B")!.RecipeVersionSource);
        Assert.Null(store.GetLatestBatch("OLD-C")!.RecipeVersionSource);

        // OLD-A S1 had yield-low (limit 88) and product-in-waste (limit 2.5): those limits are known; the rest is not.
        var a = Assert.Single(store.GetLatestBatch("OLD-A")!.Steps).Outcome.Limits;
        Assert.Equal((88.0, (double?)null, 2.5), (a.YieldMinPct, a.YieldMaxPct, a.ProductInWasteMaxPct));
        Assert.Equal(((double?)null, (double?)null, (double?)null), (a.BalanceTolerancePct, a.CoverageFactor, a.ExpandedUncertaintyKg));
        Assert.Null(a.EquivalentsRanges);

        // OLD-B S1 had a yield-high flag (limit 98) and a balance gap, whose limit is max(tolerance, U): neither alone.
        var b = Assert.Single(store.GetLatestBatch("OLD-B")!.Steps).Outcome.Limits;
        Assert.Equal(((double?)null, 98.0, (double?)null, (double?)null), (b.YieldMinPct, b.YieldMaxPct, b.BalanceTolerancePct, b.ExpandedUncertaintyKg));

        var c = Assert.Single(store.GetLatestBatch("OLD-C")!.Steps).Outcome.Limits;
        Assert.Equal(Reconciliation.Outcomes.StepLimits.Unknown, c);
        Assert.Equal("0", Db.Scalar(store.Connection, "SELECT count(*) FROM step_result WHERE balance_tolerance_pct = 0 OR coverage_factor = 0"));

        // The yield history carries the stored limits too.
        var history = store.StepHistory(Build.Recipe, "S1", 10);
        Assert.Contains(history, p => p.BatchId == "OLD-A" && p.YieldMinPct == 88.0 && p.YieldMaxPct is null);
    }

    private static void SeedVersion5(SqliteConnection connection)
    {
        var day = "2026-11-23";
        Db.Execute(connection, $"""
            INSERT INTO ingest_log (id, file_name, sha256, outcome, error_count, batch_count, received_at, processed_at)
            VALUES (1, 'old.csv', '{Build.Sha("old.csv")}', 'stored', 0, 3, '2026-11-23T20:00:00.0000000Z', '2026-11-23T20:00:01.0000000Z');
            INSERT INTO batch (id, batch_id, first_seen_at) VALUES
                (1, 'OLD-A', '2026-11-23T20:00:01.0000000Z'), (2, 'OLD-B', '2026-11-23T20:00:01.0000000Z'), (3, 'OLD-C', '2026-11-23T20:00:01.0000000Z');
            INSERT INTO batch_revision (id, batch_ref, revision, ingest_ref, recipe, recipe_version, content_sha256, production_day, stored_at) VALUES
                (1, 1, 1, 1, '{Build.Recipe}', 1, '{new string('a', 64)}', '{day}', '2026-11-23T20:00:01.0000000Z'),
                (2, 2, 1, 1, '{Build.Recipe}', 2, '{new string('b', 64)}', '{day}', '2026-11-23T20:00:01.0000000Z'),
                (3, 3, 1, 1, '{Build.Recipe}', 2, '{new string('c', 64)}', '{day}', '2026-11-23T20:00:01.0000000Z');
            """);
        foreach (var revision in new[] { 1, 2, 3 })
        {
            Db.Execute(connection, $"""
                INSERT INTO step_result (revision_ref, step, step_order, has_rows, actual_kg, yield_pct, atom_economy_pct, mass_in_kg,
                    reactant_mass_kg, recovered_kg, mass_out_kg, vented_kg, vented_max_kg, gap_kg, combined_uncertainty_kg, equivalents, ladder,
                    recipe, production_day, is_current)
                VALUES ({revision}, 'S1', 1, 1, 80.0, 84.5, 90.0, 505.0, 100.0, 0.0, 480.0, 0.0, 0.0, 25.0, 0.7, '{"{}"}', '[]', '{Build.Recipe}', '{day}', 1);
                """);
        }

        Db.Execute(connection, $"""
            INSERT INTO flag (id, revision_ref, step, code, severity, measured, limit_value, unit, message, created_at, production_day) VALUES
                (1, 1, 'S1', 'yield-low', 'major', 84.5, 88.0, '%', 'yield below range', '2026-11-23T20:00:01.0000000Z', '{day}'),
                (2, 1, 'S1', 'product-in-waste', 'minor', 3.1, 2.5, '%', 'product in waste', '2026-11-23T20:00:01.0000000Z', '{day}'),
                (3, 2, 'S1', 'yield-high', 'major', 99.0, 98.0, '%', 'yield above range', '2026-11-23T20:00:01.0000000Z', '{day}'),
                (4, 2, 'S1', 'balance-gap', 'major', 25.0, 7.5, 'kg', 'mass unaccounted', '2026-11-23T20:00:01.0000000Z', '{day}');
            """);

        // Raw rows as version 5 stored them; OLD-C has none.
        using var insert = new PreparedCommand(
            connection, null, "INSERT INTO raw_rows (revision_ref, header, line_count, lines) VALUES ($revision, $header, $count, $lines)",
            ("$revision", SqliteType.Integer), ("$header", SqliteType.Text), ("$count", SqliteType.Integer), ("$lines", SqliteType.Blob));
        foreach (var (revision, version) in new[] { (1, "1"), (2, "") })
        {
            IReadOnlyList<KeyValuePair<string, string>> Row(string v) =>
                [new("batch", "X"), new(" Recipe_Version ", v), new("step", "S1")];
            var rows = new List<(int Line, IReadOnlyList<KeyValuePair<string, string>> Fields)> { (2, Row("")), (3, Row(version)) };
            var raw = RawRowsJson.Encode(rows, r => r.Line, r => r.Fields);
            insert.Set("$revision", revision).Set("$header", raw.Header).Set("$count", raw.LineCount).Set("$lines", raw.Lines).Execute();
        }
    }
}
