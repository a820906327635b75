using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage;

public sealed partial class BatchStore
{
    /// <summary>
    /// One row per current batch revision of the recipe (its first step's row), read through <c>ix_step_result_recipe</c>
    /// (recipe, current, day) like <c>StepsOfRecipe</c>, with the revision's links.
    /// </summary>
    internal static string StepLinksOfRecipeSql(bool from, bool to) =>
        """
        SELECT b.batch_id, r.step_links
        FROM step_result s
        JOIN batch_revision r ON r.id = s.revision_ref
        JOIN batch b ON b.id = r.batch_ref
        WHERE s.recipe = $recipe AND s.is_current = 1 AND s.step_order = 1
        """
        + (from ? " AND s.production_day >= $from" : string.Empty)
        + (to ? " AND s.production_day <= $to" : string.Empty);

    /// <summary>
    /// The step links of every current batch revision of a recipe in the period (docs/computation.md, "Steps of one batch"):
    /// which intermediate each step charged and how much. A revision stored before links were kept maps to null. One query
    /// through the recipe index of <c>step_result</c>, for the route figures of <c>compare</c> and <c>report</c>.
    /// </summary>
    public IReadOnlyDictionary<string, IReadOnlyList<IntermediateLink>?> StepLinksOfRecipe(string recipe, DateOnly? from = null, DateOnly? to = null)
    {
        ArgumentNullException.ThrowIfNull(recipe);
        lock (_gate)
        {
            ThrowIfDisposed();
            var sql = StepLinksOfRecipeSql(from is not null, to is not null);
            using var query = new PreparedCommand(_connection, null, sql, ("$recipe", SqliteType.Text), ("$from", SqliteType.Text), ("$to", SqliteType.Text));
            SetDays(query, from, to).Set("$recipe", recipe);
            using var reader = query.Read();
            var links = new Dictionary<string, IReadOnlyList<IntermediateLink>?>(StringComparer.Ordinal);
            while (reader.Read())
            {
                links[reader.GetString(0)] = StoreJson.ParseLinks(reader.IsDBNull(1) ? null : reader.GetString(1));
            }

            return links;
        }
    }
}
