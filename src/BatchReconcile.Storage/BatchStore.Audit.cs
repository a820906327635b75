using System.Globalization;
using BatchReconcile.Storage.Audit;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage;

public sealed partial class BatchStore
{
    /// <summary>
    /// Walks the audit chain in id order (<c>audit verify</c>) and stops at the first entry that
    /// does not verify: a gap in the ids, a previous-hash that is not the hash of the entry before,
    /// or content that no longer gives the entry's hash. Entries missing at the end are found from
    /// SQLite's id sequence. Then replays the trail (<see cref="TrailReplay"/>) and compares what it
    /// implies with the live tables: every flag's review state, outcome, deviation reference, reviewer,
    /// review time and note, every batch's current revision, and which flags and step results are marked
    /// current. Reads one snapshot; the service may go on writing meanwhile.
    /// </summary>
    public AuditVerification VerifyAudit()
    {
        lock (_gate)
        {
            ThrowIfDisposed();
            using var transaction = BeginRead();
            var previousHash = AuditCanonicalForm.GenesisHash;
            long previousId = 0;
            long count = 0;
            var replay = new TrailReplay();
            using (var walk = new PreparedCommand(_connection, transaction, $"SELECT {AuditWriter.Columns} FROM audit_event ORDER BY id"))
            using (var reader = walk.Read())
            {
                while (reader.Read())
                {
                    var entry = AuditWriter.Read(reader);
                    var problem = Check(entry, previousId, previousHash);
                    if (problem is { } p)
                    {
                        return new AuditVerification(false, count, entry.Id, p.Problem, previousHash, p.Message);
                    }

                    replay.Add(entry);
                    previousId = entry.Id;
                    previousHash = entry.Hash;
                    count++;
                }
            }

            using (var sequence = new PreparedCommand(_connection, transaction, AuditWriter.HighWaterSql(_connection)))
            {
                var last = sequence.Scalar() is { } seq ? Convert.ToInt64(seq, CultureInfo.InvariantCulture) : 0;
                if (last > previousId)
                {
                    var missing = previousId + 1;
                    return new AuditVerification(false, count, missing, AuditProblem.MissingAtEnd, previousHash,
                        $"audit entry {N(missing)} does not verify: it is missing; the trail ends at entry {N(previousId)} " +
                        $"but ids were given up to {N(last)} (entries were deleted from the end)");
                }
            }

            var differences = LiveStateCheck.Compare(_connection, transaction, replay);
            transaction.Commit();
            if (differences.Count > 0)
            {
                var more = differences.Count == 1 ? string.Empty : $" (and {N(differences.Count - 1)} more difference{(differences.Count == 2 ? string.Empty : "s")})";
                return new AuditVerification(false, count, differences[0].EntryId, AuditProblem.LiveStateDiffers, previousHash,
                    $"the chain of {N(count)} entries is intact, but the live tables do not match it: {differences[0].Message}{more}")
                {
                    Differences = differences,
                };
            }

            return new AuditVerification(true, count, null, null, previousHash,
                count == 0 ? "the audit trail is empty" : $"the audit trail is intact: {N(count)} entries verified, the last hash is {previousHash}");
        }
    }

    /// <summary>The audit entries about one subject (e.g. <c>flag:17</c>), oldest first.</summary>
    public IReadOnlyList<AuditEntry> AuditTrailOf(string subject)
    {
        ArgumentNullException.ThrowIfNull(subject);
        lock (_gate)
        {
            ThrowIfDisposed();
            return ReadAuditTrailOf(subject);
        }
    }

    private static (AuditProblem Problem, string Message)? Check(AuditEntry entry, long previousId, string previousHash)
    {
        var id = N(entry.Id);
        if (entry.Id != previousId + 1)
        {
            var what = previousId == 0
                ? $"the trail starts at entry {id}, so entries 1 to {N(entry.Id - 1)} are missing"
                : entry.Id - previousId == 2
                    ? $"it follows entry {N(previousId)}, so entry {N(previousId + 1)} is missing"
                    : $"it follows entry {N(previousId)}, so entries {N(previousId + 1)} to {N(entry.Id - 1)} are missing";
            return (AuditProblem.GapInIds, $"audit entry {id} does not verify: gap in ids: {what}");
        }

        if (!string.Equals(entry.PreviousHash, previousHash, StringComparison.Ordinal))
        {
            var before = previousId == 0 ? "the start of the chain (64 zeros)" : $"entry {N(previousId)}'s hash {previousHash}";
            return (AuditProblem.PreviousHashLinkBroken,
                $"audit entry {id} does not verify: previous-hash link broken: it holds {Short(entry.PreviousHash)} where {before} was expected");
        }

        var computed = AuditCanonicalForm.Hash(entry);
        if (!string.Equals(entry.Hash, computed, StringComparison.Ordinal))
        {
            return (AuditProblem.ContentHashMismatch,
                $"audit entry {id} does not verify: content hash mismatch: its content gives {computed} but it holds {Short(entry.Hash)}; " +
                "the entry was changed after it was written");
        }

        return null;
    }

    private static string Short(string hash) => hash.Length == 0 ? "no hash" : hash;

    private static string N(long value) => value.ToString(CultureInfo.InvariantCulture);
}
