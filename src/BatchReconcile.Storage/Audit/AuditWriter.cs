using System.Data.Common;
using System.Globalization;
using System.Text;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Audit;

/// <summary>
/// Appends entries to the audit chain inside the caller's transaction. Every entry is linked to
/// the last one stored at that moment and hashed before it is inserted. The end of the chain is read
/// from the table for the first entry and then kept; whoever rolls back to a savepoint calls
/// <see cref="Forget"/>, so no stale link survives it.
/// </summary>
internal sealed class AuditWriter : IDisposable
{
    /// <summary>The actor of the program's own entries.</summary>
    public const string SystemActor = "system";

    public const string Columns = "id, at, actor, kind, subject, from_state, to_state, note, deviation_ref, detail, prev_hash, hash";

    private readonly PreparedCommand _last;
    private readonly PreparedCommand _sequence;
    private readonly PreparedCommand _insert;
    private (long Id, string Hash)? _appended;

    public AuditWriter(DbConnection connection, DbTransaction transaction)
    {
        const SqliteType T = SqliteType.Text, I = SqliteType.Integer;
        _last = new PreparedCommand(connection, transaction, "SELECT id, hash FROM audit_event ORDER BY id DESC LIMIT 1");
        _sequence = new PreparedCommand(connection, transaction, HighWaterSql(connection));
        _insert = new PreparedCommand(
            connection,
            transaction,
            $"INSERT INTO audit_event ({Columns}) VALUES ($id, $at, $actor, $kind, $subject, $from, $to, $note, $deviation, $detail, $prev, $hash)",
            ("$id", I), ("$at", T), ("$actor", T), ("$kind", T), ("$subject", T), ("$from", T), ("$to", T), ("$note", T),
            ("$deviation", T), ("$detail", T), ("$prev", T), ("$hash", T));
    }

    /// <summary>The highest audit id ever given: SQLite's AUTOINCREMENT sequence, or PostgreSQL's <c>audit_high_water</c>.</summary>
    public static string HighWaterSql(DbConnection connection) => connection is Microsoft.Data.Sqlite.SqliteConnection
        ? "SELECT seq FROM sqlite_sequence WHERE name = 'audit_event'"
        : "SELECT seq FROM audit_high_water";

    /// <returns>The new entry's id.</returns>
    public long Append(
        DateTimeOffset at, string actor, string kind, string subject, string detailJson,
        string? fromState = null, string? toState = null, string? note = null, string? deviationRef = null)
    {
        long id;
        string previous;
        if (_appended is { } mine)
        {
            // This writer's own last entry: inside the transaction no one else can append, and a rollback
            // to a savepoint makes the caller call Forget.
            (id, previous) = (mine.Id + 1, mine.Hash);
        }
        else
        {
            var (found, lastId, lastHash) = _last.ReadFirst(static row => (true, row.GetInt64(0), row.NullableString(1) ?? string.Empty));
            previous = found ? lastHash : AuditCanonicalForm.GenesisHash;

            // The sequence, not the last id: entries cut off the end leave a gap the verifier reports
            // instead of being silently reused.
            id = Math.Max(lastId, _sequence.Scalar() is { } seq ? Convert.ToInt64(seq, CultureInfo.InvariantCulture) : 0) + 1;
        }

        var entry = new AuditEntry(
            id, DbText.Time(at), AsStored(actor), AsStored(kind), AsStored(subject),
            AsStoredOrNull(fromState), AsStoredOrNull(toState), AsStoredOrNull(note), AsStoredOrNull(deviationRef),
            AsStored(detailJson), previous, string.Empty);
        var hash = AuditCanonicalForm.Hash(entry);
        _insert
            .Set("$id", entry.Id).Set("$at", entry.At).Set("$actor", entry.Actor).Set("$kind", entry.Kind).Set("$subject", entry.Subject)
            .Set("$from", entry.FromState).Set("$to", entry.ToState).Set("$note", entry.Note).Set("$deviation", entry.DeviationRef)
            .Set("$detail", entry.Detail).Set("$prev", entry.PreviousHash).Set("$hash", hash)
            .Execute();
        _appended = (id, hash);
        return id;
    }

    /// <summary>Reads the end of the chain from the table again at the next entry (after a rollback to a savepoint).</summary>
    public void Forget() => _appended = null;

    public void Dispose()
    {
        _last.Dispose();
        _sequence.Dispose();
        _insert.Dispose();
    }

    /// <summary>Reads an entry from a reader positioned on a row selected with <see cref="Columns"/>.</summary>
    public static AuditEntry Read(DbDataReader reader) => new(
        reader.GetInt64(0),
        reader.GetString(1),
        reader.GetString(2),
        reader.GetString(3),
        reader.GetString(4),
        reader.NullableString(5),
        reader.NullableString(6),
        reader.NullableString(7),
        reader.NullableString(8),
        reader.GetString(9),
        reader.NullableString(10) ?? string.Empty,
        reader.NullableString(11) ?? string.Empty);

    // The hash must cover the text exactly as it will be read back. SQLite holds UTF-8, so a lone
    // surrogate would come back as U+FFFD and never verify; the round trip makes that replacement first.
    private static string AsStored(string value) => Encoding.UTF8.GetString(Encoding.UTF8.GetBytes(value));

    private static string? AsStoredOrNull(string? value) => value is null ? null : AsStored(value);
}
