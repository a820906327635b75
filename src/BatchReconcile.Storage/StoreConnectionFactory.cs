using System.Globalization;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage;

/// <summary>Opens connections to the store's database with the pragmas every connection needs.</summary>
public static class StoreConnectionFactory
{
    /// <summary>
    /// Opens (and creates when missing) the database file: WAL journal, foreign keys enforced,
    /// the busy timeout and the synchronous level of <paramref name="settings"/>.
    /// </summary>
    /// <exception cref="StoreException">The file system cannot hold a WAL database (network shares, for one).</exception>
    public static SqliteConnection Open(string databasePath, StoreSettings settings)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(databasePath);
        ArgumentNullException.ThrowIfNull(settings);
        var problems = settings.Validate();
        if (problems.Count > 0)
        {
            throw new ArgumentException(string.Join(" ", problems), nameof(settings));
        }

        var builder = new SqliteConnectionStringBuilder
        {
            DataSource = Path.GetFullPath(databasePath),
            Mode = SqliteOpenMode.ReadWriteCreate,
            // A pooled connection would keep the file open after Dispose; the service holds one
            // connection for its lifetime anyway, so pooling buys nothing here.
            Pooling = false,
            ForeignKeys = true,
            DefaultTimeout = (int)Math.Ceiling(settings.BusyTimeoutSeconds),
        };

        var connection = new SqliteConnection(builder.ToString());
        try
        {
            connection.Open();
            // Pragma values cannot be parameters; both come from typed settings, never from input.
            var busyMs = ((long)Math.Round(settings.BusyTimeout.TotalMilliseconds)).ToString(CultureInfo.InvariantCulture);
            Execute(connection, $"PRAGMA busy_timeout = {busyMs};");
            var mode = Scalar(connection, "PRAGMA journal_mode = WAL;");
            if (!string.Equals(mode, "wal", StringComparison.OrdinalIgnoreCase))
            {
                throw new StoreException(
                    $"The database {databasePath} cannot use the write-ahead log (journal mode stays '{mode}'). " +
                    "Put the database on a local disk.");
            }

            var synchronous = settings.Synchronous == SynchronousMode.Normal ? "NORMAL" : "FULL";
            Execute(connection, $"PRAGMA synchronous = {synchronous};");
            Execute(connection, "PRAGMA foreign_keys = ON;");
            // Statement journals (one per file savepoint of a group commit) and sorts stay in memory rather
            // than in temporary files: they are never needed after a crash (the write-ahead log is).
            Execute(connection, "PRAGMA temp_store = MEMORY;");
            return connection;
        }
        catch
        {
            connection.Dispose();
            throw;
        }
    }

    private static void Execute(SqliteConnection connection, string sql)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        command.ExecuteNonQuery();
    }

    private static string? Scalar(SqliteConnection connection, string sql)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        return Convert.ToString(command.ExecuteScalar(), CultureInfo.InvariantCulture);
    }
}
