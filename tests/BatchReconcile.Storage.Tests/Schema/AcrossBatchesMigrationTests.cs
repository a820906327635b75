using BatchReconcile.Storage.Queries;
using BatchReconcile.Storage.Schema;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Schema;

/// <summary>
/// The migration for questions across batches (<see cref="Migrations.StepSeriesVersion"/>): recipe version and last output
/// time copied onto step results, filled in for rows stored at the version before, and kept by every commit since.
/// </summary>
public sealed class AcrossBatchesMigrationTests
{
    private const int Before = Migrations.StepSeriesVersion - 1;

    [Fact]
    public void Rows_stored_at_the_version_before_get_their_revisions_recipe_version_and_last_output_time()
    {
        using var db = new TempDatabase();
        using (var connection = db.OpenRaw())
        {
            SchemaMigrator.MigrateTo(connection, Before);
            Db.Execute(connection, $"""
                INSERT INTO ingest_log (id, file_name, sha256, outcome, error_count, batch_count, received_at, processed_at)
                VALUES (1, 'old.csv', '{Build.Sha("old.csv")}', 'stored', 0, 2, '2026-11-23T20:00:00.0000000Z', '2026-11-23T20:00:01.0000000Z');
                INSERT INTO batch (id, batch_id, first_seen_at) VALUES (1, 'OLD-1', '2026-11-23T20:00:01.0000000Z'), (2, 'OLD-2', '2026-11-23T20:00:01.0000000Z');
                INSERT INTO batch_revision (id, batch_ref, revision, ingest_ref, recipe, recipe_version, content_sha256, production_day, last_output_at, stored_at) VALUES
                    (1, 1, 1, 1, '{Build.Recipe}', 2, '{new string('a', 64)}', '2026-11-23', '2026-11-23T14:00:00.0000000Z', '2026-11-23T20:00:01.0000000Z'),
                    (2, 2, 1, 1, '{Build.Recipe}', 1, '{new string('b', 64)}', '2026-11-23', NULL, '2026-11-23T20:00:01.0000000Z');
                """);
            foreach (var (revision, step, order, yield) in new[] { (1, "S1", 1, 91.5), (1, "S2", 2, 77.0), (2, "S1", 1, 88.25) })
            {
                Db.Execute(connection, $"""
                    INSERT INTO step_result (revision_ref, step, step_order, has_rows, actual_kg, yield_pct, atom_economy_pct, mass_in_kg,
                        reactant_mass_kg, recovered_kg, mass_out_kg, vented_kg, vented_max_kg, gap_kg, combined_uncertainty_kg, equivalents, ladder,
                        recipe, production_day, is_current)
                    VALUES ({revision}, '{step}', {order}, 1, 80.0, {yield.ToString(System.Globalization.CultureInfo.InvariantCulture)}, 90.0, 505.0, 100.0, 0.0, 480.0, 0.0, 0.0, 25.0, 0.7, '{"{}"}', '[]', '{Build.Recipe}', '2026-11-23', 1);
                    """);
            }

            Assert.Equal([Migrations.StepSeriesVersion], SchemaMigrator.MigrateTo(connection, Migrations.StepSeriesVersion));
            Assert.Equal(
                "1|S1|2|2026-11-23T14:00:00.0000000Z;1|S2|2|2026-11-23T14:00:00.0000000Z;2|S1|1|",
                Db.Scalar(connection, "SELECT group_concat(revision_ref || '|' || step || '|' || recipe_version || '|' || coalesce(last_output_at, ''), ';') FROM (SELECT * FROM step_result ORDER BY revision_ref, step)"));
        }

        using var store = db.Open();
        // OLD-2 has no output time: unknown comes first on its day.
        Assert.Equal(
            [("OLD-2", 1, 88.25), ("OLD-1", 2, 91.5)],
            store.StepSeries(Build.Recipe, "S1", StepMeasure.Yield).Select(p => (p.BatchId, p.RecipeVersion, p.Value!.Value)));
        Assert.Equal([("OLD-1", 91.5)], store.StepSeries(Build.Recipe, "S1", StepMeasure.Yield, version: 2).Select(p => (p.BatchId, p.Value!.Value)));
        Assert.Equal(["S1", "S2"], store.RecipeSteps(Build.Recipe));
    }

    [Fact]
    public void Commits_write_the_copies_and_a_re_export_leaves_only_the_new_revision_current()
    {
        using var db = new TempDatabase();
        using var store = db.Open();
        store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("CP-1", recipeVersion: 2), Build.Day1))]);
        store.Commit([Build.File("b.csv", Build.Ingest(Build.Batch("CP-1", productKg: 97.0, recipeVersion: 3), Build.Day1))]);

        Assert.Equal(
            "1|0|2|2026-11-23T15:30:00.0000000Z;1|0|2|2026-11-23T15:30:00.0000000Z;2|1|3|2026-11-23T15:30:00.0000000Z;2|1|3|2026-11-23T15:30:00.0000000Z",
            Db.Scalar(store.Connection, "SELECT group_concat(r.revision || '|' || s.is_current || '|' || s.recipe_version || '|' || s.last_output_at, ';') FROM (SELECT * FROM step_result ORDER BY revision_ref, step) s JOIN batch_revision r ON r.id = s.revision_ref"));
        Assert.Equal([(2, 3)], store.StepSeries(Build.Recipe, "S1", StepMeasure.Yield).Select(p => (p.Revision, p.RecipeVersion)));
    }
}
