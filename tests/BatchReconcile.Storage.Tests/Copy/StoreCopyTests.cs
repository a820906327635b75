using System.Data.Common;
using System.Globalization;
using System.Text.Json;
using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Storage.Queries;
using BatchReconcile.Storage.Tests.Audit;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Copy;

/// <summary>
/// <c>BatchStore.CopyTo</c>: a SQLite store filled with files, a re-export, a quarantined file, a duplicate, reviewed and closed
/// flags and digest records is copied into a fresh PostgreSQL site, and the copy is compared row by row, through the store's
/// queries and through its audit verification.
/// </summary>
public sealed class StoreCopyTests
{
    private static readonly string[] Tables = ["ingest_log", "batch", "batch_revision", "raw_rows", "step_result", "flag", "audit_event", "digest", "day_change"];

    private static readonly Dictionary<string, string> Keys = new(StringComparer.Ordinal)
    {
        ["raw_rows"] = "revision_ref",
        ["step_result"] = "revision_ref, step",
        ["day_change"] = "day",
    };

    [Theory]
    [InlineData(1, true)]
    [InlineData(3, true)]
    [InlineData(10_000, true)]
    [InlineData(1, false)]
    [InlineData(10_000, false)]
    public void Every_row_is_copied_with_its_id_and_the_copy_verifies_as_the_source_does(int chunkRows, bool skipTriggers)
    {
        using var sqlite = new TempDatabase();
        using var postgres = new TempDatabase(StoreProvider.Postgresql);
        using var source = AuditChainTests.Filled(sqlite);
        using var target = postgres.Open();
        var before = Dump(source.Connection);

        var result = source.CopyTo(target, chunkRows, skipTriggers);

        Assert.Equal(skipTriggers, result.TriggersSkipped);
        Assert.Equal(["audit_event_chained:O", "audit_event_no_truncate:O", "audit_event_no_update:O", "day_change_review:O", "day_change_revision:O", "day_change_withdrawn:O"], Triggers(target));
        Assert.Equal(Tables, result.Tables.Select(t => t.Table));
        foreach (var table in Tables)
        {
            Assert.Equal(Db.Count(source.Connection, table), result.RowsOf(table));
            Assert.Equal(Db.Count(source.Connection, table), Db.Count(target.Connection, table));
        }

        Assert.True(result.RowsOf("batch_revision") > result.RowsOf("batch"), "the source holds a re-export");
        Assert.Equal(sqlite.DatabasePath, result.Source);
        Assert.Equal(target.DatabasePath, result.Target);
        Assert.Equal(Db.Scalar(source.Connection, "SELECT seq FROM sqlite_sequence WHERE name = 'audit_event'"), result.AuditHighWater?.ToString(CultureInfo.InvariantCulture));
        Assert.Equal(result.AuditHighWater?.ToString(CultureInfo.InvariantCulture), Db.Scalar(target.Connection, "SELECT seq FROM audit_high_water"));

        // Row by row, every column, ids included; and the source is as it was.
        Assert.Equal(before, Dump(target.Connection));
        Assert.Equal(before, Dump(source.Connection));

        var inSource = source.VerifyAudit();
        var inCopy = target.VerifyAudit();
        Assert.True(inSource.Intact, inSource.Message);
        Assert.True(inCopy.Intact, inCopy.Message);
        Assert.Equal(inSource.EntriesChecked, inCopy.EntriesChecked);
        Assert.Equal(inSource.LastHash, inCopy.LastHash);
        Assert.Equal(Db.Count(source.Connection, "audit_event"), inCopy.EntriesChecked);
    }

    [Fact]
    public void The_copy_answers_the_stores_queries_as_the_source_does()
    {
        using var sqlite = new TempDatabase();
        using var postgres = new TempDatabase(StoreProvider.Postgresql);
        using var source = AuditChainTests.Filled(sqlite);
        using var target = postgres.Open();
        source.CopyTo(target);

        Assert.Equal(Json(source.ListBatches(BatchFilter.All)), Json(target.ListBatches(BatchFilter.All)));
        foreach (var batch in new[] { "BZ-001", "BZ-002" })
        {
            var latest = source.GetLatestBatch(batch);
            Assert.NotNull(latest);
            Assert.Equal(Json(latest), Json(target.GetLatestBatch(batch)));
            Assert.Equal(Json(source.GetBatch(batch, 1)), Json(target.GetBatch(batch, 1)));
            Assert.Equal(Json(source.GetRawRows(batch)), Json(target.GetRawRows(batch)));
        }

        Assert.Equal(2, target.GetLatestBatch("BZ-001")!.Revision);
        var flags = source.ListFlags(includeSuperseded: true);
        Assert.Contains(flags, f => f.Review.State == ReviewState.Closed && f.Review.Outcome == CloseOutcome.Deviation);
        Assert.Equal(Json(flags), Json(target.ListFlags(includeSuperseded: true)));
        Assert.Equal(Json(source.ListFlags(unresolvedOnly: true)), Json(target.ListFlags(unresolvedOnly: true)));
        foreach (var flag in flags)
        {
            Assert.Equal(Json(source.GetFlag(flag.Id)), Json(target.GetFlag(flag.Id)));
        }

        Assert.Equal(Json(source.ListAudit(new AuditFilter())), Json(target.ListAudit(new AuditFilter())));
        Assert.Equal(Json(source.GetDigest(Build.Day1)), Json(target.GetDigest(Build.Day1)));
        Assert.Equal(Json(source.DayChangesOf(Build.Day1)), Json(target.DayChangesOf(Build.Day1)));
        Assert.Equal(source.StaleDigestDays(), target.StaleDigestDays());
        Assert.True(target.IsKnown(Build.Sha("a.csv")));
        Assert.True(target.IsKnown(Build.Sha("bad.csv")));
    }

    [Fact]
    public void A_second_copy_into_the_same_site_is_refused_and_changes_nothing()
    {
        using var sqlite = new TempDatabase();
        using var postgres = new TempDatabase(StoreProvider.Postgresql);
        using var source = AuditChainTests.Filled(sqlite);
        using var target = postgres.Open();
        source.CopyTo(target);
        var copied = Dump(target.Connection);

        var refusal = Assert.Throws<StoreException>(() => source.CopyTo(target));

        Assert.True(refusal.Refused);
        Assert.False(refusal.Transient);
        var files = Db.Count(source.Connection, "ingest_log");
        var entries = Db.Count(source.Connection, "audit_event");
        Assert.StartsWith($"{target.DatabasePath} already holds {files} files, 2 batches and {entries} audit entries: a copy goes only into an empty site", refusal.Message, StringComparison.Ordinal);
        Assert.Equal(copied, Dump(target.Connection));
        Assert.True(target.VerifyAudit().Intact);

        // Opened again by another instance, the same.
        using var again = postgres.Open();
        Assert.True(Assert.Throws<StoreException>(() => source.CopyTo(again)).Refused);
        Assert.Equal(copied, Dump(again.Connection));
    }

    [Fact]
    public void A_site_holding_only_a_quarantined_file_is_not_empty_either()
    {
        using var sqlite = new TempDatabase();
        using var postgres = new TempDatabase(StoreProvider.Postgresql);
        using var source = AuditChainTests.Filled(sqlite);
        using var target = postgres.Open();
        target.Commit([Build.Quarantined("other.csv", 1)]);
        var held = Dump(target.Connection);

        var refusal = Assert.Throws<StoreException>(() => source.CopyTo(target));

        Assert.True(refusal.Refused);
        Assert.Contains("already holds 1 file, 0 batches and 1 audit entry", refusal.Message, StringComparison.Ordinal);
        Assert.Equal(held, Dump(target.Connection));
    }

    [Fact]
    public void Files_stored_into_the_copy_get_the_ids_the_source_would_have_given_and_the_chain_goes_on()
    {
        using var sqlite = new TempDatabase();
        using var postgres = new TempDatabase(StoreProvider.Postgresql);
        using var source = AuditChainTests.Filled(sqlite);
        using var target = postgres.Open();
        var maxFlag = long.Parse(Db.Scalar(source.Connection, "SELECT max(id) FROM flag")!, CultureInfo.InvariantCulture);
        var maxFile = long.Parse(Db.Scalar(source.Connection, "SELECT max(id) FROM ingest_log")!, CultureInfo.InvariantCulture);
        source.CopyTo(target);

        // The same work on both: a new batch with a flag, a re-export of an old one, a review, a digest of a new day.
        foreach (var store in new[] { source, target })
        {
            var results = store.Commit([
                Build.File("c.csv", Build.Ingest(Build.Batch("BZ-003"), Build.Day2, Build.Flag("S1"))),
                Build.File("d.csv", Build.Ingest(Build.Batch("BZ-002", productKg: 93.0), Build.Day1, Build.Flag("S2"))),
            ]);
            Assert.All(results, r => Assert.Null(r.Failure));
            var flag = store.ListFlags().Single(f => f.BatchId == "BZ-003").Id;
            Assert.True(flag > maxFlag, $"flag {flag} is new");
            Assert.True(store.ReviewFlag(flag, ReviewState.Closed, "B. Osei", "explained by the assay", CloseOutcome.Explained).Accepted);
            Assert.True(store.RecordDigest(Build.Day2, ["digests/2026-11-24.html"], 1, rewrite: false, "system").Recorded);
        }

        Assert.Equal((maxFile + 1).ToString(CultureInfo.InvariantCulture), Db.Scalar(target.Connection, "SELECT id FROM ingest_log WHERE file_name = 'c.csv'"));
        Assert.Equal(Dump(source.Connection), Dump(target.Connection));
        var inSource = source.VerifyAudit();
        var inCopy = target.VerifyAudit();
        Assert.True(inCopy.Intact, inCopy.Message);
        Assert.Equal((inSource.EntriesChecked, inSource.LastHash), (inCopy.EntriesChecked, inCopy.LastHash));
        Assert.Equal(Db.Count(target.Connection, "audit_event"), inCopy.EntriesChecked);
    }

    [Fact]
    public void An_empty_source_gives_an_empty_copy_that_later_files_fill_from_id_1()
    {
        using var sqlite = new TempDatabase();
        using var postgres = new TempDatabase(StoreProvider.Postgresql);
        using var source = sqlite.Open();
        using var target = postgres.Open();

        var result = source.CopyTo(target);

        Assert.Equal(0, result.Rows);
        Assert.Null(result.AuditHighWater);
        Assert.Equal("the audit trail is empty", target.VerifyAudit().Message);
        target.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1))]);
        Assert.Equal("1", Db.Scalar(target.Connection, "SELECT min(id) FROM ingest_log"));
        Assert.True(target.VerifyAudit().Intact);
    }

    /// <summary>Each entry's link is checked as it is read, as the target's chain trigger would: a source whose chain was broken is not copied.</summary>
    [Fact]
    public void A_source_whose_chain_was_broken_is_refused_and_nothing_is_copied()
    {
        using var sqlite = new TempDatabase();
        using var postgres = new TempDatabase(StoreProvider.Postgresql);
        using (AuditChainTests.Filled(sqlite))
        {
        }

        Sqlite3Shell.Run(sqlite.DatabasePath, $"PRAGMA busy_timeout = 5000; DROP TRIGGER audit_event_no_update; UPDATE audit_event SET prev_hash = '{new string('a', 64)}' WHERE id = 4;");
        using var source = sqlite.Open();
        Assert.False(source.VerifyAudit().Intact);
        using var target = postgres.Open();

        var failure = Assert.Throws<StoreException>(() => source.CopyTo(target, chunkRows: 2));

        Assert.True(failure.Refused);
        Assert.Equal(
            $"{sqlite.DatabasePath}: audit entry 4 does not link to the entry before it (its previous hash is not the hash of entry 3): the audit " +
            "trail of the store is broken, and a copy would carry the break on ('audit verify' names what does not verify). Nothing was copied.",
            failure.Message);
        foreach (var table in Tables.Append("audit_high_water"))
        {
            Assert.Equal(0, Db.Count(target.Connection, table));
        }

        // The failed copy left the site usable and empty: a copy of a sound store goes through afterwards.
        using var sound = new TempDatabase();
        using var other = AuditChainTests.Filled(sound);
        other.CopyTo(target);
        Assert.True(target.VerifyAudit().Intact);
    }

    /// <summary>SQLite keeps text in a REAL column when it does not read as a number; PostgreSQL's column cannot take it.</summary>
    [Fact]
    public void A_value_the_targets_column_cannot_take_stops_the_copy_in_the_middle_of_a_table_and_nothing_is_copied()
    {
        using var sqlite = new TempDatabase();
        using var postgres = new TempDatabase(StoreProvider.Postgresql);
        using (AuditChainTests.Filled(sqlite))
        {
        }

        Sqlite3Shell.Run(sqlite.DatabasePath, "PRAGMA busy_timeout = 5000; UPDATE step_result SET actual_kg = 'lots' WHERE step = 'S2' AND revision_ref = (SELECT max(revision_ref) FROM step_result);");
        using var source = sqlite.Open();
        using var target = postgres.Open();

        var failure = Assert.Throws<StoreException>(() => source.CopyTo(target));

        Assert.Equal("step_result.actual_kg holds a text value where PostgreSQL keeps double (changed outside the program?); nothing was copied.", failure.Message);
        foreach (var table in Tables)
        {
            Assert.Equal(0, Db.Count(target.Connection, table));
        }

        Assert.Equal("the audit trail is empty", target.VerifyAudit().Message);
    }

    [Fact]
    public void A_copy_goes_from_sqlite_to_postgresql_only()
    {
        using var a = new TempDatabase();
        using var b = new TempDatabase();
        using var p = new TempDatabase(StoreProvider.Postgresql);
        using var sqlite = a.Open();
        using var otherSqlite = b.Open();
        using var postgres = p.Open();

        Assert.Throws<ArgumentException>(() => sqlite.CopyTo(otherSqlite));
        Assert.Throws<ArgumentException>(() => postgres.CopyTo(sqlite));
    }

    /// <summary>
    /// A role that may read and write the site's tables but does not own them (an administrator made the schema, as
    /// docs/configuration.md allows) cannot turn triggers off: the copy runs with them on and gives the same copy.
    /// </summary>
    [Fact]
    public void A_role_that_does_not_own_the_tables_copies_with_the_triggers_on()
    {
        using var sqlite = new TempDatabase();
        using var postgres = new TempDatabase(StoreProvider.Postgresql);
        using var source = AuditChainTests.Filled(sqlite);
        using (postgres.Open())
        {
        }

        var role = "copy_" + postgres.SiteCode;
        var password = Guid.NewGuid().ToString("N");
        var schema = "site_" + postgres.SiteCode;
        var database = new Npgsql.NpgsqlConnectionStringBuilder(PostgresTestServer.ConnectionString).Database;
        AsAdmin(
            $"CREATE ROLE {role} LOGIN PASSWORD '{password}'; GRANT CONNECT ON DATABASE {database} TO {role}; GRANT USAGE ON SCHEMA {schema} TO {role}; " +
            $"GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA {schema} TO {role}; GRANT USAGE, SELECT, UPDATE ON ALL SEQUENCES IN SCHEMA {schema} TO {role};");
        try
        {
            var login = new Npgsql.NpgsqlConnectionStringBuilder(PostgresTestServer.ConnectionString) { Username = role, Password = password }.ConnectionString;
            using (var target = BatchStore.OpenPostgres(login, postgres.SiteCode, new StoreSettings(), new FixedTime(Build.ProcessedAt)))
            {
                var result = source.CopyTo(target);

                Assert.False(result.TriggersSkipped);
                Assert.Equal(Dump(source.Connection), Dump(target.Connection));
                Assert.True(target.VerifyAudit().Intact);
                target.Commit([Build.File("c.csv", Build.Ingest(Build.Batch("BZ-003"), Build.Day2, Build.Flag("S1")))]);
                Assert.True(target.VerifyAudit().Intact);
            }
        }
        finally
        {
            Npgsql.NpgsqlConnection.ClearAllPools();
            AsAdmin($"DROP OWNED BY {role}; DROP ROLE {role};");
        }
    }

    private static void AsAdmin(string sql)
    {
        using var connection = new Npgsql.NpgsqlConnection(PostgresTestServer.ConnectionString);
        connection.Open();
        Db.Execute(connection, sql);
    }

    /// <summary>The site's triggers with their state (O: on).</summary>
    private static List<string> Triggers(BatchStore store)
    {
        using var command = store.Connection.CreateCommand();
        command.CommandText = "SELECT t.tgname::text || ':' || t.tgenabled::text FROM pg_trigger t JOIN pg_class c ON c.oid = t.tgrelid " +
            "WHERE c.relnamespace = current_schema()::regnamespace AND NOT t.tgisinternal ORDER BY t.tgname";
        using var reader = command.ExecuteReader();
        var triggers = new List<string>();
        while (reader.Read())
        {
            triggers.Add(reader.GetString(0));
        }

        return triggers;
    }

    private static string Json<T>(T value) => JsonSerializer.Serialize(value);

    /// <summary>Every row of every table, each column by name with its type, in key order.</summary>
    private static List<string> Dump(DbConnection connection)
    {
        var rows = new List<string>();
        foreach (var table in Tables)
        {
            var columns = Columns(connection, table);
            using var command = connection.CreateCommand();
            command.CommandText = $"SELECT {string.Join(", ", columns)} FROM {table} ORDER BY {Keys.GetValueOrDefault(table, "id")}";
            using var reader = command.ExecuteReader();
            while (reader.Read())
            {
                rows.Add(table + ": " + string.Join("; ", columns.Select((c, i) => c + "=" + Text(reader.IsDBNull(i) ? null : reader.GetValue(i)))));
            }
        }

        return rows;
    }

    private static List<string> Columns(DbConnection connection, string table)
    {
        using var command = connection.CreateCommand();
        command.CommandText = connection is Microsoft.Data.Sqlite.SqliteConnection
            ? $"SELECT name FROM pragma_table_info('{table}')"
            : $"SELECT column_name::text FROM information_schema.columns WHERE table_schema = current_schema() AND table_name = '{table}'";
        using var reader = command.ExecuteReader();
        var names = new List<string>();
        while (reader.Read())
        {
            names.Add(reader.GetString(0));
        }

        names.Sort(StringComparer.Ordinal);
        return names;
    }

    private static string Text(object? value) => value switch
    {
        null => "null",
        long n => "i" + n.ToString(CultureInfo.InvariantCulture),
        double d => "r" + d.ToString("R", CultureInfo.InvariantCulture),
        string s => "t" + s,
        byte[] b => "b" + Convert.ToHexString(b),
        _ => throw new InvalidOperationException($"a value of type {value.GetType().Name}"),
    };
}
