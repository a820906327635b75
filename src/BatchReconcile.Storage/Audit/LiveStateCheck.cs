using System.Data.Common;
using System.Globalization;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Audit;

/// <summary>Compares the live flag and revision tables with what a replayed trail implies (part of <c>audit verify</c>).</summary>
internal static class LiveStateCheck
{
    private const string FlagsSql = """
        SELECT f.id, f.state, f.outcome, f.deviation_ref, f.reviewed_by, f.reviewed_at, f.review_note,
               f.is_current, r.superseded_at IS NULL
        FROM flag f JOIN batch_revision r ON r.id = f.revision_ref
        ORDER BY f.id
        """;

    private const string BatchesSql = """
        SELECT b.batch_id, r.revision, l.sha256
        FROM batch b
        LEFT JOIN batch_revision r ON r.batch_ref = b.id AND r.superseded_at IS NULL
        LEFT JOIN ingest_log l ON l.id = r.ingest_ref
        ORDER BY b.id
        """;

    private const string StepsSql = """
        SELECT b.batch_id, r.revision, s.step, s.is_current
        FROM step_result s JOIN batch_revision r ON r.id = s.revision_ref JOIN batch b ON b.id = r.batch_ref
        WHERE s.is_current <> CASE WHEN r.superseded_at IS NULL THEN 1 ELSE 0 END
        ORDER BY r.id, s.step_order
        """;

    public static List<LiveStateDifference> Compare(DbConnection connection, DbTransaction transaction, TrailReplay replay)
    {
        var differences = new List<LiveStateDifference>();
        CompareFlags(connection, transaction, replay, differences);
        CompareBatches(connection, transaction, replay, differences);
        CompareSteps(connection, transaction, differences);
        return differences;
    }

    private static void CompareFlags(DbConnection connection, DbTransaction transaction, TrailReplay replay, List<LiveStateDifference> differences)
    {
        var seen = new HashSet<long>();
        using (var query = new PreparedCommand(connection, transaction, FlagsSql))
        using (var reader = query.Read())
        {
            while (reader.Read())
            {
                var id = reader.GetInt64(0);
                seen.Add(id);
                var subject = "flag:" + N(id);
                replay.Flags.TryGetValue(id, out var review);
                void Check(string field, string? live, string? trail)
                {
                    if (!string.Equals(live, trail, StringComparison.Ordinal))
                    {
                        differences.Add(new LiveStateDifference(subject, field, live, trail, review?.EntryId));
                    }
                }

                // A flag no entry reviewed is still as the commit stored it: open, nothing decided.
                Check("state", reader.GetString(1), review?.State ?? "open");
                Check("outcome", reader.NullableString(2), review?.Outcome);
                Check("deviation reference", reader.NullableString(3), review?.DeviationRef);
                Check("reviewer", reader.NullableString(4), review?.Actor);
                Check("review time", reader.NullableString(5), review?.At);
                Check("review note", reader.NullableString(6), review?.Note);

                var liveCurrent = reader.GetInt64(7) == 1;
                var revisionCurrent = reader.GetInt64(8) == 1;
                if (liveCurrent != revisionCurrent)
                {
                    differences.Add(new LiveStateDifference(subject, "current (shown in lists and digests)", YesNo(liveCurrent), YesNo(revisionCurrent), null));
                }
            }
        }

        foreach (var (id, review) in replay.Flags.Where(f => !seen.Contains(f.Key)).OrderBy(f => f.Key))
        {
            differences.Add(new LiveStateDifference("flag:" + N(id), "existence", null, review.State, review.EntryId));
        }
    }

    private static void CompareBatches(DbConnection connection, DbTransaction transaction, TrailReplay replay, List<LiveStateDifference> differences)
    {
        var seen = new HashSet<string>(StringComparer.Ordinal);
        using (var query = new PreparedCommand(connection, transaction, BatchesSql))
        using (var reader = query.Read())
        {
            while (reader.Read())
            {
                var batch = reader.GetString(0);
                seen.Add(batch);
                int? live = reader.IsDBNull(1) ? null : reader.GetInt32(1);
                var file = reader.NullableString(2);
                if (replay.Batches.TryGetValue(batch, out var trail))
                {
                    if (live != trail.Revision)
                    {
                        differences.Add(new LiveStateDifference("batch:" + batch, "current revision", Revision(live), Revision(trail.Revision), trail.EntryId));
                    }
                }
                else if (file is null || replay.FilesListingAllBatches.Contains(file))
                {
                    // The file's ingest entry lists its batches, and not this one (or the batch has no current revision
                    // and the trail never named it): it was not stored by the program.
                    differences.Add(new LiveStateDifference("batch:" + batch, "current revision", Revision(live), null, null));
                }
            }
        }

        foreach (var (batch, trail) in replay.Batches.Where(b => !seen.Contains(b.Key)).OrderBy(b => b.Value.EntryId))
        {
            differences.Add(new LiveStateDifference("batch:" + batch, "current revision", null, Revision(trail.Revision), trail.EntryId));
        }
    }

    private static void CompareSteps(DbConnection connection, DbTransaction transaction, List<LiveStateDifference> differences)
    {
        using var query = new PreparedCommand(connection, transaction, StepsSql);
        using var reader = query.Read();
        while (reader.Read())
        {
            var live = reader.GetInt64(3) == 1;
            differences.Add(new LiveStateDifference(
                $"batch:{reader.GetString(0)}", $"step {reader.GetString(2)} of revision {N(reader.GetInt32(1))} marked current", YesNo(live), YesNo(!live), null));
        }
    }

    private static string? Revision(int? revision) => revision is { } r ? "revision " + N(r) : null;

    private static string YesNo(bool value) => value ? "yes" : "no";

    private static string N(long value) => value.ToString(CultureInfo.InvariantCulture);
}
