using System.Data.Common;
using System.Globalization;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Storage.Audit;
using BatchReconcile.Storage.Queries;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage;

/// <summary>
/// Questions across batches: lists of batches, one flag with its history, the audit trail, and a recipe's steps batch
/// by batch in production order, (production day, last output time, batch id) of the current revisions. Every one
/// reads an index (docs/storage.md, "Indexes"); the ones over a recipe's history never read the rows of other recipes.
/// </summary>
public sealed partial class BatchStore
{
    /// <summary>Current revisions matching <paramref name="filter"/>, in production order.</summary>
    public IReadOnlyList<BatchSummary> ListBatches(BatchFilter filter)
    {
        ArgumentNullException.ThrowIfNull(filter);
        return ReadBatches(filter, byBatchId: false);
    }

    private List<BatchSummary> ReadBatches(BatchFilter filter, bool byBatchId)
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(
                _connection, null, StoreQueries.Batches(filter.From is not null, filter.To is not null, filter.Recipe is not null, filter.FlaggedOnly, byBatchId),
                ("$from", SqliteType.Text), ("$to", SqliteType.Text), ("$recipe", SqliteType.Text));
            SetDays(query, filter.From, filter.To).Set("$recipe", filter.Recipe);
            using var reader = query.Read();
            var list = new List<BatchSummary>();
            while (reader.Read())
            {
                list.Add(new BatchSummary(
                    reader.GetString(0), reader.GetInt32(1), reader.GetString(2), reader.GetInt32(3), DbText.ParseDay(reader.GetString(4)), reader.GetInt32(5))
                {
                    StepCount = reader.GetInt32(6),
                    RouteYieldPct = reader.NullableDouble(7),
                    RouteNote = reader.NullableString(8),
                    OpenFlagCount = reader.GetInt32(9),
                    LastOutputAt = reader.NullableTime(10),
                });
            }

            return list;
        }
    }

    /// <summary>
    /// One flag (of any revision, current or superseded) with its step's stored figures and limits, its batch revision
    /// and its review history from the audit trail; null when no flag has this id.
    /// </summary>
    public FlagDetail? GetFlag(long id)
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            StoredFlag flag;
            long revisionRef;
            string batchId, recipe;
            int revision, recipeVersion;
            int? supersededBy;
            DateOnly day;
            using (var find = new PreparedCommand(_connection, null, StoreQueries.FlagHeader, ("$id", SqliteType.Integer)))
            using (var reader = find.Set("$id", id).Read())
            {
                if (!reader.Read())
                {
                    return null;
                }

                flag = ReadFlag(reader);
                var o = FlagColumnCount;
                revisionRef = reader.GetInt64(o);
                batchId = reader.GetString(o + 1);
                revision = reader.GetInt32(o + 2);
                recipe = reader.GetString(o + 3);
                recipeVersion = reader.GetInt32(o + 4);
                day = DbText.ParseDay(reader.GetString(o + 5));
                supersededBy = reader.IsDBNull(o + 6) ? null : reader.GetInt32(o + 6);
            }

            var stepFlags = new List<StoredFlag>();
            using (var flags = new PreparedCommand(_connection, null, StoreQueries.FlagsOfStep, ("$revision", SqliteType.Integer), ("$step", SqliteType.Text)))
            using (var reader = flags.Set("$revision", revisionRef).Set("$step", flag.Flag.Step).Read())
            {
                while (reader.Read())
                {
                    stepFlags.Add(ReadFlag(reader));
                }
            }

            StoredStep step;
            using (var steps = new PreparedCommand(_connection, null, StoreQueries.StepOfRevision, ("$revision", SqliteType.Integer), ("$step", SqliteType.Text)))
            using (var reader = steps.Set("$revision", revisionRef).Set("$step", flag.Flag.Step).Read())
            {
                // The foreign key keeps every flag on a stored step of its revision.
                step = reader.Read()
                    ? ReadStep(reader, 0, stepFlags)
                    : throw new InvalidDataException($"Flag {id.ToString(CultureInfo.InvariantCulture)} names step {flag.Flag.Step}, which its revision does not hold.");
            }

            var history = ReadAuditTrailOf("flag:" + id.ToString(CultureInfo.InvariantCulture));
            return new FlagDetail(flag, batchId, revision, recipe, recipeVersion, day, supersededBy, step, history);
        }
    }

    /// <summary>Audit entries matching <paramref name="filter"/>, oldest first.</summary>
    public IReadOnlyList<AuditEntry> ListAudit(AuditFilter filter)
    {
        ArgumentNullException.ThrowIfNull(filter);
        lock (_gate)
        {
            ThrowIfDisposed();
            var kind = filter.Kind?.Trim();
            using var query = new PreparedCommand(
                _connection, null, StoreQueries.Audit(filter.From is not null, filter.To is not null, !string.IsNullOrEmpty(kind)),
                ("$from", SqliteType.Text), ("$to", SqliteType.Text), ("$kind", SqliteType.Text), ("$kindPrefix", SqliteType.Text), ("$kindEnd", SqliteType.Text));
            // "flag" stands for every "flag.*": the half-open text range [flag., flag/) ('/' follows '.').
            query.Set("$from", filter.From is { } f ? DbText.Time(f) : null).Set("$to", filter.To is { } t ? DbText.Time(t) : null)
                .Set("$kind", kind).Set("$kindPrefix", kind + ".").Set("$kindEnd", kind + "/");
            using var reader = query.Read();
            var list = new List<AuditEntry>();
            while (reader.Read())
            {
                list.Add(AuditWriter.Read(reader));
            }

            return list;
        }
    }

    /// <summary>The kinds of entry the audit trail holds, in text order (for naming a kind that matches none).</summary>
    public IReadOnlyList<string> AuditKinds()
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(_connection, null, StoreQueries.AuditKinds);
            using var reader = query.Read();
            var list = new List<string>();
            while (reader.Read())
            {
                list.Add(reader.GetString(0));
            }

            return list;
        }
    }

    /// <summary>One audit entry; null when the trail has no entry with this id.</summary>
    public AuditEntry? GetAuditEntry(long id)
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(_connection, null, StoreQueries.AuditEntry, ("$id", SqliteType.Integer));
            using var reader = query.Set("$id", id).Read();
            return reader.Read() ? AuditWriter.Read(reader) : null;
        }
    }

    /// <summary>
    /// One figure of one recipe step, batch by batch (current revisions) in production order: production day, last
    /// output time, batch id. <paramref name="from"/> and <paramref name="to"/> are production days, inclusive;
    /// <paramref name="version"/> keeps one recipe version. Empty when the recipe or step has no stored batches.
    /// </summary>
    public IReadOnlyList<StepSeriesPoint> StepSeries(string recipe, string step, StepMeasure measure, DateOnly? from = null, DateOnly? to = null, int? version = null)
    {
        ArgumentNullException.ThrowIfNull(recipe);
        ArgumentNullException.ThrowIfNull(step);
        ArgumentNullException.ThrowIfNull(measure);
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(
                _connection, null, StoreQueries.StepSeries(measure.Column, from is not null, to is not null, version is not null),
                ("$recipe", SqliteType.Text), ("$step", SqliteType.Text), ("$from", SqliteType.Text), ("$to", SqliteType.Text), ("$version", SqliteType.Integer));
            SetDays(query, from, to).Set("$recipe", recipe).Set("$step", step).Set("$version", version);
            using var reader = query.Read();
            var list = new List<StepSeriesPoint>();
            var equivalents = measure.Kind == StepMeasureKind.Equivalents;
            while (reader.Read())
            {
                double? value = !equivalents ? reader.NullableDouble(5)
                    : StoreJson.ParseEquivalents(reader.GetString(5)).TryGetValue(measure.Material!, out var eq) ? eq : null;
                list.Add(new StepSeriesPoint(
                    reader.GetString(0), reader.GetInt32(1), ReadRecipeVersion(reader, 2), DbText.ParseDay(reader.GetString(3)), value, reader.GetInt32(6))
                {
                    LastOutputAt = reader.NullableTime(4),
                });
            }

            ProductionOrder.SortTies(list, p => (p.Day, p.LastOutputAt), p => (p.BatchId, 0));
            return list;
        }
    }

    /// <summary>
    /// Every current step result of a recipe, batch by batch in production order and then in step order, with every
    /// stored figure (ladder, equivalents and limits included), the batch's route yield and the step's flag counts.
    /// <paramref name="from"/> and <paramref name="to"/> are production days, inclusive; <paramref name="version"/>
    /// keeps one recipe version.
    /// </summary>
    /// <param name="parts">The JSON-held figures to read (<see cref="StepParts"/>): all by default; a question that needs
    /// neither ladder nor equivalents (a comparison of yields and metrics) reads a long history several times faster without.</param>
    public IReadOnlyList<RecipeStepRow> StepsOfRecipe(string recipe, DateOnly? from = null, DateOnly? to = null, int? version = null, StepParts parts = StepParts.All)
    {
        ArgumentNullException.ThrowIfNull(recipe);
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(
                _connection, null, StoreQueries.StepsOfRecipe(from is not null, to is not null, version is not null, parts),
                ("$recipe", SqliteType.Text), ("$from", SqliteType.Text), ("$to", SqliteType.Text), ("$version", SqliteType.Integer));
            SetDays(query, from, to).Set("$recipe", recipe).Set("$version", version);
            var list = new List<RecipeStepRow>();
            ReadStepRows(query, row => list.Add(row.Row));
            return list;
        }
    }

    /// <summary>
    /// Hands over every current step result (of one recipe, or of all), batch by batch in production order and then in
    /// step order, one at a time (<c>export steps</c>: a year of every recipe is never all in memory), each with its recipe.
    /// </summary>
    public void ForEachStep(string? recipe, DateOnly? from, DateOnly? to, Action<string, RecipeStepRow> onStep)
    {
        ArgumentNullException.ThrowIfNull(onStep);
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(
                _connection, null, StoreQueries.StepsForExport(recipe is not null, from is not null, to is not null),
                ("$recipe", SqliteType.Text), ("$from", SqliteType.Text), ("$to", SqliteType.Text));
            SetDays(query, from, to).Set("$recipe", recipe);
            ReadStepRows(query, row => onStep(row.Recipe!, row.Row));
        }
    }

    /// <summary>The steps of a recipe as stored (any version), in step order; empty when no batch of the recipe is stored.</summary>
    public IReadOnlyList<string> RecipeSteps(string recipe)
    {
        ArgumentNullException.ThrowIfNull(recipe);
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(_connection, null, StoreQueries.RecipeSteps, ("$recipe", SqliteType.Text));
            using var reader = query.Set("$recipe", recipe).Read();
            var list = new List<string>();
            while (reader.Read())
            {
                list.Add(reader.GetString(0));
            }

            return list;
        }
    }

    /// <summary>Reads rows of <see cref="StoreQueries.StepsOfRecipe"/> or <see cref="StoreQueries.StepsForExport"/> (whose
    /// column 11 is the revision id or the recipe code).</summary>
    private static void ReadStepRows(PreparedCommand query, Action<(RecipeStepRow Row, string? Recipe)> onRow)
    {
        using var reader = query.Read();
        var withRecipe = reader.GetName(11) == "recipe";
        // Rows come in (day, last output) order; those sharing both are held back and handed over in batch and step order.
        var ties = new List<(RecipeStepRow Row, string? Recipe)>();
        void Flush()
        {
            if (ties.Count > 1)
            {
                ties.Sort((a, b) => ProductionOrder.CompareTie((a.Row.BatchId, a.Row.StepOrder), (b.Row.BatchId, b.Row.StepOrder)));
            }

            foreach (var tie in ties)
            {
                onRow(tie);
            }

            ties.Clear();
        }

        while (reader.Read())
        {
            var outcome = ReadStep(reader, StoreQueries.StepsOfRecipeLead, []).Outcome;
            var row = new RecipeStepRow(
                reader.GetString(0), reader.GetInt32(1), ReadRecipeVersion(reader, 2), DbText.ParseDay(reader.GetString(3)), outcome, reader.GetInt32(10))
            {
                LastOutputAt = reader.NullableTime(4),
                StepOrder = reader.GetInt32(5),
                Route = new RouteYield(reader.NullableDouble(6), reader.NullableDouble(7), reader.NullableString(8)),
                FlagCount = reader.GetInt32(9),
            };
            if (ties.Count > 0 && (ties[0].Row.Day != row.Day || ties[0].Row.LastOutputAt != row.LastOutputAt))
            {
                Flush();
            }

            ties.Add((row, withRecipe ? reader.GetString(11) : null));
        }

        Flush();
    }

    // Filled for every row by the migration that added it and by every commit since; NULL would be a database edited by hand.
    private static int ReadRecipeVersion(DbDataReader reader, int ordinal) =>
        reader.IsDBNull(ordinal) ? throw new InvalidDataException("A step result is stored without its recipe version.") : reader.GetInt32(ordinal);

    private static PreparedCommand SetDays(PreparedCommand query, DateOnly? from, DateOnly? to) =>
        query.Set("$from", from is { } f ? DbText.Day(f) : null).Set("$to", to is { } t ? DbText.Day(t) : null);

    private List<AuditEntry> ReadAuditTrailOf(string subject)
    {
        using var query = new PreparedCommand(
            _connection, null, $"SELECT {AuditWriter.Columns} FROM audit_event WHERE subject = $subject ORDER BY id", ("$subject", SqliteType.Text));
        using var reader = query.Set("$subject", subject).Read();
        var list = new List<AuditEntry>();
        while (reader.Read())
        {
            list.Add(AuditWriter.Read(reader));
        }

        return list;
    }
}
