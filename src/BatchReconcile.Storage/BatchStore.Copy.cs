using System.Data;
using System.Data.Common;
using System.Diagnostics;
using System.Globalization;
using BatchReconcile.Storage.Copy;
using BatchReconcile.Storage.Schema;
using Microsoft.Data.Sqlite;
using Npgsql;
using NpgsqlTypes;

namespace BatchReconcile.Storage;

public sealed partial class BatchStore
{
    /// <summary>Rows per COPY statement: PostgreSQL keeps the foreign-key checks of a statement in memory until it ends.</summary>
    private const int CopyChunkRows = 10_000;

    /// <summary>
    /// Every table of the store in an order that copies each row after the rows it refers to, with the order its rows
    /// are read in. Revisions are taken newest first: a superseded revision refers to the later one that replaced it.
    /// Audit entries are taken in id order: the target's trigger links each one to the entry before it.
    /// </summary>
    private static readonly (string Table, string Order)[] CopiedTables =
    [
        ("ingest_log", "id"),
        ("batch", "id"),
        ("batch_revision", "id DESC"),
        ("raw_rows", "revision_ref"),
        ("step_result", "revision_ref, step"),
        ("flag", "id"),
        ("audit_event", "id"),
        ("digest", "id"),
        ("day_change", "day"),
    ];

    /// <summary>
    /// Row triggers of the target that a copy turns off while it runs, in its own transaction. Each updates one row per inserted
    /// row (the day's change count, the audit id high water); inside one transaction every such update leaves a version of that
    /// row that the next one walks past, so a copy with them takes time growing with the square of the rows (measured: 100,000
    /// revisions over 47 days took 54 s with the trigger, 40,000 updates of one row 7.4 s against 0.5 s for 10,000). What they
    /// would do is done once instead: the day change counts and the high water are the source's, and each audit entry's link
    /// to the one before it is checked as it is read (<see cref="AuditLinkCheck"/>), as the chain trigger would.
    /// </summary>
    private static readonly (string Table, string Trigger)[] SkippedTriggers =
    [
        ("batch_revision", "day_change_revision"),
        ("audit_event", "audit_event_chained"),
    ];

    /// <summary>Tables of a PostgreSQL site that are not copied row by row (the schema's own bookkeeping).</summary>
    private static readonly string[] PostgresOnlyTables = ["schema_version", "audit_high_water", "site_info"];

    /// <summary>
    /// Copies every row of this SQLite store into <paramref name="target"/>, the empty schema of a site in PostgreSQL: the ingest
    /// log, batches, revisions, raw rows, step results, flags with their review state, audit entries, digest records and day
    /// change counts, with their ids, so that the copy's audit trail verifies as the source's does (nothing is hashed again).
    /// </summary>
    /// <remarks>
    /// <para>All of it is one PostgreSQL transaction holding the site's write lock: the copy is stored whole or not at all, and
    /// no other instance writes the site meanwhile. The source is read in one snapshot and never written. Rows go through
    /// binary COPY, streamed from the source in chunks of <see cref="CopyChunkRows"/>, so a large store is never held in memory.</para>
    /// <para>Each audit entry must link to the one before it, as the target's chain trigger demands. Two row triggers that would
    /// make a large copy slow are off for the copy's transaction when the role owns the tables (<see cref="SkippedTriggers"/>):
    /// their work is done once instead. The day change counts are the source's own, and so is the highest audit id given.
    /// Afterwards the id sequences are set past the highest id copied (and past SQLite's own sequence of a table that never
    /// reuses ids), so later inserts get fresh ids.</para>
    /// </remarks>
    /// <returns>The rows copied per table.</returns>
    /// <exception cref="StoreException">Nothing was changed: <see cref="StoreException.Refused"/> when the target already holds
    /// rows, either store is not at this program's schema version, or the source's audit chain is broken; otherwise the copy
    /// failed (a fault of the server, or a value the target refused) and was rolled back.</exception>
    public StoreCopyResult CopyTo(BatchStore target) => CopyTo(target, CopyChunkRows);

    /// <inheritdoc cref="CopyTo(BatchStore)"/>
    /// <param name="chunkRows">Rows per COPY statement (tests use small chunks to cross their boundaries).</param>
    /// <param name="skipTriggers">Turn off <see cref="SkippedTriggers"/> while copying when the role may (it owns the tables);
    /// false copies with them on, as a role that does not own the tables does.</param>
    internal StoreCopyResult CopyTo(BatchStore target, int chunkRows, bool skipTriggers = true)
    {
        ArgumentNullException.ThrowIfNull(target);
        ArgumentOutOfRangeException.ThrowIfLessThan(chunkRows, 1);
        if (IsPostgres || _connection is not SqliteConnection)
        {
            throw new ArgumentException("The store copied from must be a SQLite store.", nameof(target));
        }

        if (!target.IsPostgres || ReferenceEquals(target, this))
        {
            throw new ArgumentException("The store copied into must be a site's schema in PostgreSQL.", nameof(target));
        }

        lock (_gate)
        {
            lock (target._gate)
            {
                ThrowIfDisposed();
                target.ThrowIfDisposed();
                var started = Stopwatch.GetTimestamp();
                var sqlite = (SqliteConnection)_connection;
                var postgres = (NpgsqlConnection)target._connection;
                var schema = target._postgres!.Schema;

                var version = SchemaMigrator.CurrentVersion(sqlite);
                if (version != Migrations.Latest)
                {
                    throw new StoreException(
                        $"{DatabasePath} is at schema version {N(version)}, but a copy needs version {N(Migrations.Latest)}: open it once with " +
                        "this release (any command does) and copy again. Nothing was copied.")
                    { Refused = true };
                }

                try
                {
                    using var read = sqlite.BeginTransaction(deferred: true);
                    using var write = (NpgsqlTransaction)PostgresStore.BeginWrite(postgres);
                    var targetVersion = PostgresStore.CurrentVersion(postgres, schema, write);
                    if (targetVersion != PostgresSchema.Latest)
                    {
                        throw new StoreException(
                            $"{target.DatabasePath} is at schema version {N(targetVersion)}, not {N(PostgresSchema.Latest)}; nothing was copied.")
                        { Refused = true };
                    }

                    RefuseUnlessEmpty(postgres, write, target.DatabasePath);
                    var columns = MatchColumns(sqlite, read, postgres, write, target.DatabasePath);
                    var skipped = skipTriggers && DisableTriggers(postgres, write);

                    var tables = new List<TableCopy>(CopiedTables.Length);
                    foreach (var (table, order) in CopiedTables)
                    {
                        if (table == "day_change")
                        {
                            // With its trigger on (a role that does not own the tables), the revisions' insert counted them again;
                            // the source's counts (and digested marks) are the ones kept.
                            ExecuteOn(postgres, write, "DELETE FROM day_change");
                        }

                        var tableStarted = Stopwatch.GetTimestamp();
                        var check = table == "audit_event" ? new AuditLinkCheck(columns[table], DatabasePath) : null;
                        var rows = CopyTable(sqlite, read, postgres, table, order, columns[table], chunkRows, check);
                        var inSource = CountRows(sqlite, read, table);
                        var inTarget = CountRows(postgres, write, table);
                        if (rows != inSource || inTarget != inSource)
                        {
                            throw new StoreException(
                                $"copying {table} gave {N(inTarget)} rows in {target.DatabasePath} for {N(inSource)} in {DatabasePath} " +
                                $"({N(rows)} read); nothing was copied.");
                        }

                        tables.Add(new TableCopy(table, rows) { Elapsed = Stopwatch.GetElapsedTime(tableStarted) });
                    }

                    var highWater = SqliteSequence(sqlite, read, "audit_event");
                    if (highWater is { } seq)
                    {
                        using var set = new NpgsqlCommand(
                            "INSERT INTO audit_high_water (one, seq) VALUES (1, @seq) ON CONFLICT (one) DO UPDATE SET seq = excluded.seq", postgres, write);
                        set.Parameters.AddWithValue("seq", seq);
                        set.ExecuteNonQuery();
                    }

                    foreach (var (table, column) in columns.SelectMany(t => t.Value.Where(c => c.Identity).Select(c => (t.Key, c.Name))))
                    {
                        ResetIdentity(postgres, write, table, column, SqliteSequence(sqlite, read, table) ?? 0);
                    }

                    if (skipped)
                    {
                        foreach (var (table, trigger) in SkippedTriggers)
                        {
                            ExecuteOn(postgres, write, $"ALTER TABLE {table} ENABLE TRIGGER {trigger}");
                        }
                    }

                    write.Commit();
                    read.Commit();
                    return new StoreCopyResult(DatabasePath, target.DatabasePath, tables, highWater, Stopwatch.GetElapsedTime(started))
                    {
                        TriggersSkipped = skipped,
                    };
                }
                catch (DbException e) when (e is not SqliteException)
                {
                    // The transaction was rolled back: a fault of the server (transient) or a row it refused (a trigger, a check).
                    throw StoreFaults.Translate(e, target.DatabasePath) is { } fault
                        ? new StoreException(fault.Message + "; nothing was copied", e) { Transient = true }
                        : new StoreException($"{target.DatabasePath} refused the copy: {Words(e)}; nothing was copied (the transaction was rolled back)", e);
                }
                catch (SqliteException e) when (StoreFaults.Translate(e, DatabasePath) is { } fault)
                {
                    throw new StoreException(fault.Message + "; nothing was copied", e) { Transient = true };
                }
            }
        }
    }

    /// <summary>
    /// Turns <see cref="SkippedTriggers"/> off for this transaction (ALTER TABLE is transactional: they are on again for everyone
    /// when it ends, committed or not, and no one else sees them off). Only the tables' owner may; for another role the copy runs
    /// with them on, slower.
    /// </summary>
    /// <returns>True when they are off.</returns>
    private static bool DisableTriggers(NpgsqlConnection postgres, NpgsqlTransaction write)
    {
        write.Save("copy_triggers");
        try
        {
            foreach (var (table, trigger) in SkippedTriggers)
            {
                ExecuteOn(postgres, write, $"ALTER TABLE {table} DISABLE TRIGGER {trigger}");
            }

            write.Release("copy_triggers");
            return true;
        }
        catch (PostgresException e) when (e.SqlState == "42501")
        {
            // must be owner of table
            write.Rollback("copy_triggers");
            return false;
        }
    }

    /// <summary>
    /// Checks each audit entry as it is read, in id order, as the target's chain trigger does when it is on: its previous hash
    /// must be the hash of the entry before it (64 zeros for the first). A source whose chain is broken is not copied.
    /// </summary>
    private sealed class AuditLinkCheck(IReadOnlyList<CopyColumn> columns, string source)
    {
        private readonly int _id = Index(columns, "id");
        private readonly int _previous = Index(columns, "prev_hash");
        private readonly int _hash = Index(columns, "hash");
        private string _last = BatchReconcile.Storage.Audit.AuditCanonicalForm.GenesisHash;
        private long? _lastId;

        public void Check(SqliteDataReader row)
        {
            var id = row.GetInt64(_id);
            var previous = row.IsDBNull(_previous) ? null : row.GetString(_previous);
            if (!string.Equals(previous, _last, StringComparison.Ordinal))
            {
                var expected = _lastId is { } before ? $"the hash of entry {N(before)}" : "64 zeros (the start of the chain)";
                throw new StoreException(
                    $"{source}: audit entry {N(id)} does not link to the entry before it (its previous hash is not {expected}): the audit " +
                    "trail of the store is broken, and a copy would carry the break on ('audit verify' names what does not verify). Nothing was copied.")
                { Refused = true };
            }

            _last = row.IsDBNull(_hash) ? string.Empty : row.GetString(_hash);
            _lastId = id;
        }

        private static int Index(IReadOnlyList<CopyColumn> columns, string name)
        {
            for (var i = 0; i < columns.Count; i++)
            {
                if (columns[i].Name == name)
                {
                    return i;
                }
            }

            throw new InvalidOperationException($"audit_event has no column {name}.");
        }
    }

    /// <summary>Refuses a target that holds anything: a copy never merges two stores.</summary>
    private static void RefuseUnlessEmpty(NpgsqlConnection postgres, NpgsqlTransaction write, string where)
    {
        var files = CountRows(postgres, write, "ingest_log");
        var batches = CountRows(postgres, write, "batch");
        var entries = CountRows(postgres, write, "audit_event");
        var others = CopiedTables.Select(t => t.Table).Append("audit_high_water").Where(t => t is not ("ingest_log" or "batch" or "audit_event"))
            .Where(t => Exists(postgres, write, t)).ToList();
        if (files + batches + entries == 0 && others.Count == 0)
        {
            return;
        }

        var held = files + batches + entries > 0
            ? $"{Some(files, "file")}, {Some(batches, "batch", "batches")} and {Some(entries, "audit entry", "audit entries")}"
            : "rows in " + string.Join(", ", others);
        throw new StoreException(
            $"{where} already holds {held}: a copy goes only into an empty site and never merges two stores. Nothing was changed; " +
            "copy into a site code that has no data yet (Site:Code), or remove that site's schema first if its data are not needed.")
        { Refused = true };
    }

    private static string Some(long count, string one, string? many = null) =>
        count == 1 ? $"1 {one}" : $"{N(count)} {many ?? one + "s"}";

    /// <summary>A copied column: its name, how PostgreSQL types it, and whether it is an identity column.</summary>
    private sealed record CopyColumn(string Name, NpgsqlDbType Type, bool Identity);

    /// <summary>
    /// The columns of every table, from the target's schema, after checking that both stores have the same tables and columns
    /// (a table or column one of them lacks would otherwise be lost or left empty).
    /// </summary>
    private static Dictionary<string, IReadOnlyList<CopyColumn>> MatchColumns(
        SqliteConnection sqlite, SqliteTransaction read, NpgsqlConnection postgres, NpgsqlTransaction write, string where)
    {
        var target = new Dictionary<string, List<CopyColumn>>(StringComparer.Ordinal);
        using (var command = new NpgsqlCommand(
            "SELECT table_name::text, column_name::text, data_type::text, is_identity::text FROM information_schema.columns " +
            "WHERE table_schema = current_schema() ORDER BY table_name, ordinal_position", postgres, write))
        using (var reader = command.ExecuteReader())
        {
            while (reader.Read())
            {
                var table = reader.GetString(0);
                if (PostgresOnlyTables.Contains(table))
                {
                    continue;
                }

                var type = reader.GetString(2) switch
                {
                    "bigint" => NpgsqlDbType.Bigint,
                    "double precision" => NpgsqlDbType.Double,
                    "text" => NpgsqlDbType.Text,
                    "bytea" => NpgsqlDbType.Bytea,
                    var other => throw new StoreException($"{where}: column {table}.{reader.GetString(1)} is of type {other}, which a copy does not know; nothing was copied."),
                };
                if (!target.TryGetValue(table, out var list))
                {
                    target[table] = list = [];
                }

                list.Add(new CopyColumn(reader.GetString(1), type, reader.GetString(3) == "YES"));
            }
        }

        var sourceTables = new List<string>();
        using (var command = Command(sqlite, read, "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite\\_%' ESCAPE '\\' ORDER BY name"))
        using (var reader = command.ExecuteReader())
        {
            while (reader.Read())
            {
                sourceTables.Add(reader.GetString(0));
            }
        }

        var copied = CopiedTables.Select(t => t.Table).Order(StringComparer.Ordinal).ToList();
        if (!sourceTables.SequenceEqual(copied) || !target.Keys.Order(StringComparer.Ordinal).SequenceEqual(copied))
        {
            throw new StoreException(
                $"the stores' tables differ from what a copy knows (SQLite: {string.Join(", ", sourceTables)}; PostgreSQL: " +
                $"{string.Join(", ", target.Keys.Order(StringComparer.Ordinal))}; copied: {string.Join(", ", copied)}); nothing was copied.");
        }

        foreach (var table in copied)
        {
            var sourceColumns = new List<string>();
            using (var command = Command(sqlite, read, $"SELECT name FROM pragma_table_info('{table}') ORDER BY name"))
            using (var reader = command.ExecuteReader())
            {
                while (reader.Read())
                {
                    sourceColumns.Add(reader.GetString(0));
                }
            }

            var targetColumns = target[table].Select(c => c.Name).Order(StringComparer.Ordinal).ToList();
            if (!sourceColumns.SequenceEqual(targetColumns, StringComparer.Ordinal))
            {
                throw new StoreException(
                    $"the columns of {table} differ between the stores (SQLite: {string.Join(", ", sourceColumns)}; PostgreSQL: " +
                    $"{string.Join(", ", targetColumns)}); nothing was copied.");
            }
        }

        return target.ToDictionary(t => t.Key, t => (IReadOnlyList<CopyColumn>)t.Value, StringComparer.Ordinal);
    }

    /// <summary>Streams one table from SQLite into PostgreSQL by binary COPY, <paramref name="chunkRows"/> rows per statement.</summary>
    private static long CopyTable(
        SqliteConnection sqlite, SqliteTransaction read, NpgsqlConnection postgres, string table, string order, IReadOnlyList<CopyColumn> columns, int chunkRows,
        AuditLinkCheck? check)
    {
        var names = string.Join(", ", columns.Select(c => c.Name));
        var copy = $"COPY {table} ({names}) FROM STDIN (FORMAT BINARY)";
        using var select = Command(sqlite, read, $"SELECT {names} FROM {table} ORDER BY {order}");
        using var reader = select.ExecuteReader();
        long rows = 0;
        NpgsqlBinaryImporter? importer = null;
        try
        {
            while (reader.Read())
            {
                check?.Check(reader);
                importer ??= postgres.BeginBinaryImport(copy);
                importer.StartRow();
                for (var i = 0; i < columns.Count; i++)
                {
                    WriteValue(importer, reader, i, table, columns[i]);
                }

                rows++;
                if (rows % chunkRows == 0)
                {
                    importer.Complete();
                    importer.Dispose();
                    importer = null;
                }
            }

            importer?.Complete();
            return rows;
        }
        finally
        {
            // Disposed without Complete (a failure), the importer cancels its COPY.
            importer?.Dispose();
        }
    }

    /// <summary>Writes a value as the target's column types it; a value SQLite's loose typing let in that the column cannot take is refused.</summary>
    private static void WriteValue(NpgsqlBinaryImporter importer, SqliteDataReader reader, int i, string table, CopyColumn column)
    {
        if (reader.IsDBNull(i))
        {
            importer.WriteNull();
            return;
        }

        var value = reader.GetValue(i);
        switch (column.Type, value)
        {
            case (NpgsqlDbType.Bigint, long number):
                importer.Write(number, NpgsqlDbType.Bigint);
                break;
            case (NpgsqlDbType.Bigint, double real) when Math.Floor(real) == real && Math.Abs(real) < 9e18:
                importer.Write((long)real, NpgsqlDbType.Bigint);
                break;
            case (NpgsqlDbType.Double, double real):
                importer.Write(real, NpgsqlDbType.Double);
                break;
            case (NpgsqlDbType.Double, long number):
                importer.Write((double)number, NpgsqlDbType.Double);
                break;
            case (NpgsqlDbType.Text, string text):
                importer.Write(text, NpgsqlDbType.Text);
                break;
            case (NpgsqlDbType.Bytea, byte[] bytes):
                importer.Write(bytes, NpgsqlDbType.Bytea);
                break;
            default:
                throw new StoreException(
                    $"{table}.{column.Name} holds a {SqliteKind(value)} value where PostgreSQL keeps {column.Type.ToString().ToLowerInvariant()} " +
                    "(changed outside the program?); nothing was copied.");
        }
    }

    private static string SqliteKind(object value) => value switch
    {
        long => "whole-number",
        double => "real",
        string => "text",
        byte[] => "blob",
        _ => value.GetType().Name,
    };

    /// <summary>Sets the sequence of an identity column so the next id is past every copied id and past <paramref name="floor"/>.</summary>
    private static void ResetIdentity(NpgsqlConnection postgres, NpgsqlTransaction write, string table, string column, long floor)
    {
        using var command = new NpgsqlCommand(
            $"SELECT setval(pg_get_serial_sequence(quote_ident(current_schema()) || '.' || @table, @column), " +
            $"greatest(coalesce(max({column}), 0), @floor) + 1, false) FROM {table}",
            postgres,
            write);
        command.Parameters.AddWithValue("table", table);
        command.Parameters.AddWithValue("column", column);
        command.Parameters.AddWithValue("floor", floor);
        command.ExecuteScalar();
    }

    /// <summary>SQLite's highest id ever given in a table of AUTOINCREMENT ids (flags, audit entries, digests); null for others.</summary>
    private static long? SqliteSequence(SqliteConnection sqlite, SqliteTransaction read, string table)
    {
        using var command = Command(sqlite, read, "SELECT seq FROM sqlite_sequence WHERE name = $name");
        command.Parameters.AddWithValue("$name", table);
        return command.ExecuteScalar() is { } seq and not DBNull ? Convert.ToInt64(seq, CultureInfo.InvariantCulture) : null;
    }

    // Table names below come from CopiedTables, never from input.
    private static long CountRows(DbConnection connection, DbTransaction transaction, string table)
    {
        using var command = connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = $"SELECT count(*) FROM {table}";
        return Convert.ToInt64(command.ExecuteScalar(), CultureInfo.InvariantCulture);
    }

    private static bool Exists(NpgsqlConnection postgres, NpgsqlTransaction write, string table)
    {
        using var command = new NpgsqlCommand($"SELECT EXISTS (SELECT 1 FROM {table})", postgres, write);
        return command.ExecuteScalar() is true;
    }

    private static void ExecuteOn(NpgsqlConnection postgres, NpgsqlTransaction write, string sql)
    {
        using var command = new NpgsqlCommand(sql, postgres, write);
        command.ExecuteNonQuery();
    }

    private static SqliteCommand Command(SqliteConnection sqlite, SqliteTransaction read, string sql)
    {
        var command = sqlite.CreateCommand();
        command.Transaction = read;
        command.CommandText = sql;
        return command;
    }

    private static string Words(DbException e) => e switch
    {
        PostgresException p => $"PostgreSQL {p.SqlState}: {p.MessageText}",
        _ => e.InnerException?.Message ?? e.Message,
    };
}
