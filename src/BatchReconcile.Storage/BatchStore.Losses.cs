using System.Text.Json;
using BatchReconcile.Storage.Queries;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage;

public sealed partial class BatchStore
{
    /// <summary>The step rows of a recipe's current revisions in the period, from <c>ix_step_result_recipe</c>: revision, step, m_in, ladder JSON.</summary>
    internal static string LossTotalsOfRecipeSql(bool from, bool to) =>
        "SELECT s.revision_ref, s.step, s.mass_in_kg, s.ladder FROM step_result s WHERE s.recipe = $recipe AND s.is_current = 1"
        + (from ? " AND s.production_day >= $from" : string.Empty)
        + (to ? " AND s.production_day <= $to" : string.Empty);

    /// <summary>
    /// The loss ladders of a recipe's current batch revisions in the period, summed per step and rung and per material part
    /// (<see cref="LossTotals"/>). One pass over the rows; each ladder is summed straight from its stored JSON without
    /// building the rung objects, which on a year of batches took twice as long as the rest of <c>losses</c>.
    /// </summary>
    public LossTotals LossTotalsOfRecipe(string recipe, DateOnly? from = null, DateOnly? to = null)
    {
        ArgumentNullException.ThrowIfNull(recipe);
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(
                _connection, null, LossTotalsOfRecipeSql(from is not null, to is not null), ("$recipe", SqliteType.Text), ("$from", SqliteType.Text), ("$to", SqliteType.Text));
            SetDays(query, from, to).Set("$recipe", recipe);
            using var reader = query.Read();
            var revisions = new HashSet<long>();
            var charged = 0.0;
            var rungs = new Dictionary<(string Step, string Key), (string Label, double Kg, int Order)>();
            var parts = new Dictionary<(string Step, string Key, string Material), (double Kg, int Order)>();
            while (reader.Read())
            {
                revisions.Add(reader.GetInt64(0));
                var step = reader.GetString(1);
                charged += reader.GetDouble(2);
                var ladder = reader.GetString(3);
                if (ladder == "[]")
                {
                    continue;
                }

                using var doc = JsonDocument.Parse(ladder);
                foreach (var rung in doc.RootElement.EnumerateArray())
                {
                    var key = rung.GetProperty("key").GetString()!;
                    var kg = rung.GetProperty("kg").GetDouble();
                    rungs[(step, key)] = rungs.TryGetValue((step, key), out var sum)
                        ? (sum.Label, sum.Kg + kg, sum.Order)
                        : (rung.GetProperty("label").GetString()!, kg, rungs.Count);
                    if (!rung.TryGetProperty("parts", out var list) || list.ValueKind != JsonValueKind.Array)
                    {
                        continue;
                    }

                    foreach (var part in list.EnumerateArray())
                    {
                        var material = part.GetProperty("material").GetString()!;
                        var partKg = part.GetProperty("kg").GetDouble();
                        parts[(step, key, material)] = parts.TryGetValue((step, key, material), out var p) ? (p.Kg + partKg, p.Order) : (partKg, parts.Count);
                    }
                }
            }

            return new LossTotals(
                revisions.Count,
                charged,
                [.. rungs.OrderBy(r => r.Value.Order).Select(r => new RungTotal(r.Key.Step, r.Key.Key, r.Value.Label, r.Value.Kg))],
                [.. parts.OrderBy(p => p.Value.Order).Select(p => new RungPartTotal(p.Key.Step, p.Key.Key, p.Key.Material, p.Value.Kg))]);
        }
    }
}
