using BatchReconcile.Chemistry.Metrics;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Storage.Queries;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage;

public sealed partial class BatchStore
{
    /// <summary>
    /// The loss ladders of every current step row of a recipe in a period, summed per step and rung, with the
    /// per-material parts summed per material. <paramref name="from"/> and <paramref name="to"/> are production days,
    /// inclusive. The sums are taken by SQLite over the stored ladder JSON (see <see cref="StoreQueries.LossTotals"/>).
    /// </summary>
    public RecipeLossTotals LossTotalsOfRecipe(string recipe, DateOnly? from = null, DateOnly? to = null)
    {
        ArgumentNullException.ThrowIfNull(recipe);
        lock (_gate)
        {
            ThrowIfDisposed();
            int batches, stepRows;
            double charged;
            using (var count = new PreparedCommand(
                _connection, null, StoreQueries.LossCharged(from is not null, to is not null), ("$recipe", SqliteType.Text), ("$from", SqliteType.Text), ("$to", SqliteType.Text)))
            {
                using var reader = SetDays(count, from, to).Set("$recipe", recipe).Read();
                reader.Read();
                (batches, stepRows, charged) = (reader.GetInt32(0), reader.GetInt32(1), reader.GetDouble(2));
            }

            using var query = new PreparedCommand(
                _connection, null, StoreQueries.LossTotals(from is not null, to is not null), ("$recipe", SqliteType.Text), ("$from", SqliteType.Text), ("$to", SqliteType.Text));
            using var rows = SetDays(query, from, to).Set("$recipe", recipe).Read();
            var rungs = new Dictionary<(string Step, string Key), (int Order, string Label, double Kg, List<LadderPart> Parts)>();
            while (rows.Read())
            {
                var key = (rows.GetString(0), rows.GetString(2));
                var rung = rungs.TryGetValue(key, out var known) ? known : (rows.GetInt32(1), rows.GetString(3), 0.0, new List<LadderPart>());
                rung.Item3 += rows.GetDouble(5);
                if (!rows.IsDBNull(4))
                {
                    rung.Item4.Add(new LadderPart(rows.GetString(4), rows.GetDouble(6)));
                }

                rungs[key] = rung;
            }

            var ladderOrder = LadderRungKeys.All.Select((k, i) => (k, i)).ToDictionary(x => x.k, x => x.i, StringComparer.Ordinal);
            var list = rungs
                .OrderBy(r => r.Value.Order).ThenBy(r => r.Key.Step, StringComparer.Ordinal)
                .ThenBy(r => ladderOrder.GetValueOrDefault(r.Key.Key, int.MaxValue)).ThenBy(r => r.Key.Key, StringComparer.Ordinal)
                .Select(r => new RungTotal(r.Key.Step, r.Value.Order, r.Key.Key, r.Value.Label, r.Value.Kg,
                    r.Value.Parts.OrderBy(p => p.Material, StringComparer.Ordinal).ToList()))
                .ToList();
            return new RecipeLossTotals(batches, stepRows, charged, list);
        }
    }
}
