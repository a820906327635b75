using System.Globalization;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Tests.Support;

/// <summary>Direct looks into the database, for what the store's API does not show.</summary>
internal static class Db
{
    /// <summary>Rows in a table; the name is one of the test's own constants, never input.</summary>
    public static long Count(SqliteConnection connection, string table, string where = "1 = 1")
    {
        using var command = connection.CreateCommand();
        command.CommandText = $"SELECT count(*) FROM {table} WHERE {where}";
        return Convert.ToInt64(command.ExecuteScalar(), CultureInfo.InvariantCulture);
    }

    /// <summary>Lines of raw rows stored, over all revisions (one <c>raw_rows</c> record holds a revision's lines).</summary>
    public static long RawLineCount(SqliteConnection connection) =>
        long.Parse(Scalar(connection, "SELECT coalesce(sum(line_count), 0) FROM raw_rows")!, System.Globalization.CultureInfo.InvariantCulture);

    public static string? Scalar(SqliteConnection connection, string sql)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        return Convert.ToString(command.ExecuteScalar(), CultureInfo.InvariantCulture);
    }

    public static void Execute(SqliteConnection connection, string sql)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        command.ExecuteNonQuery();
    }

    /// <summary>The "detail" column of EXPLAIN QUERY PLAN, one line per step.</summary>
    public static IReadOnlyList<string> QueryPlan(SqliteConnection connection, string sql, params (string Name, object? Value)[] parameters)
    {
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
