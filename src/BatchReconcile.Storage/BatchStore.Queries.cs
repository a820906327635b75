using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Storage.Queries;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage;

public sealed partial class BatchStore
{
    /// <summary>The current revision of a batch with every step figure and flag; null when the batch is not stored.</summary>
    public BatchView? GetLatestBatch(string batchId) => GetBatch(batchId, null);

    /// <summary>One revision of a batch (the current one when <paramref name="revision"/> is null); null when not stored.</summary>
    public BatchView? GetBatch(string batchId, int? revision)
    {
        ArgumentNullException.ThrowIfNull(batchId);
        lock (_gate)
        {
            ThrowIfDisposed();
            long revisionId;
            BatchView header;
            using (var find = new PreparedCommand(_connection, null, StoreQueries.Revision, ("$batch", SqliteType.Text), ("$revision", SqliteType.Integer)))
            using (var reader = find.Set("$batch", batchId).Set("$revision", revision).Read())
            {
                if (!reader.Read())
                {
                    return null;
                }

                revisionId = reader.GetInt64(0);
                header = new BatchView(
                    batchId,
                    reader.GetInt32(1),
                    reader.GetInt32(12),
                    reader.GetString(2),
                    reader.GetInt32(3),
                    DbText.ParseDay(reader.GetString(4)),
                    reader.NullableTime(5),
                    DbText.ParseTime(reader.GetString(6)),
                    reader.NullableTime(7),
                    reader.IsDBNull(8) ? null : reader.GetInt32(8),
                    reader.GetString(9),
                    reader.GetString(10),
                    reader.GetString(11),
                    []);
            }

            var flags = ReadFlagsOfRevision(revisionId);
            return header with { Steps = ReadStepsOfRevision(revisionId, flags) };
        }
    }

    /// <summary>The rows of one revision (the current one when <paramref name="revision"/> is null) as read from the file; empty when not stored.</summary>
    public IReadOnlyList<RawRowView> GetRawRows(string batchId, int? revision = null)
    {
        ArgumentNullException.ThrowIfNull(batchId);
        lock (_gate)
        {
            ThrowIfDisposed();
            long revisionId;
            using (var find = new PreparedCommand(_connection, null, StoreQueries.Revision, ("$batch", SqliteType.Text), ("$revision", SqliteType.Integer)))
            using (var reader = find.Set("$batch", batchId).Set("$revision", revision).Read())
            {
                if (!reader.Read())
                {
                    return [];
                }

                revisionId = reader.GetInt64(0);
            }

            using var rows = new PreparedCommand(_connection, null, StoreQueries.RawRowsOfRevision, ("$revision", SqliteType.Integer));
            using var rowReader = rows.Set("$revision", revisionId).Read();
            var list = new List<RawRowView>();
            while (rowReader.Read())
            {
                list.Add(new RawRowView(rowReader.GetInt32(0), StoreJson.ParseRawFields(rowReader.GetString(1))));
            }

            return list;
        }
    }

    /// <summary>
    /// Flags ordered by day, severity (critical first), batch and id. By default only flags of
    /// current revisions; <paramref name="unresolvedOnly"/> leaves out closed flags.
    /// </summary>
    public IReadOnlyList<FlagListItem> ListFlags(DateOnly? day = null, bool unresolvedOnly = false, bool includeSuperseded = false)
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(
                _connection, null, StoreQueries.Flags(day is not null, !includeSuperseded, unresolvedOnly), ("$day", SqliteType.Text));
            if (day is { } d)
            {
                query.Set("$day", DbText.Day(d));
            }

            using var reader = query.Read();
            var list = new List<FlagListItem>();
            while (reader.Read())
            {
                list.Add(new FlagListItem(
                    reader.GetInt64(0),
                    reader.GetString(1),
                    reader.GetInt32(2),
                    reader.GetString(3),
                    ParseCode(reader.GetString(4)),
                    ParseSeverity(reader.GetString(5)),
                    reader.GetString(6),
                    DbText.ParseDay(reader.GetString(7)),
                    reader.GetString(8),
                    reader.NullableDouble(9),
                    reader.NullableDouble(10),
                    reader.GetString(11),
                    reader.NullableString(12),
                    reader.GetInt64(13) == 1));
            }

            return list;
        }
    }

    /// <summary>The last <paramref name="lastN"/> current results of one recipe step, oldest first.</summary>
    public IReadOnlyList<StepHistoryPoint> StepHistory(string recipe, string step, int lastN)
    {
        ArgumentNullException.ThrowIfNull(recipe);
        ArgumentNullException.ThrowIfNull(step);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(lastN);
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(
                _connection, null, StoreQueries.StepHistory, ("$recipe", SqliteType.Text), ("$step", SqliteType.Text), ("$limit", SqliteType.Integer));
            using var reader = query.Set("$recipe", recipe).Set("$step", step).Set("$limit", lastN).Read();
            var list = new List<StepHistoryPoint>();
            while (reader.Read())
            {
                list.Add(new StepHistoryPoint(
                    reader.GetString(0),
                    reader.GetInt32(1),
                    DbText.ParseDay(reader.GetString(2)),
                    reader.NullableTime(3),
                    reader.NullableDouble(4),
                    reader.GetDouble(5),
                    reader.NullableDouble(6),
                    reader.NullableDouble(7),
                    reader.GetDouble(8),
                    reader.NullableDouble(9),
                    reader.GetInt32(10)));
            }

            list.Reverse();
            return list;
        }
    }

    /// <summary>Batches and flags of one production day, current revisions only.</summary>
    public DayCounts CountsByDay(DateOnly day)
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(_connection, null, StoreQueries.CountsOfDay, ("$day", SqliteType.Text));
            using var reader = query.Set("$day", DbText.Day(day)).Read();
            reader.Read();
            return new DayCounts(day, reader.GetInt32(0), reader.GetInt32(1), reader.GetInt32(2), reader.GetInt32(3), reader.GetInt32(4));
        }
    }

    /// <summary>Current revisions of all batches, or of one production day, by day and batch id.</summary>
    public IReadOnlyList<BatchSummary> ListBatches(DateOnly? day = null)
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(_connection, null, StoreQueries.Batches(day is not null), ("$day", SqliteType.Text));
            if (day is { } d)
            {
                query.Set("$day", DbText.Day(d));
            }

            using var reader = query.Read();
            var list = new List<BatchSummary>();
            while (reader.Read())
            {
                list.Add(new BatchSummary(
                    reader.GetString(0), reader.GetInt32(1), reader.GetString(2), reader.GetInt32(3), DbText.ParseDay(reader.GetString(4)), reader.GetInt32(5)));
            }

            return list;
        }
    }

    private List<StoredFlag> ReadFlagsOfRevision(long revisionId)
    {
        using var query = new PreparedCommand(_connection, null, StoreQueries.FlagsOfRevision, ("$revision", SqliteType.Integer));
        using var reader = query.Set("$revision", revisionId).Read();
        var flags = new List<StoredFlag>();
        while (reader.Read())
        {
            var flag = new Flag(
                ParseCode(reader.GetString(2)),
                ParseSeverity(reader.GetString(3)),
                reader.GetString(1),
                reader.NullableDouble(4),
                reader.NullableDouble(5),
                reader.GetString(6),
                reader.GetString(7),
                reader.NullableString(8));
            flags.Add(new StoredFlag(
                reader.GetInt64(0),
                flag,
                reader.GetString(9),
                DbText.ParseDay(reader.GetString(10)),
                reader.GetInt64(11) == 1,
                DbText.ParseTime(reader.GetString(12))));
        }

        return flags;
    }

    private List<StoredStep> ReadStepsOfRevision(long revisionId, List<StoredFlag> flags)
    {
        using var query = new PreparedCommand(_connection, null, StoreQueries.StepsOfRevision, ("$revision", SqliteType.Integer));
        using var r = query.Set("$revision", revisionId).Read();
        var steps = new List<StoredStep>();
        while (r.Read())
        {
            var code = r.GetString(0);
            var stepFlags = flags.Where(f => string.Equals(f.Flag.Step, code, StringComparison.Ordinal)).ToList();
            var outcome = new StepOutcome(
                Step: code,
                HasRows: r.GetInt64(1) == 1,
                LimitingReactant: r.NullableString(2),
                ExtentMaxMol: r.NullableDouble(3),
                TheoreticalKg: r.NullableDouble(4),
                ActualKg: r.GetDouble(5),
                YieldPct: r.NullableDouble(6),
                AtomEconomyPct: r.GetDouble(7),
                StoichiometricFactor: r.NullableDouble(8),
                RmePct: r.NullableDouble(9),
                Mrp: r.NullableDouble(10),
                OverallRmePct: r.NullableDouble(11),
                Pmi: r.NullableDouble(12),
                CompleteEFactor: r.NullableDouble(13),
                SimpleEFactor: r.NullableDouble(14),
                MassInKg: r.GetDouble(15),
                ReactantMassKg: r.GetDouble(16),
                StoichiometricMassKg: r.NullableDouble(17),
                RecoveredKg: r.GetDouble(18),
                MassOutKg: r.GetDouble(19),
                VentedKg: r.GetDouble(20),
                VentedMaxKg: r.GetDouble(21),
                GapKg: r.GetDouble(22),
                ClosurePct: r.NullableDouble(23),
                CombinedUncertaintyKg: r.GetDouble(24),
                Equivalents: StoreJson.ParseEquivalents(r.GetString(25)),
                Ladder: StoreJson.ParseLadder(r.GetString(26)),
                Flags: stepFlags.Select(f => f.Flag).ToList());
            steps.Add(new StoredStep(outcome, stepFlags));
        }

        return steps;
    }

    private static FlagCode ParseCode(string text) =>
        FlagCodes.TryParse(text, out var code) ? code : throw new InvalidDataException($"Unknown flag code '{text}' in the database.");

    private static FlagSeverity ParseSeverity(string text) =>
        FlagCodes.TryParseSeverity(text, out var severity) ? severity.Value : throw new InvalidDataException($"Unknown severity '{text}' in the database.");
}
