using System.Data.Common;
using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Records.Exports;
using BatchReconcile.Storage.Queries;
using BatchReconcile.Storage.Review;
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
                    [])
                {
                    Route = new RouteYield(reader.NullableDouble(13), reader.NullableDouble(14), reader.NullableString(15)),
                    Links = StoreJson.ParseLinks(reader.NullableString(16)),
                    RecipeVersionSource = ReadVersionSource(reader, 17),
                };
            }

            var flags = ReadFlagsOfRevision(revisionId);
            return header with { Steps = ReadStepsOfRevision(revisionId, flags) };
        }
    }

    /// <summary>
    /// Hands over the flags stored with a file (its ingest log id), in the order they were stored,
    /// each with its batch id, including those a later file has since superseded. They are read one at
    /// a time, so that the flags of a large file are never all in memory.
    /// </summary>
    public void ForEachFlagOfIngest(long ingestId, Action<string, StoredFlag> onFlag)
    {
        ArgumentNullException.ThrowIfNull(onFlag);
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(_connection, null, StoreQueries.FlagsOfIngest, ("$ingest", SqliteType.Integer));
            using var reader = query.Set("$ingest", ingestId).Read();
            while (reader.Read())
            {
                onFlag(reader.GetString(FlagColumnCount), ReadFlag(reader));
            }
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
            return rowReader.Read()
                ? RawRowsJson.Decode(rowReader.GetString(0), (byte[])rowReader.GetValue(1)).OrderBy(r => r.Line).Select(r => new RawRowView(r.Line, r.Fields)).ToList()
                : [];
        }
    }

    /// <summary>
    /// Flags ordered by day, severity (critical first), batch and id, with their review. By default
    /// only flags of current revisions; <paramref name="unresolvedOnly"/> leaves out closed flags
    /// (<c>flags list --open</c>: open and in review).
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

            return ReadFlagList(query);
        }
    }

    /// <summary>
    /// Flags of current revisions that are not closed, from production days before <paramref name="day"/>
    /// (oldest day first, then by severity, batch and id); the host computes their age from
    /// <see cref="FlagListItem.ProductionDay"/>. States are as they stand now.
    /// </summary>
    public IReadOnlyList<FlagListItem> UnresolvedFlagsBefore(DateOnly day)
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(_connection, null, StoreQueries.UnresolvedBefore, ("$day", SqliteType.Text));
            query.Set("$day", DbText.Day(day));
            return ReadFlagList(query);
        }
    }

    /// <summary>The current steps of a production day that carry flags, by batch and step order, with every figure and their flags.</summary>
    public IReadOnlyList<FlaggedStep> FlaggedStepsOfDay(DateOnly day)
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            var dayText = DbText.Day(day);
            var flags = new Dictionary<(long Revision, string Step), List<StoredFlag>>();
            using (var flagQuery = new PreparedCommand(_connection, null, StoreQueries.FlagsOfDay, ("$day", SqliteType.Text)))
            using (var reader = flagQuery.Set("$day", dayText).Read())
            {
                while (reader.Read())
                {
                    var flag = ReadFlag(reader);
                    var key = (reader.GetInt64(FlagColumnCount), flag.Flag.Step);
                    if (!flags.TryGetValue(key, out var list))
                    {
                        flags[key] = list = [];
                    }

                    list.Add(flag);
                }
            }

            using var stepQuery = new PreparedCommand(_connection, null, StoreQueries.FlaggedStepsOfDay, ("$day", SqliteType.Text));
            using var steps = stepQuery.Set("$day", dayText).Read();
            var result = new List<FlaggedStep>();
            while (steps.Read())
            {
                var revisionRef = steps.GetInt64(5);
                var stepFlags = flags.GetValueOrDefault((revisionRef, steps.GetString(6))) ?? [];
                result.Add(new FlaggedStep(
                    steps.GetString(0), steps.GetInt32(1), steps.GetString(2), steps.GetInt32(3), day, ReadStep(steps, 6, stepFlags))
                {
                    RecipeVersionSource = ReadVersionSource(steps, 4),
                });
            }

            return result;
        }
    }

    /// <summary>The recipe steps that ran on a production day (current revisions), by recipe and step order.</summary>
    public IReadOnlyList<RecipeStepKey> RecipeStepsOfDay(DateOnly day)
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(_connection, null, StoreQueries.RecipeStepsOfDay, ("$day", SqliteType.Text));
            using var reader = query.Set("$day", DbText.Day(day)).Read();
            var list = new List<RecipeStepKey>();
            while (reader.Read())
            {
                list.Add(new RecipeStepKey(reader.GetString(0), reader.GetString(1)));
            }

            return list;
        }
    }

    private static List<FlagListItem> ReadFlagList(PreparedCommand query)
    {
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
                ReadReview(reader, 6, 15),
                DbText.ParseDay(reader.GetString(7)),
                reader.GetString(8),
                reader.NullableDouble(9),
                reader.NullableDouble(10),
                reader.GetString(11),
                reader.NullableString(12),
                reader.GetInt64(13) == 1,
                reader.GetString(14)));
        }

        return list;
    }

    /// <summary>A review from the state column and the five columns outcome, note, deviation ref, by, at starting at <paramref name="first"/>.</summary>
    private static FlagReview ReadReview(DbDataReader reader, int state, int first) => new(
        ReviewText.ParseStoredState(reader.GetString(state)),
        ReviewText.ParseStoredOutcome(reader.NullableString(first)),
        reader.NullableString(first + 1),
        reader.NullableString(first + 2),
        reader.NullableString(first + 3),
        reader.NullableTime(first + 4));

    /// <summary>The last <paramref name="lastN"/> current results of one recipe step, oldest first.</summary>
    public IReadOnlyList<StepHistoryPoint> StepHistory(string recipe, string step, int lastN) => StepHistory(recipe, step, lastN, null);

    /// <summary>
    /// The last <paramref name="lastN"/> current results of one recipe step with a production day
    /// up to and including <paramref name="upTo"/> (all days when null), oldest first.
    /// </summary>
    public IReadOnlyList<StepHistoryPoint> StepHistory(string recipe, string step, int lastN, DateOnly? upTo)
    {
        ArgumentNullException.ThrowIfNull(recipe);
        ArgumentNullException.ThrowIfNull(step);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(lastN);
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(
                _connection, null, upTo is null ? StoreQueries.StepHistory : StoreQueries.StepHistoryUpTo,
                ("$recipe", SqliteType.Text), ("$step", SqliteType.Text), ("$limit", SqliteType.Integer), ("$day", SqliteType.Text));
            if (upTo is { } last)
            {
                query.Set("$day", DbText.Day(last));
            }

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
                    reader.GetInt32(10))
                {
                    YieldMinPct = reader.NullableDouble(11),
                    YieldMaxPct = reader.NullableDouble(12),
                });
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
            return new DayCounts(day, reader.GetInt32(0), reader.GetInt32(1), reader.GetInt32(2), reader.GetInt32(3), reader.GetInt32(4), reader.GetInt32(5));
        }
    }

    /// <summary>Current revisions of all batches, or of one production day, by day and batch id.</summary>
    public IReadOnlyList<BatchSummary> ListBatches(DateOnly? day = null) =>
        ReadBatches(new BatchFilter(day, day), byBatchId: true);

    private const int FlagColumnCount = 18;

    private List<StoredFlag> ReadFlagsOfRevision(long revisionId)
    {
        using var query = new PreparedCommand(_connection, null, StoreQueries.FlagsOfRevision, ("$revision", SqliteType.Integer));
        using var reader = query.Set("$revision", revisionId).Read();
        var flags = new List<StoredFlag>();
        while (reader.Read())
        {
            flags.Add(ReadFlag(reader));
        }

        return flags;
    }

    /// <summary>A flag from a row selected with <see cref="StoreQueries.FlagColumns"/> first.</summary>
    private static StoredFlag ReadFlag(DbDataReader reader)
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
        return new StoredFlag(
            reader.GetInt64(0),
            flag,
            ReadReview(reader, 9, 13),
            DbText.ParseDay(reader.GetString(10)),
            reader.GetInt64(11) == 1,
            DbText.ParseTime(reader.GetString(12)));
    }

    private List<StoredStep> ReadStepsOfRevision(long revisionId, List<StoredFlag> flags)
    {
        using var query = new PreparedCommand(_connection, null, StoreQueries.StepsOfRevision, ("$revision", SqliteType.Integer));
        using var r = query.Set("$revision", revisionId).Read();
        var steps = new List<StoredStep>();
        while (r.Read())
        {
            var code = r.GetString(0);
            steps.Add(ReadStep(r, 0, flags.Where(f => string.Equals(f.Flag.Step, code, StringComparison.Ordinal)).ToList()));
        }

        return steps;
    }

    /// <summary>A step from <see cref="StoreQueries.StepColumns"/> starting at column <paramref name="o"/>.</summary>
    private static StoredStep ReadStep(DbDataReader r, int o, IReadOnlyList<StoredFlag> stepFlags)
    {
        var outcome = new StepOutcome(
            Step: r.GetString(o),
            HasRows: r.GetInt64(o + 1) == 1,
            LimitingReactant: r.NullableString(o + 2),
            ExtentMaxMol: r.NullableDouble(o + 3),
            TheoreticalKg: r.NullableDouble(o + 4),
            ActualKg: r.GetDouble(o + 5),
            YieldPct: r.NullableDouble(o + 6),
            AtomEconomyPct: r.GetDouble(o + 7),
            StoichiometricFactor: r.NullableDouble(o + 8),
            RmePct: r.NullableDouble(o + 9),
            Mrp: r.NullableDouble(o + 10),
            OverallRmePct: r.NullableDouble(o + 11),
            Pmi: r.NullableDouble(o + 12),
            CompleteEFactor: r.NullableDouble(o + 13),
            SimpleEFactor: r.NullableDouble(o + 14),
            MassInKg: r.GetDouble(o + 15),
            ReactantMassKg: r.GetDouble(o + 16),
            StoichiometricMassKg: r.NullableDouble(o + 17),
            RecoveredKg: r.GetDouble(o + 18),
            MassOutKg: r.GetDouble(o + 19),
            VentedKg: r.GetDouble(o + 20),
            VentedMaxKg: r.GetDouble(o + 21),
            GapKg: r.GetDouble(o + 22),
            ClosurePct: r.NullableDouble(o + 23),
            CombinedUncertaintyKg: r.GetDouble(o + 24),
            Equivalents: StoreJson.ParseEquivalents(r.GetString(o + 25)),
            Ladder: StoreJson.ParseLadder(r.GetString(o + 26)),
            Flags: stepFlags.Select(f => f.Flag).ToList(),
            Limits: new StepLimits(
                r.NullableDouble(o + 27),
                r.NullableDouble(o + 28),
                r.NullableDouble(o + 29),
                r.NullableDouble(o + 30),
                r.NullableDouble(o + 31),
                StoreJson.ParseEquivalentsRanges(r.NullableString(o + 32)),
                r.NullableDouble(o + 33)),
            SolventInKg: r.NullableDouble(o + 34),
            WaterInKg: r.NullableDouble(o + 35));
        return new StoredStep(outcome, stepFlags);
    }

    /// <summary>How the revision's recipe version was chosen; null when unknown (stored before it was recorded).</summary>
    private static RecipeVersionSource? ReadVersionSource(DbDataReader reader, int ordinal) =>
        reader.NullableString(ordinal) is not { } text ? null
        : RecipeVersionSources.TryParse(text, out var source) ? source
        : throw new InvalidDataException($"Unknown recipe version source '{text}' in the database.");

    private static FlagCode ParseCode(string text) =>
        FlagCodes.TryParse(text, out var code) ? code : throw new InvalidDataException($"Unknown flag code '{text}' in the database.");

    private static FlagSeverity ParseSeverity(string text) =>
        FlagCodes.TryParseSeverity(text, out var severity) ? severity.Value : throw new InvalidDataException($"Unknown severity '{text}' in the database.");
}
