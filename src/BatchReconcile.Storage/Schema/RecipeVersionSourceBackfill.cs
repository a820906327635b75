using BatchReconcile.Records.Exports;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Schema;

/// <summary>
/// The code part of migration 6: how the recipe version of each stored revision was chosen, read from its
/// stored rows. Before version 6 a version given on any row was used, else the newest: so a revision whose
/// rows name a recipe_version is <c>export</c>, one whose rows name none is <c>newest</c>. A revision
/// without stored rows stays unknown (NULL).
/// </summary>
internal static class RecipeVersionSourceBackfill
{
    public static void Run(MigrationContext context)
    {
        var connection = context.Connection;
        var transaction = context.Transaction;
        var found = new List<(long Revision, RecipeVersionSource Source)>();
        using (var read = new PreparedCommand(connection, transaction, "SELECT revision_ref, header, lines FROM raw_rows ORDER BY revision_ref"))
        using (var reader = read.Read())
        {
            while (reader.Read())
            {
                var rows = RawRowsJson.Decode(reader.GetString(1), (byte[])reader.GetValue(2));
                var named = rows.Any(r => r.Fields.Any(f =>
                    string.Equals(f.Key.Trim(), "recipe_version", StringComparison.OrdinalIgnoreCase) && f.Value.Trim().Length > 0));
                found.Add((reader.GetInt64(0), named ? RecipeVersionSource.Export : RecipeVersionSource.Newest));
            }
        }

        using var update = new PreparedCommand(
            connection, transaction, "UPDATE batch_revision SET recipe_version_source = $source WHERE id = $revision",
            ("$source", SqliteType.Text), ("$revision", SqliteType.Integer));
        foreach (var (revision, source) in found)
        {
            update.Set("$source", source.ToText()).Set("$revision", revision).Execute();
        }
    }
}
