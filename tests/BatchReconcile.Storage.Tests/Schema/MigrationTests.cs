using BatchReconcile.Storage.Digests;
using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Storage.Review;
using BatchReconcile.Storage.Schema;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Schema;

public sealed class MigrationTests
{
    private static readonly string[] Tables = ["ingest_log", "batch", "batch_revision", "raw_rows", "step_result", "flag", "audit_event", "digest"];

    public static TheoryData<int> EarlierVersions()
    {
        var data = new TheoryData<int>();
        foreach (var migration in Migrations.All.Where(m => m.Version < Migrations.Latest))
        {
            data.Add(migration.Version);
        }

        return data;
    }

    [Fact]
    public void Migrations_are_numbered_from_one_without_gaps()
    {
        Assert.Equal(Enumerable.Range(1, Migrations.All.Count), Migrations.All.Select(m => m.Version));
        Assert.True(Migrations.Latest >= 2, "at least two migrations, so that upgrading an earlier version is exercised");
    }

    [Fact]
    public void An_empty_database_is_migrated_to_the_latest_version()
    {
        using var db = new TempDatabase();
        using (var store = db.Open())
        {
            Assert.Equal(Migrations.Latest, SchemaMigrator.CurrentVersion((Microsoft.Data.Sqlite.SqliteConnection)store.Connection));
            foreach (var table in Tables)
            {
                Assert.Equal("1", Db.Scalar(store.Connection, $"SELECT count(*) FROM sqlite_master WHERE type = 'table' AND name = '{table}'"));
            }
        }

        // Opening again applies nothing.
        using var connection = db.OpenRaw();
        Assert.Empty(SchemaMigrator.MigrateToLatest(connection));
    }

    [Theory]
    [MemberData(nameof(EarlierVersions))]
    public void A_database_at_an_earlier_version_is_migrated_with_its_data_kept(int version)
    {
        using var db = new TempDatabase();
        using (var connection = db.OpenRaw())
        {
            // From version 4 on the audit chain refuses rows written by hand, so a later version is
            // seeded as version 3 and brought up to it by its own migrations.
            var seeded = Math.Min(version, 3);
            Assert.Equal(Enumerable.Range(1, seeded), SchemaMigrator.MigrateTo(connection, seeded));
            Seed(connection, seeded);
            Assert.Equal(Enumerable.Range(seeded + 1, version - seeded), SchemaMigrator.MigrateTo(connection, version));
        }

        using var store = db.Open();
        Assert.Equal(Migrations.Latest, SchemaMigrator.CurrentVersion((Microsoft.Data.Sqlite.SqliteConnection)store.Connection));

        var batch = store.GetLatestBatch("OLD-001");
        Assert.NotNull(batch);
        Assert.Equal(2, batch.Revision);
        Assert.Equal(2, batch.RevisionCount);
        Assert.Equal(Build.Day1, batch.ProductionDay);
        var step = Assert.Single(batch.Steps);
        Assert.Equal(91.25, step.Outcome.YieldPct);
        var flag = Assert.Single(step.Flags);
        Assert.Equal(7, flag.Id);
        Assert.True(flag.IsCurrent);
        Assert.Equal(FlagReview.Unreviewed, flag.Review);

        // Version 4: the open flag of the superseded revision was closed by the system, in the trail.
        var old = Assert.Single(store.GetBatch("OLD-001", 1)!.Flags);
        Assert.Equal((ReviewState.Closed, CloseOutcome.Superseded, "system"), (old.Review.State, old.Review.Outcome, old.Review.By));
        Assert.Equal("superseded by revision 2 (closed when the review trail was added to the database)", old.Review.Note);
        var closing = Assert.Single(store.AuditTrailOf("flag:6"));
        Assert.Equal((SeededAuditEvents(version) + 1, "system", "open", "closed"), (closing.Id, closing.Actor, closing.FromState, closing.ToState));

        // The events of version 3 were linked into the hash chain in id order, their content unchanged.
        var ingestEvents = store.AuditTrailOf("file:" + Build.Sha("old-1.csv"));
        Assert.Equal(version >= 3 ? 1 : 0, ingestEvents.Count);
        if (version >= 3)
        {
            var first = ingestEvents[0];
            Assert.Equal((1L, "system", "ingest.stored", "2026-11-23T20:00:01.0000000Z"), (first.Id, first.Actor, first.Kind, first.At));
            Assert.Equal(new string('0', 64), first.PreviousHash);
            Assert.Equal(BatchReconcile.Storage.Audit.AuditCanonicalForm.Hash(first), first.Hash);
        }

        var verified = store.VerifyAudit();
        Assert.True(verified.Intact, verified.Message);
        Assert.Equal(SeededAuditEvents(version) + 1, verified.EntriesChecked);
        Assert.Throws<Microsoft.Data.Sqlite.SqliteException>(() => Db.Execute(store.Connection, "UPDATE audit_event SET note = 'x' WHERE id = 1"));

        // The columns added by later migrations were filled from the old rows: the day and
        // step-history queries find the seeded data, and the superseded revision stays out.
        var dayFlags = store.ListFlags(Build.Day1);
        Assert.Equal([7L], dayFlags.Select(f => f.Id));
        Assert.Equal([6L, 7L], store.ListFlags(Build.Day1, includeSuperseded: true).Select(f => f.Id));
        var history = Assert.Single(store.StepHistory(Build.Recipe, "S1", 10));
        Assert.Equal(("OLD-001", 2, 91.25), (history.BatchId, history.Revision, history.YieldPct));
        Assert.True(store.IsKnown(Build.Sha("old-2.csv")));

        // Version 5: each revision's rows became one record; every line keeps its number, names, order and values.
        Assert.Equal("0", Db.Scalar(store.Connection, "SELECT count(*) FROM sqlite_master WHERE name = 'raw_row'"));
        Assert.Equal(
            [(2, "batch=OLD-001;quantity=86.00"), (3, "batch=OLD-001;quantity=86,0;stream=Mutterlauge ä \"1\"")],
            store.GetRawRows("OLD-001", 2).Select(r => (r.Line, string.Join(';', r.Fields.Select(f => f.Key + "=" + f.Value)))));
        Assert.Equal([(2, "batch=OLD-001;quantity=84.50")], store.GetRawRows("OLD-001", 1).Select(r => (r.Line, string.Join(';', r.Fields.Select(f => f.Key + "=" + f.Value)))));

        // And the migrated database takes new files.
        var result = Assert.Single(store.Commit([Build.File("new.csv", Build.Ingest(Build.Batch("NEW-001"), Build.Day2, Build.Flag("S2")))]));
        Assert.Equal(BatchReconcile.Storage.Ingest.IngestOutcome.Stored, result.Outcome);
        Assert.True(Assert.Single(result.Batches).FlagIds.Single() > 7, "flag ids continue after the old ones");
        Assert.True(store.ReviewFlag(7, ReviewState.Closed, "A. Chen", "gap explained by a sampling loss", CloseOutcome.Explained).Accepted);
        Assert.True(store.RecordDigest(Build.Day1, ["digests/2026-11-23.md"], 1, rewrite: false, "system").Recorded);
        Assert.True(store.VerifyAudit().Intact);
    }

    [Fact]
    public void The_digest_freshness_migration_counts_the_changes_and_finds_a_digest_older_than_a_revision_of_its_day()
    {
        using var db = new TempDatabase();
        using (var connection = db.OpenRaw())
        {
            SchemaMigrator.MigrateTo(connection, 3);
            Seed(connection, 3);
            SchemaMigrator.MigrateTo(connection, 7);
            // Written by the earlier program: day 1's digest at 06:30 on the 24th, after revision 1 (20:00 on the 23rd)
            // and the in-review decision on flag 7 (06:00), before revision 2 (07:00). Day 22's digest: nothing stored for it.
            Db.Execute(connection, """
                UPDATE flag SET state = 'in-review', reviewed_by = 'A. Chen', reviewed_at = '2026-11-24T06:00:00.0000000Z' WHERE id = 7;
                INSERT INTO digest (day, written_at, written_by, is_rewrite, files, flag_count)
                VALUES ('2026-11-23', '2026-11-24T06:30:00.0000000Z', 'system', 0, '["d.html"]', 1),
                       ('2026-11-22', '2026-11-23T06:30:00.0000000Z', 'system', 0, '["e.html"]', 0);
                """);
            Assert.Equal([8], SchemaMigrator.MigrateTo(connection, 8));
        }

        using var store = db.Open();
        Assert.Equal(new DayChanges(1, 1, 0, 1), store.DayChangesOf(Build.Day1));
        Assert.Equal(new DayChanges(1, 0, 0, 1), store.GetDigest(Build.Day1)!.Latest.Seen);
        Assert.Equal(DayChanges.None, store.GetDigest(new DateOnly(2026, 11, 22))!.Latest.Seen);
        Assert.Equal([Build.Day1], store.StaleDigestDays());

        // The triggers count from here on: a new batch for day 22 makes its digest stale too.
        store.Commit([Build.File("late.csv", Build.Ingest(Build.Batch("LATE-1"), new DateOnly(2026, 11, 22)))]);
        Assert.Equal([new DateOnly(2026, 11, 22), Build.Day1], store.StaleDigestDays());
    }

    [Fact]
    public void A_database_newer_than_the_program_is_refused_and_left_alone()
    {
        using var db = new TempDatabase();
        var newer = Migrations.Latest + 1;
        using (var connection = db.OpenRaw())
        {
            Db.Execute(connection, $"PRAGMA user_version = {newer}");
        }

        var refused = Assert.Throws<StoreException>(() => db.Open());
        Assert.Contains($"schema version {newer}", refused.Message, StringComparison.Ordinal);
        Assert.Contains($"up to {Migrations.Latest}", refused.Message, StringComparison.Ordinal);

        using var check = db.OpenRaw();
        Assert.Equal(newer, SchemaMigrator.CurrentVersion(check));
        Assert.Equal("0", Db.Scalar(check, "SELECT count(*) FROM sqlite_master WHERE type = 'table'"));
    }

    private static int SeededAuditEvents(int version) => version >= 3 ? 3 : 0;

    /// <summary>
    /// Rows as the program of that version wrote them: one batch with a superseded revision 1 and
    /// a current revision 2, one step result and one flag each; from version 3 their audit events.
    /// </summary>
    private static void Seed(Microsoft.Data.Sqlite.SqliteConnection connection, int version)
    {
        var sha1 = Build.Sha("old-1.csv");
        var sha2 = Build.Sha("old-2.csv");
        var content = new string('a', 64);
        var day = "2026-11-23";
        var emptyObject = "{}";
        Db.Execute(connection, $"""
            INSERT INTO ingest_log (id, file_name, sha256, outcome, error_count, batch_count, received_at, processed_at)
            VALUES (1, 'old-1.csv', '{sha1}', 'stored', 0, 1, '2026-11-23T20:00:00.0000000Z', '2026-11-23T20:00:01.0000000Z'),
                   (2, 'old-2.csv', '{sha2}', 'revision', 0, 1, '2026-11-24T07:00:00.0000000Z', '2026-11-24T07:00:01.0000000Z');
            INSERT INTO batch (id, batch_id, first_seen_at) VALUES (1, 'OLD-001', '2026-11-23T20:00:01.0000000Z');
            INSERT INTO batch_revision (id, batch_ref, revision, ingest_ref, recipe, recipe_version, content_sha256, production_day, stored_at, superseded_at)
            VALUES (1, 1, 1, 1, '{Build.Recipe}', 1, '{content}', '{day}', '2026-11-23T20:00:01.0000000Z', '2026-11-24T07:00:01.0000000Z');
            INSERT INTO batch_revision (id, batch_ref, revision, ingest_ref, recipe, recipe_version, content_sha256, production_day, stored_at)
            VALUES (2, 1, 2, 2, '{Build.Recipe}', 1, '{content.Replace('a', 'b')}', '{day}', '2026-11-24T07:00:01.0000000Z');
            UPDATE batch_revision SET superseded_by = 2 WHERE id = 1;
            INSERT INTO raw_row (revision_ref, line, fields) VALUES
                (1, 2, '[["batch","OLD-001"],["quantity","84.50"]]'),
                (2, 3, '[["batch","OLD-001"],["quantity","86,0"],["stream","Mutterlauge \u00e4 \"1\""]]'),
                (2, 2, '[["batch","OLD-001"],["quantity","86.00"]]');
            INSERT INTO step_result (revision_ref, step, step_order, has_rows, actual_kg, yield_pct, atom_economy_pct, mass_in_kg,
                reactant_mass_kg, recovered_kg, mass_out_kg, vented_kg, vented_max_kg, gap_kg, combined_uncertainty_kg, equivalents, ladder)
            VALUES (1, 'S1', 1, 1, 80.0, 84.5, 90.0, 505.0, 100.0, 0.0, 480.0, 0.0, 0.0, 25.0, 0.7, '{emptyObject}', '[]'),
                   (2, 'S1', 1, 1, 86.0, 91.25, 90.0, 505.0, 100.0, 0.0, 500.0, 0.0, 0.0, 5.0, 0.7, '{emptyObject}', '[]');
            INSERT INTO flag (id, revision_ref, step, code, severity, measured, limit_value, unit, message, created_at)
            VALUES (6, 1, 'S1', 'yield-low', 'major', 84.5, 88.0, '%', 'yield below range', '2026-11-23T20:00:01.0000000Z'),
                   (7, 2, 'S1', 'balance-gap', 'major', 5.0, 2.0, 'kg', 'mass unaccounted', '2026-11-24T07:00:01.0000000Z');
            """);

        if (version >= 2)
        {
            // The version-2 program filled the query columns itself when it wrote a row.
            Db.Execute(connection, $"""
                UPDATE flag SET production_day = '{day}', is_current = (revision_ref = 2);
                UPDATE step_result SET recipe = '{Build.Recipe}', production_day = '{day}', is_current = (revision_ref = 2);
                """);
        }

        if (version >= 3)
        {
            // What the version-3 commit wrote: one event per file and one for the revision.
            Db.Execute(connection, $$"""
                INSERT INTO audit_event (at, kind, subject, detail) VALUES
                    ('2026-11-23T20:00:01.0000000Z', 'ingest.stored', 'file:{{sha1}}', '{"file":"old-1.csv","sha256":"{{sha1}}"}'),
                    ('2026-11-24T07:00:01.0000000Z', 'batch.revision', 'batch:OLD-001', '{"batch":"OLD-001","supersededRevision":1,"revision":2,"note":"it''s "quoted""}'),
                    ('2026-11-24T07:00:01.0000000Z', 'ingest.revision', 'file:{{sha2}}', '{"file":"old-2.csv","sha256":"{{sha2}}"}');
                """);
        }
    }
}
