using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Schema;

/// <summary>
/// The code part of migration 5: the rows of each revision, stored until then one record per row
/// (<c>raw_row</c>), become one record per revision (<c>raw_rows</c>), written by the same encoder as
/// the commit. Nothing is changed: every line keeps its number, its column names, their order and its values.
/// </summary>
internal static class RawRowsRepack
{
    public static void Run(MigrationContext context)
    {
        var connection = context.Connection;
        var transaction = context.Transaction;
        var revisions = new List<long>();
        using (var list = new PreparedCommand(connection, transaction, "SELECT DISTINCT revision_ref FROM raw_row ORDER BY revision_ref"))
        using (var reader = list.Read())
        {
            while (reader.Read())
            {
                revisions.Add(reader.GetInt64(0));
            }
        }

        using var read = new PreparedCommand(
            connection, transaction, "SELECT line, fields FROM raw_row WHERE revision_ref = $revision ORDER BY line", ("$revision", SqliteType.Integer));
        using var insert = new PreparedCommand(
            connection, transaction, "INSERT INTO raw_rows (revision_ref, header, line_count, lines) VALUES ($revision, $header, $count, $lines)",
            ("$revision", SqliteType.Integer), ("$header", SqliteType.Text), ("$count", SqliteType.Integer), ("$lines", SqliteType.Blob));
        foreach (var revision in revisions)
        {
            var rows = new List<(int Line, IReadOnlyList<KeyValuePair<string, string>> Fields)>();
            using (var reader = read.Set("$revision", revision).Read())
            {
                while (reader.Read())
                {
                    rows.Add((reader.GetInt32(0), StoreJson.ParseRawFields(reader.GetString(1))));
                }
            }

            var raw = RawRowsJson.Encode(rows, r => r.Line, r => r.Fields);
            insert.Set("$revision", revision).Set("$header", raw.Header).Set("$count", raw.LineCount).Set("$lines", raw.Lines).Execute();
        }
    }
}
