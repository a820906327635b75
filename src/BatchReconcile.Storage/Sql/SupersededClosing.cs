using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Storage.Audit;
using BatchReconcile.Storage.Review;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Sql;

/// <summary>The system's closing of a flag whose revision was superseded: the flag row and its audit entry.</summary>
internal static class SupersededClosing
{
    public const string Sql = """
        UPDATE flag SET state = 'closed', outcome = 'superseded', review_note = $note, deviation_ref = NULL,
                        reviewed_by = $by, reviewed_at = $at
        WHERE id = $id AND state <> 'closed'
        """;

    public static readonly (string, SqliteType)[] Parameters =
        [("$note", SqliteType.Text), ("$by", SqliteType.Text), ("$at", SqliteType.Text), ("$id", SqliteType.Integer)];

    public static void Close(PreparedCommand close, AuditWriter audit, DateTimeOffset now, long flagId, string fromState, string note, object detail)
    {
        close.Set("$note", note).Set("$by", AuditWriter.SystemActor).Set("$at", DbText.Time(now)).Set("$id", flagId).Execute();
        audit.Append(
            now, AuditWriter.SystemActor, "flag.review", "flag:" + flagId.ToString(System.Globalization.CultureInfo.InvariantCulture),
            StoreJson.Detail(detail), fromState, ReviewState.Closed.ToText(), note);
    }
}
