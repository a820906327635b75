using System.Data.Common;
using System.Text.Json;
using BatchReconcile.Storage.Audit;
using BatchReconcile.Storage.Digests;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage;

public sealed partial class BatchStore
{
    private const string DigestColumns =
        "id, day, written_at, files, flag_count, is_rewrite, written_by, seen_batches, seen_revisions, seen_withdrawn, seen_reviews, reason";

    private const string DayChangeColumns = "batches, revisions, withdrawn, reviews";

    /// <summary>
    /// Records that a day's digest was written, with an audit entry (<c>digest.written</c> or
    /// <c>digest.rewritten</c>), in one transaction. A day's digest is written once: when the day
    /// has one and <paramref name="rewrite"/> is false (the scheduler, or a second process that got
    /// there first) nothing is recorded and the result says so. A rewrite asked for a day without
    /// a digest is recorded as its first write.
    /// </summary>
    public DigestRecordResult RecordDigest(DateOnly day, IReadOnlyList<string> files, int flagCount, bool rewrite, string by) =>
        RecordDigest(new DigestWriteRequest(day, files, flagCount, rewrite, by));

    /// <summary>
    /// Records a digest write as <see cref="RecordDigest(DateOnly, IReadOnlyList{string}, int, bool, string)"/> does, with the
    /// day's change counts it covers (so the day counts as fresh until something else changes), the reason of a rewrite
    /// and the kept earlier files in its audit entry. <see cref="DigestWriteRequest.WriteFiles"/> runs under the write
    /// lock once the checks have passed: two processes never number or write the same day's files at once.
    /// </summary>
    /// <exception cref="StoreException">The database could not be written (locked, full, read-only); nothing was recorded.</exception>
    public DigestRecordResult RecordDigest(DigestWriteRequest request)
    {
        ArgumentNullException.ThrowIfNull(request);
        return Guarded(() => RecordDigestInStore(request));
    }

    private DigestRecordResult RecordDigestInStore(DigestWriteRequest request)
    {
        var (day, files, flagCount, rewrite, by) = (request.Day, request.Files, request.FlagCount, request.Rewrite, request.By);
        ArgumentNullException.ThrowIfNull(files);
        ArgumentOutOfRangeException.ThrowIfNegative(flagCount);
        ArgumentException.ThrowIfNullOrWhiteSpace(by);
        if (files.Any(string.IsNullOrWhiteSpace))
        {
            throw new ArgumentException("A digest file name is empty.", nameof(request));
        }

        var dayText = DbText.Day(day);
        lock (_gate)
        {
            ThrowIfDisposed();
            using var transaction = BeginWrite();
            var earlier = ReadDigestWrites(transaction, day);
            if (earlier.Count > 0 && !rewrite)
            {
                return DigestRecordResult.Refused(
                    $"the digest of {dayText} was already written on {ShortTime(earlier[0].WrittenAt)}; ask for a rewrite to write it again");
            }

            if (request.ExpectedEarlierWrites is { } expected && expected != earlier.Count)
            {
                return DigestRecordResult.Refused(
                    $"the digest of {dayText} was written by another process meanwhile ({earlier.Count} writes, {expected} expected)");
            }

            var seen = request.Seen ?? ReadDayChanges(transaction, day);
            request.WriteFiles?.Invoke();

            var isRewrite = earlier.Count > 0;
            var reason = isRewrite ? request.Reason : null;
            var now = _time.GetUtcNow();
            var filesJson = JsonSerializer.Serialize(files);
            long id;
            using (var insert = new PreparedCommand(
                _connection, transaction,
                """
                INSERT INTO digest (day, written_at, written_by, is_rewrite, files, flag_count, seen_batches, seen_revisions, seen_withdrawn, seen_reviews, reason)
                VALUES ($day, $at, $by, $rewrite, $files, $flags, $batches, $revisions, $withdrawn, $reviews, $reason) RETURNING id
                """,
                ("$day", SqliteType.Text), ("$at", SqliteType.Text), ("$by", SqliteType.Text), ("$rewrite", SqliteType.Integer),
                ("$files", SqliteType.Text), ("$flags", SqliteType.Integer), ("$batches", SqliteType.Integer), ("$revisions", SqliteType.Integer),
                ("$withdrawn", SqliteType.Integer), ("$reviews", SqliteType.Integer), ("$reason", SqliteType.Text)))
            {
                id = insert.Set("$day", dayText).Set("$at", DbText.Time(now)).Set("$by", by).Set("$rewrite", isRewrite ? 1 : 0)
                    .Set("$files", filesJson).Set("$flags", flagCount).Set("$batches", seen.Batches).Set("$revisions", seen.Revisions)
                    .Set("$withdrawn", seen.Withdrawn).Set("$reviews", seen.Reviews).Set("$reason", (object?)reason ?? DBNull.Value).ScalarInt64();
            }

            using (var mark = new PreparedCommand(
                _connection, transaction,
                "INSERT INTO day_change (day, digested) VALUES ($day, $total) ON CONFLICT (day) DO UPDATE SET digested = excluded.digested",
                ("$day", SqliteType.Text), ("$total", SqliteType.Integer)))
            {
                mark.Set("$day", dayText).Set("$total", seen.Total).Execute();
            }

            long auditId;
            using (var audit = new AuditWriter(_connection, transaction))
            {
                var write = earlier.Count + 1;
                object detail = isRewrite
                    ? new
                    {
                        day = dayText, files, flags = flagCount, write, reason,
                        replaces = new { write = earlier.Count, writtenAt = DbText.Time(earlier[^1].WrittenAt) },
                        kept = request.Kept,
                    }
                    : new { day = dayText, files, flags = flagCount, write };
                auditId = audit.Append(now, by, isRewrite ? "digest.rewritten" : "digest.written", "digest:" + dayText, StoreJson.Detail(detail));
            }

            transaction.Commit();
            return DigestRecordResult.Done(
                new DigestWrite(id, day, DbText.ParseTime(DbText.Time(now)), files.ToList(), flagCount, isRewrite, by, seen, reason) { Issue = earlier.Count + 1 },
                auditId);
        }
    }

    /// <summary>The day's change counts as they stand (all zero for a day nothing was stored for).</summary>
    public DayChanges DayChangesOf(DateOnly day)
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            return ReadDayChanges(null, day);
        }
    }

    /// <summary>
    /// The days whose latest digest no longer shows what the store holds (a batch, revision or review decision of the
    /// day came after it), oldest first. One query on an index that holds only such days: cheap enough for every pass.
    /// </summary>
    public IReadOnlyList<DateOnly> StaleDigestDays()
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            using var query = new PreparedCommand(
                _connection, null,
                "SELECT day FROM day_change WHERE digested IS NOT NULL AND batches + revisions + withdrawn + reviews > digested ORDER BY day");
            using var reader = query.Read();
            var days = new List<DateOnly>();
            while (reader.Read())
            {
                days.Add(DbText.ParseDay(reader.GetString(0)));
            }

            return days;
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

    private List<DigestWrite> ReadDigestWrites(DbTransaction? transaction, DateOnly day)
    {
        using var query = new PreparedCommand(
            _connection, transaction, $"SELECT {DigestColumns} FROM digest WHERE day = $day ORDER BY id", ("$day", SqliteType.Text));
        using var reader = query.Set("$day", DbText.Day(day)).Read();
        var writes = new List<DigestWrite>();
        while (reader.Read())
        {
            var seen = reader.IsDBNull(7)
                ? null
                : new DayChanges(reader.GetInt32(7), reader.GetInt32(8), reader.GetInt32(9), reader.GetInt32(10));
            writes.Add(new DigestWrite(
                reader.GetInt64(0),
                DbText.ParseDay(reader.GetString(1)),
                DbText.ParseTime(reader.GetString(2)),
                JsonSerializer.Deserialize<List<string>>(reader.GetString(3)) ?? [],
                reader.GetInt32(4),
                reader.GetInt64(5) == 1,
                reader.GetString(6),
                seen,
                reader.NullableString(11)) { Issue = writes.Count + 1 });
        }

        return writes;
    }

    private DayChanges ReadDayChanges(DbTransaction? transaction, DateOnly day)
    {
        using var query = new PreparedCommand(
            _connection, transaction, $"SELECT {DayChangeColumns} FROM day_change WHERE day = $day", ("$day", SqliteType.Text));
        using var reader = query.Set("$day", DbText.Day(day)).Read();
        return reader.Read()
            ? new DayChanges(reader.GetInt32(0), reader.GetInt32(1), reader.GetInt32(2), reader.GetInt32(3))
            : DayChanges.None;
    }
}
