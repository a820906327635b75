using System.Data;
using System.Data.Common;
using System.Globalization;
using Npgsql;

namespace BatchReconcile.Storage;

/// <summary>
/// PostgreSQL's side of the store: opening a site's connection, its versioned schema (applied under an
/// advisory lock, so instances starting together migrate once), and the write lock of a site.
/// </summary>
internal static class PostgresStore
{
    // Keys of the advisory locks (pg_advisory_xact_lock(int, int)): migrations of the whole database, and
    // the writes of one site (second key: hashtext of the schema name).
    private const int MigrationLock = 0x4252_4D00;
    private const int SiteWriteLock = 0x4252_5700;

    /// <summary>Opens a connection to the site's schema.</summary>
    /// <exception cref="StoreException">The server is unreachable or refuses the login (the reason, never the password).</exception>
    public static NpgsqlConnection Open(PostgresTarget target)
    {
        var connection = new NpgsqlConnection(target.ConnectionString);
        try
        {
            connection.Open();
            return connection;
        }
        catch (DbException e)
        {
            connection.Dispose();
            throw new StoreException($"{target.Description}: {StoreFaults.Describe(e) ?? "the server refused the connection"} ({Words(e)})", e)
            {
                Transient = StoreFaults.Describe(e) is not null,
            };
        }
    }

    /// <summary>Opens the site's connection and brings its schema to <see cref="PostgresSchema.Latest"/>.</summary>
    /// <exception cref="StoreException">As <see cref="Open"/>, or the schema is newer than this program.</exception>
    public static NpgsqlConnection OpenAndMigrate(PostgresTarget target, TimeProvider time)
    {
        var connection = Open(target);
        try
        {
            Migrate(connection, target, time);
            return connection;
        }
        catch (DbException e)
        {
            connection.Dispose();
            throw new StoreException($"{target.Description}: preparing the site's schema failed: {StoreFaults.Describe(e) ?? Words(e)}", e)
            {
                Transient = StoreFaults.Describe(e) is not null,
            };
        }
        catch
        {
            connection.Dispose();
            throw;
        }
    }

    /// <summary>The schema version of the site (0 when its schema does not exist yet).</summary>
    public static int CurrentVersion(NpgsqlConnection connection, string schema, NpgsqlTransaction? transaction = null)
    {
        using var exists = new NpgsqlCommand("SELECT to_regclass(@table) IS NOT NULL", connection, transaction);
        exists.Parameters.AddWithValue("table", schema + ".schema_version");
        if (exists.ExecuteScalar() is not true)
        {
            return 0;
        }

        using var read = new NpgsqlCommand($"SELECT coalesce(max(version), 0) FROM {schema}.schema_version", connection, transaction);
        return Convert.ToInt32(read.ExecuteScalar(), CultureInfo.InvariantCulture);
    }

    private static void Migrate(NpgsqlConnection connection, PostgresTarget target, TimeProvider time)
    {
        // Read without a lock first: opening an up-to-date schema (every command) never waits for a migration.
        var before = CurrentVersion(connection, target.Schema);
        RefuseNewer(target, before);
        if (before == PostgresSchema.Latest)
        {
            return;
        }

        using var transaction = connection.BeginTransaction(IsolationLevel.ReadCommitted);
        Execute(connection, transaction, $"SELECT pg_advisory_xact_lock({MigrationLock}, 0)");
        var version = CurrentVersion(connection, target.Schema, transaction);
        RefuseNewer(target, version);
        if (version == 0)
        {
            // The schema may exist (made by an administrator who granted it to the service) without tables.
            using (var exists = new NpgsqlCommand("SELECT 1 FROM pg_namespace WHERE nspname = @schema", connection, transaction))
            {
                exists.Parameters.AddWithValue("schema", target.Schema);
                if (exists.ExecuteScalar() is null)
                {
                    // Needs CREATE on the database; an administrator may instead create the schema for the service's role.
                    Execute(connection, transaction, $"CREATE SCHEMA {target.Schema}");
                }
            }
            Execute(connection, transaction, $"CREATE TABLE IF NOT EXISTS {target.Schema}.schema_version (version integer PRIMARY KEY, description text NOT NULL, applied_at text NOT NULL)");
            // The site's code as settings give it (the schema name is folded to lower case).
            Execute(connection, transaction, $"CREATE TABLE IF NOT EXISTS {target.Schema}.site_info (code text NOT NULL)");
            using var site = new NpgsqlCommand($"INSERT INTO {target.Schema}.site_info (code) VALUES (@code)", connection, transaction);
            site.Parameters.AddWithValue("code", target.SiteCode);
            site.ExecuteNonQuery();
        }

        var at = time.GetUtcNow().UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss.fff'Z'", CultureInfo.InvariantCulture);
        foreach (var migration in PostgresSchema.All.Where(m => m.Version > version))
        {
            Execute(connection, transaction, $"SET LOCAL search_path TO {target.Schema}");
            Execute(connection, transaction, migration.Sql);
            using var record = new NpgsqlCommand($"INSERT INTO {target.Schema}.schema_version (version, description, applied_at) VALUES (@v, @d, @at)", connection, transaction);
            record.Parameters.AddWithValue("v", migration.Version);
            record.Parameters.AddWithValue("d", migration.Description);
            record.Parameters.AddWithValue("at", at);
            record.ExecuteNonQuery();
        }

        transaction.Commit();
    }

    /// <summary>The codes of the sites whose schemas the database holds (<c>--site all</c>), in order.</summary>
    public static IReadOnlyList<string> Sites(string connectionString)
    {
        using var connection = new NpgsqlConnection(connectionString);
        connection.Open();
        var schemas = new List<string>();
        using (var find = new NpgsqlCommand(
            @"SELECT nspname FROM pg_namespace WHERE nspname LIKE 'site\_%' AND to_regclass(quote_ident(nspname) || '.site_info') IS NOT NULL ORDER BY nspname", connection))
        using (var reader = find.ExecuteReader())
        {
            while (reader.Read())
            {
                schemas.Add(reader.GetString(0));
            }
        }

        var codes = new List<string>();
        foreach (var schema in schemas)
        {
            using var read = new NpgsqlCommand($"SELECT code FROM {schema}.site_info LIMIT 1", connection);
            if (read.ExecuteScalar() is string code)
            {
                codes.Add(code);
            }
        }

        return codes;
    }

    private static void RefuseNewer(PostgresTarget target, int version)
    {
        if (version > PostgresSchema.Latest)
        {
            throw new StoreException(
                $"{target.Description} has schema version {version}, but this program only knows versions up to " +
                $"{PostgresSchema.Latest.ToString(CultureInfo.InvariantCulture)}. It was written by a newer release: run that release, " +
                "or restore a backup made for this one. The schema was not changed.");
        }
    }

    /// <summary>
    /// A transaction that holds the site's write lock until it ends: instances writing the same site take turns
    /// (as SQLite's single writer does), so each reads the others' committed files before it classifies its own,
    /// and the audit chain is extended by one transaction at a time. Other sites are not held up.
    /// </summary>
    public static DbTransaction BeginWrite(DbConnection connection)
    {
        var npgsql = (NpgsqlConnection)connection;
        var transaction = npgsql.BeginTransaction(IsolationLevel.ReadCommitted);
        try
        {
            Execute(npgsql, transaction, $"SELECT pg_advisory_xact_lock({SiteWriteLock}, hashtext(current_schema()))");
            return transaction;
        }
        catch
        {
            transaction.Dispose();
            throw;
        }
    }

    /// <summary>A transaction that reads one snapshot (REPEATABLE READ) while other instances go on writing.</summary>
    public static DbTransaction BeginRead(DbConnection connection) =>
        ((NpgsqlConnection)connection).BeginTransaction(IsolationLevel.RepeatableRead);

    private static void Execute(NpgsqlConnection connection, NpgsqlTransaction transaction, string sql)
    {
        using var command = new NpgsqlCommand(sql, connection, transaction);
        command.ExecuteNonQuery();
    }

    private static string Words(DbException e) => e switch
    {
        PostgresException p => $"PostgreSQL {p.SqlState}: {p.MessageText}",
        _ => e.InnerException?.Message ?? e.Message,
    };
}
