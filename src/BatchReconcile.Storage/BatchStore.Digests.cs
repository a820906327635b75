using System.Text.Json;
using BatchReconcile.Storage.Audit;
using BatchReconcile.Storage.Digests;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage;

public sealed partial class BatchStore
{
    private const string DigestColumns = "id, day, written_at, files, flag_count, is_rewrite, written_by";

    /// <summary>
    /// Records that a day's digest was written, with an audit entry (<c>digest.written</c> or
    /// <c>digest.rewritten</c>), in one transaction. A day's digest is written once: when the day
    /// has one and <paramref name="rewrite"/> is false (the scheduler, or a second process that got
    /// there first) nothing is recorded and the result says so. A rewrite asked for a day without
    /// a digest is recorded as its first write.
    /// </summary>
    public DigestRecordResult RecordDigest(DateOnly day, IReadOnlyList<string> files, int flagCount, bool rewrite, string by)
    {
        ArgumentNullException.ThrowIfNull(files);
        ArgumentOutOfRangeException.ThrowIfNegative(flagCount);
        ArgumentException.ThrowIfNullOrWhiteSpace(by);
        if (files.Any(string.IsNullOrWhiteSpace))
        {
            throw new ArgumentException("A digest file name is empty.", nameof(files));
        }

        var dayText = DbText.Day(day);
        lock (_gate)
        {
            ThrowIfDisposed();
            using var transaction = _connection.BeginTransaction(deferred: false);
            var earlier = ReadDigestWrites(transaction, day);
            if (earlier.Count > 0 && !rewrite)
            {
                return DigestRecordResult.Refused(
                    $"the digest of {dayText} was already written on {ShortTime(earlier[0].WrittenAt)}; ask for a rewrite to write it again");
            }

            var isRewrite = earlier.Count > 0;
            var now = _time.GetUtcNow();
            var filesJson = JsonSerializer.Serialize(files);
            long id;
            using (var insert = new PreparedCommand(
                _connection, transaction,
                "INSERT INTO digest (day, written_at, written_by, is_rewrite, files, flag_count) VALUES ($day, $at, $by, $rewrite, $files, $flags) RETURNING id",
                ("$day", SqliteType.Text), ("$at", SqliteType.Text), ("$by", SqliteType.Text), ("$rewrite", SqliteType.Integer),
                ("$files", SqliteType.Text), ("$flags", SqliteType.Integer)))
            {
                id = insert.Set("$day", dayText).Set("$at", DbText.Time(now)).Set("$by", by).Set("$rewrite", isRewrite ? 1 : 0)
                    .Set("$files", filesJson).Set("$flags", flagCount).ScalarInt64();
            }

            long auditId;
            using (var audit = new AuditWriter(_connection, transaction))
            {
                auditId = audit.Append(
                    now, by, isRewrite ? "digest.rewritten" : "digest.written", "digest:" + dayText,
                    StoreJson.Detail(new { day = dayText, files, flags = flagCount, write = earlier.Count + 1 }));
            }

            transaction.Commit();
            return DigestRecordResult.Done(new DigestWrite(id, day, DbText.ParseTime(DbText.Time(now)), files.ToList(), flagCount, isRewrite, by), auditId);
        }
    }

    /// <summary>Every write of a day's digest; null when the day has none.</summary>
    public DigestRecord? GetDigest(DateOnly day)
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            var writes = ReadDigestWrites(null, day);
            return writes.Count == 0 ? null : new DigestRecord(day, writes);
        }
    }

    /// <summary>The production days that have a digest, oldest first, optionally within <paramref name="from"/> .. <paramref name="to"/> (both included).</summary>
    public IReadOnlyList<DateOnly> DigestDays(DateOnly? from = null, DateOnly? to = null)
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(
                _connection, null,
                "SELECT DISTINCT day FROM digest WHERE day >= $from AND day <= $to ORDER BY day",
                ("$from", SqliteType.Text), ("$to", SqliteType.Text));
            using var reader = query
                .Set("$from", from is { } f ? DbText.Day(f) : "0000-00-00")
                .Set("$to", to is { } t ? DbText.Day(t) : "9999-99-99")
                .Read();
            var days = new List<DateOnly>();
            while (reader.Read())
            {
                days.Add(DbText.ParseDay(reader.GetString(0)));
            }

            return days;
        }
    }

    private List<DigestWrite> ReadDigestWrites(SqliteTransaction? transaction, DateOnly day)
    {
        using var query = new PreparedCommand(
            _connection, transaction, $"SELECT {DigestColumns} FROM digest WHERE day = $day ORDER BY id", ("$day", SqliteType.Text));
        using var reader = query.Set("$day", DbText.Day(day)).Read();
        var writes = new List<DigestWrite>();
        while (reader.Read())
        {
            writes.Add(new DigestWrite(
                reader.GetInt64(0),
                DbText.ParseDay(reader.GetString(1)),
                DbText.ParseTime(reader.GetString(2)),
                JsonSerializer.Deserialize<List<string>>(reader.GetString(3)) ?? [],
                reader.GetInt32(4),
                reader.GetInt64(5) == 1,
                reader.GetString(6)));
        }

        return writes;
    }
}
