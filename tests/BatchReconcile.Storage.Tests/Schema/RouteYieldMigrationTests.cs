using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Storage.Ingest;
using BatchReconcile.Storage.Schema;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Schema;

/// <summary>Migration 7: route yield and step links per batch revision (issue 9, point 6).</summary>
public sealed class RouteYieldMigrationTests
{
    [Fact]
    public void Revisions_stored_before_version_7_are_marked_not_computed_and_their_links_unknown()
    {
        using var db = new TempDatabase();
        using (var connection = db.OpenRaw())
        {
            SchemaMigrator.MigrateTo(connection, 6);
            var sha = Build.Sha("old.csv");
            Db.Execute(connection, $"""
                INSERT INTO ingest_log (id, file_name, sha256, outcome, error_count, batch_count, received_at, processed_at)
                VALUES (1, 'old.csv', '{sha}', 'stored', 0, 1, '2026-11-23T20:00:00.0000000Z', '2026-11-23T20:00:01.0000000Z');
                INSERT INTO batch (id, batch_id, first_seen_at) VALUES (1, 'OLD-007', '2026-11-23T20:00:01.0000000Z');
                INSERT INTO batch_revision (id, batch_ref, revision, ingest_ref, recipe, recipe_version, content_sha256, production_day, stored_at)
                VALUES (1, 1, 1, 1, '{Build.Recipe}', 1, '{new string('c', 64)}', '2026-11-23', '2026-11-23T20:00:01.0000000Z');
                """);
            Assert.Equal([7], SchemaMigrator.MigrateTo(connection, 7));
            Assert.Equal(Migrations.RouteNotComputedBefore7, Db.Scalar(connection, "SELECT route_note FROM batch_revision WHERE id = 1"));
        }

        using var store = db.Open();
        var old = store.GetLatestBatch("OLD-007")!;
        Assert.Equal(RouteYield.NotComputable(Migrations.RouteNotComputedBefore7), old.Route);
        Assert.Null(old.Links);
    }

    [Fact]
    public void A_new_revision_keeps_its_route_yield_and_links()
    {
        using var db = new TempDatabase();
        using var store = db.Open();
        IntermediateLink[] links = [new("ENB", "S1", "S2", 95.03, 95.03, 90.0, 2.0)];
        var outcome = Build.Outcome(Build.Batch("RY-001")) with { Route = new RouteYield(65.91799876577127, 182.0443615504776, null), Links = links };
        var heldBack = Build.Outcome(Build.Batch("RY-002")) with { Route = RouteYield.NotComputable("step S2 has no rows") };
        store.Commit([Build.File("ry.csv", new BatchIngest(outcome, Build.Day1), new BatchIngest(heldBack, Build.Day1))]);

        var view = store.GetLatestBatch("RY-001")!;
        Assert.Equal(outcome.Route, view.Route);
        Assert.Equal(links, view.Links);
        Assert.Equal("held-back", Assert.Single(view.Links!).State);

        var other = store.GetLatestBatch("RY-002")!;
        Assert.Equal(RouteYield.NotComputable("step S2 has no rows"), other.Route);
        Assert.Empty(other.Links!);
    }
}
