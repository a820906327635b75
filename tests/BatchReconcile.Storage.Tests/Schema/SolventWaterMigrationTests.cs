using BatchReconcile.Chemistry.Metrics;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Storage.Ingest;
using BatchReconcile.Storage.Schema;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Schema;

/// <summary>Migration 9: solvent and water charged per step result; per-material parts of the ladder in its JSON (issue 11).</summary>
public sealed class SolventWaterMigrationTests
{
    [Fact]
    public void Steps_stored_before_version_9_have_unknown_solvent_and_water_and_rungs_without_parts()
    {
        using var db = new TempDatabase();
        using (var connection = db.OpenRaw())
        {
            SchemaMigrator.MigrateTo(connection, 8);
            var sha = Build.Sha("old.csv");

            // The ladder JSON as versions 1 to 8 wrote it: no "parts".
            Db.Execute(connection, $$"""
                INSERT INTO ingest_log (id, file_name, sha256, outcome, error_count, batch_count, received_at, processed_at)
                VALUES (1, 'old.csv', '{{sha}}', 'stored', 0, 1, '2026-11-23T20:00:00.0000000Z', '2026-11-23T20:00:01.0000000Z');
                INSERT INTO batch (id, batch_id, first_seen_at) VALUES (1, 'OLD-009', '2026-11-23T20:00:01.0000000Z');
                INSERT INTO batch_revision (id, batch_ref, revision, ingest_ref, recipe, recipe_version, content_sha256, production_day, stored_at)
                VALUES (1, 1, 1, 1, '{{Build.Recipe}}', 1, '{{new string('c', 64)}}', '2026-11-23', '2026-11-23T20:00:01.0000000Z');
                INSERT INTO step_result (revision_ref, step, step_order, has_rows, actual_kg, atom_economy_pct, mass_in_kg, reactant_mass_kg,
                    recovered_kg, mass_out_kg, vented_kg, vented_max_kg, gap_kg, combined_uncertainty_kg, equivalents, ladder, recipe, production_day)
                VALUES (1, 'S1', 1, 1, 90.0, 80.0, 500.0, 120.0, 0, 495.0, 0, 0, 5.0, 0.7, '{}',
                    '[{"key":"auxiliaries-not-recovered","label":"solvents","kg":380.0,"pctOfCharged":76.0}]', '{{Build.Recipe}}', '2026-11-23');
                """);
            Assert.Equal([9], SchemaMigrator.MigrateTo(connection, 9));
            Assert.Equal("1", Db.Scalar(connection, "SELECT count(*) FROM step_result WHERE solvent_in_kg IS NULL AND water_in_kg IS NULL"));
            Assert.Equal("1", Db.Scalar(connection, "SELECT count(*) FROM pragma_table_info('step_result') WHERE name = 'solvent_in_kg'"));
        }

        using var store = db.Open();
        var step = Assert.Single(store.GetLatestBatch("OLD-009")!.Steps).Outcome;
        Assert.Null(step.SolventInKg);
        Assert.Null(step.WaterInKg);
        var rung = Assert.Single(step.Ladder);
        Assert.Equal(("auxiliaries-not-recovered", 380.0), (rung.Key, rung.Kg));
        Assert.Empty(rung.Parts);
    }

    [Fact]
    public void A_new_step_keeps_its_solvent_water_and_ladder_parts()
    {
        using var db = new TempDatabase();
        using var store = db.Open();
        var outcome = Build.Outcome(Build.Batch("SW-001"));
        store.Commit([Build.File("sw.csv", new BatchIngest(outcome, Build.Day1))]);

        var stored = store.GetLatestBatch("SW-001")!.Steps[0].Outcome;
        Assert.Equal((94.34, 94.35), (stored.SolventInKg, stored.WaterInKg));
        var rung = stored.Ladder.Single(r => r.Key == LadderRungKeys.AuxiliariesNotRecovered);
        Assert.Equal([new LadderPart("ETOH", 94.20), new LadderPart("WATER", 0.04)], rung.Parts);
        Assert.Empty(stored.Ladder.Single(r => r.Key == LadderRungKeys.UnexplainedYieldLoss).Parts);
    }
}
