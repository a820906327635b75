using System.Globalization;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Schema;

/// <summary>Brings a database to a schema version by applying <see cref="Migrations.All"/> in order.</summary>
public static class SchemaMigrator
{
    /// <summary>The schema version recorded in the database (0 for a new, empty file).</summary>
    public static int CurrentVersion(SqliteConnection connection)
    {
        ArgumentNullException.ThrowIfNull(connection);
        using var command = connection.CreateCommand();
        command.CommandText = "PRAGMA user_version;";
        return Convert.ToInt32(command.ExecuteScalar(), CultureInfo.InvariantCulture);
    }

    /// <summary>Applies every migration the database has not had yet, each in its own transaction.</summary>
    /// <returns>The versions applied, oldest first (empty when the database was up to date).</returns>
    /// <exception cref="StoreException">The database was written by a newer program.</exception>
    public static IReadOnlyList<int> MigrateToLatest(SqliteConnection connection, TimeProvider? time = null) =>
        MigrateTo(connection, Migrations.Latest, time);

    /// <summary>Applies migrations up to and including <paramref name="targetVersion"/> (tests build old databases with it).</summary>
    /// <exception cref="StoreException">The database is newer than <see cref="Migrations.Latest"/>.</exception>
    public static IReadOnlyList<int> MigrateTo(SqliteConnection connection, int targetVersion, TimeProvider? time = null)
    {
        ArgumentNullException.ThrowIfNull(connection);
        ArgumentOutOfRangeException.ThrowIfNegative(targetVersion);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(targetVersion, Migrations.Latest);

        var applied = new List<int>();
        foreach (var migration in Migrations.All.Where(m => m.Version <= targetVersion))
        {
            // Checked first without a lock so that opening an up-to-date database (every CLI
            // command) never waits for the service's write lock.
            var before = CurrentVersion(connection);
            RefuseNewer(connection, before);
            if (before >= migration.Version)
            {
                continue;
            }

            // BEGIN IMMEDIATE takes the write lock before the version is read again, so two
            // processes starting at once cannot both apply the same migration.
            using var transaction = connection.BeginTransaction(deferred: false);
            var version = CurrentVersion(connection);
            RefuseNewer(connection, version);
            if (version >= migration.Version)
            {
                transaction.Rollback();
                continue;
            }

            if (version != migration.Version - 1)
            {
                throw new StoreException(
                    $"The database {connection.DataSource} is at schema version {version}, " +
                    $"but migration {migration.Version} expects version {migration.Version - 1}.");
            }

            Execute(connection, transaction, migration.Sql);
            migration.Code?.Invoke(new MigrationContext(connection, transaction, (time ?? TimeProvider.System).GetUtcNow()));
            Execute(connection, transaction,
                migration.FinishSql + Environment.NewLine + $"PRAGMA user_version = {migration.Version.ToString(CultureInfo.InvariantCulture)};");

            transaction.Commit();
            applied.Add(migration.Version);
        }

        RefuseNewer(connection, CurrentVersion(connection));
        return applied;
    }

    private static void Execute(SqliteConnection connection, SqliteTransaction transaction, string sql)
    {
        using var command = connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = sql;
        command.ExecuteNonQuery();
    }

    private static void RefuseNewer(SqliteConnection connection, int version)
    {
        if (version > Migrations.Latest)
        {
            throw new StoreException(
                $"The database {connection.DataSource} has schema version {version}, but this program " +
                $"only knows versions up to {Migrations.Latest}. It was written by a newer release: " +
                "run that release, or restore a backup made for this one. The schema was not changed.");
        }
    }
}
