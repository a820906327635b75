using System.Globalization;
using BatchReconcile.Storage.Audit;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Schema;

/// <summary>
/// The code part of migration 4: links the audit entries written before it into the hash chain,
/// in id order, and closes the still-open flags of revisions that were already superseded, as
/// the commit does from this version on.
/// </summary>
internal static class ReviewTrailBackfill
{
    private const int Chunk = 1000;

    public static void Run(MigrationContext context)
    {
        ChainExistingEntries(context.Connection, context.Transaction);
        CloseSupersededFlags(context);
    }

    private static void ChainExistingEntries(SqliteConnection connection, SqliteTransaction transaction)
    {
        using var read = new PreparedCommand(
            connection, transaction, $"SELECT {AuditWriter.Columns} FROM audit_event WHERE id > $after ORDER BY id LIMIT {Chunk}", ("$after", SqliteType.Integer));
        using var update = new PreparedCommand(
            connection, transaction, "UPDATE audit_event SET prev_hash = $prev, hash = $hash WHERE id = $id",
            ("$prev", SqliteType.Text), ("$hash", SqliteType.Text), ("$id", SqliteType.Integer));

        var previous = AuditCanonicalForm.GenesisHash;
        long after = 0;
        while (true)
        {
            // Read a chunk, then update it: rows are not changed under an open reader.
            var entries = new List<AuditEntry>(Chunk);
            using (var reader = read.Set("$after", after).Read())
            {
                while (reader.Read())
                {
                    entries.Add(AuditWriter.Read(reader));
                }
            }

            if (entries.Count == 0)
            {
                return;
            }

            foreach (var entry in entries)
            {
                var linked = entry with { PreviousHash = previous, Hash = string.Empty };
                var hash = AuditCanonicalForm.Hash(linked);
                update.Set("$prev", previous).Set("$hash", hash).Set("$id", entry.Id).Execute();
                previous = hash;
                after = entry.Id;
            }
        }
    }

    private static void CloseSupersededFlags(MigrationContext context)
    {
        var open = new List<(long Id, string State, string Batch, int Revision, int? By, string Step, string Code)>();
        using (var find = new PreparedCommand(context.Connection, context.Transaction, """
            SELECT f.id, f.state, b.batch_id, r.revision, n.revision, f.step, f.code
            FROM flag f
            JOIN batch_revision r ON r.id = f.revision_ref
            JOIN batch b ON b.id = r.batch_ref
            LEFT JOIN batch_revision n ON n.id = r.superseded_by
            WHERE r.superseded_at IS NOT NULL AND f.state <> 'closed'
            ORDER BY f.id
            """))
        using (var reader = find.Read())
        {
            while (reader.Read())
            {
                open.Add((reader.GetInt64(0), reader.GetString(1), reader.GetString(2), reader.GetInt32(3),
                    reader.IsDBNull(4) ? null : reader.GetInt32(4), reader.GetString(5), reader.GetString(6)));
            }
        }

        if (open.Count == 0)
        {
            return;
        }

        using var audit = new AuditWriter(context.Connection, context.Transaction);
        using var close = new PreparedCommand(context.Connection, context.Transaction, SupersededClosing.Sql, SupersededClosing.Parameters);
        foreach (var flag in open)
        {
            var by = flag.By is { } n ? "revision " + n.ToString(CultureInfo.InvariantCulture) : "a later revision";
            var note = $"superseded by {by} (closed when the review trail was added to the database)";
            SupersededClosing.Close(close, audit, context.Now, flag.Id, flag.State, note, new
            {
                batch = flag.Batch,
                revision = flag.Revision,
                supersededByRevision = flag.By,
                step = flag.Step,
                code = flag.Code,
                outcome = "superseded",
            });
        }
    }
}
