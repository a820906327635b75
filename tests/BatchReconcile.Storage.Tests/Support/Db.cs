using System.Data.Common;
using System.Globalization;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Tests.Support;

/// <summary>Direct looks into the database, for what the store's API does not show.</summary>
internal static class Db
{
    /// <summary>Rows in a table; the name is one of the test's own constants, never input.</summary>
    public static long Count(DbConnection connection, string table, string where = "1 = 1")
    {
        using var command = connection.CreateCommand();
        command.CommandText = $"SELECT count(*) FROM {table} WHERE {where}";
        return Convert.ToInt64(command.ExecuteScalar(), CultureInfo.InvariantCulture);
    }

    /// <summary>Lines of raw rows stored, over all revisions (one <c>raw_rows</c> record holds a revision's lines).</summary>
    public static long RawLineCount(DbConnection connection) =>
        long.Parse(Scalar(connection, "SELECT coalesce(sum(line_count), 0) FROM raw_rows")!, System.Globalization.CultureInfo.InvariantCulture);

    public static string? Scalar(DbConnection connection, string sql)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        return Convert.ToString(command.ExecuteScalar(), CultureInfo.InvariantCulture);
    }

    public static void Execute(DbConnection connection, string sql)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        command.ExecuteNonQuery();
    }

    /// <summary>
    /// Changes a store behind the program's back, as someone with the database's own tools could: for SQLite
    /// through the sqlite3 shell, for PostgreSQL on a connection of its own with triggers off
    /// (<c>session_replication_role = replica</c>, which needs a superuser, as the test cluster's role is).
    /// SQLite's <c>DROP TRIGGER</c> statements and pragmas in <paramref name="sql"/> are left out on PostgreSQL.
    /// </summary>
    public static void Tamper(TempDatabase db, string sql)
    {
        if (db.Provider == BatchReconcile.Storage.StoreProvider.Sqlite)
        {
            Sqlite3Shell.Run(db.DatabasePath, "PRAGMA busy_timeout = 5000; " + sql);
            return;
        }

        var postgres = System.Text.RegularExpressions.Regex.Replace(sql, @"(DROP TRIGGER\s+\w+|PRAGMA[^;]*);", string.Empty);
        var builder = new Npgsql.NpgsqlConnectionStringBuilder(PostgresTestServer.ConnectionString) { SearchPath = "site_" + db.SiteCode.ToLowerInvariant() };
        using var connection = new Npgsql.NpgsqlConnection(builder.ConnectionString);
        connection.Open();
        Execute(connection, "SET session_replication_role = replica; " + postgres);
    }

    /// <summary>The "detail" column of EXPLAIN QUERY PLAN, one line per step.</summary>
    public static IReadOnlyList<string> QueryPlan(DbConnection dbConnection, string sql, params (string Name, object? Value)[] parameters)
    {
        var connection = (SqliteConnection)dbConnection;
        using var command = connection.CreateCommand();
        command.CommandText = "EXPLAIN QUERY PLAN " + sql;
        foreach (var (name, value) in parameters)
        {
            command.Parameters.AddWithValue(name, value ?? DBNull.Value);
        }

        using var reader = command.ExecuteReader();
        var lines = new List<string>();
        while (reader.Read())
        {
            lines.Add(reader.GetString(3));
        }

        return lines;
    }
}
