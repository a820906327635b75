using System.Data.Common;
using BatchReconcile.Reconciliation.Flags;
using System.Security.Cryptography;
using System.Text;
using BatchReconcile.Storage.Audit;
using BatchReconcile.Storage.Review;
using BatchReconcile.Storage.Tests.Support;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage.Tests.Audit;

public sealed class AuditChainTests
{
    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Ingest_revisions_reviews_and_digests_form_one_chain_that_verifies(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = Filled(db);

        var verification = store.VerifyAudit();

        Assert.True(verification.Intact, verification.Message);
        var rows = Db.Count(store.Connection, "audit_event");
        Assert.Equal(rows, verification.EntriesChecked);
        Assert.Equal($"the audit trail is intact: {rows} entries verified, the last hash is {verification.LastHash}", verification.Message);
        Assert.Equal(
            ["batch.revision", "digest.rewritten", "digest.written", "flag.review", "ingest.duplicate", "ingest.quarantined", "ingest.revision", "ingest.stored"],
            Kinds(store));

        // Read back independently of the verifier: each entry links to the one before and hashes its canonical text.
        var previous = new string('0', 64);
        using var command = store.Connection.CreateCommand();
        command.CommandText = "SELECT id, at, actor, kind, subject, from_state, to_state, note, deviation_ref, detail, prev_hash, hash FROM audit_event ORDER BY id";
        using var reader = command.ExecuteReader();
        var expectedId = 1L;
        while (reader.Read())
        {
            var entry = new AuditEntry(reader.GetInt64(0), reader.GetString(1), reader.GetString(2), reader.GetString(3), reader.GetString(4),
                reader.IsDBNull(5) ? null : reader.GetString(5), reader.IsDBNull(6) ? null : reader.GetString(6),
                reader.IsDBNull(7) ? null : reader.GetString(7), reader.IsDBNull(8) ? null : reader.GetString(8),
                reader.GetString(9), reader.GetString(10), reader.GetString(11));
            Assert.Equal(expectedId++, entry.Id);
            Assert.Equal(previous, entry.PreviousHash);
            Assert.Equal(Sha256Hex(AuditCanonicalForm.Text(entry)), entry.Hash);
            Assert.EndsWith("Z", entry.At, StringComparison.Ordinal);
            previous = entry.Hash;
        }

        Assert.Equal(previous, verification.LastHash);
    }

    /// <summary>
    /// The canonical text follows RFC 8785 (JSON Canonicalization Scheme, IETF 2020): members sorted
    /// by code unit, only quote, backslash and control characters escaped, short escapes for
    /// \b \t \n \f \r and \u00xx (lower-case hex) for the other control characters, non-ASCII as is.
    /// </summary>
    [Fact]
    public void The_canonical_text_is_rfc_8785_json_with_members_in_code_unit_order()
    {
        var entry = new AuditEntry(
            42, "2026-11-25T09:12:00.0000000Z", "Zoë \"QA\" Brandt", "flag.review", "flag:17", "open", "closed",
            "line 1\nline 2\ttab \\ back \u0001 \u001f", null, "{\"outcome\":\"explained\"}", new string('0', 64), "ignored");

        var text = AuditCanonicalForm.Text(entry);

        Assert.Equal(
            "{\"actor\":\"Zoë \\\"QA\\\" Brandt\",\"at\":\"2026-11-25T09:12:00.0000000Z\",\"detail\":\"{\\\"outcome\\\":\\\"explained\\\"}\"," +
            "\"deviationRef\":null,\"from\":\"open\",\"id\":42,\"kind\":\"flag.review\",\"note\":\"line 1\\nline 2\\ttab \\\\ back \\u0001 \\u001f\"," +
            $"\"prev\":\"{new string('0', 64)}\",\"subject\":\"flag:17\",\"to\":\"closed\"}}",
            text);
        Assert.Equal(AuditCanonicalForm.MemberOrder.Order(StringComparer.Ordinal), AuditCanonicalForm.MemberOrder);
        Assert.Equal(Sha256Hex(text), AuditCanonicalForm.Hash(entry));
        Assert.Equal(AuditCanonicalForm.Hash(entry), AuditCanonicalForm.Hash(entry with { Hash = "other" }));
        Assert.NotEqual(AuditCanonicalForm.Hash(entry), AuditCanonicalForm.Hash(entry with { Id = 43 }));
        Assert.NotEqual(AuditCanonicalForm.Hash(entry), AuditCanonicalForm.Hash(entry with { DeviationRef = "" }));
    }

    /// <summary>Someone with the file and the sqlite3 shell drops the trigger and changes or deletes rows; the chain still names the entry.</summary>
    [Theory]
    [InlineData("DROP TRIGGER audit_event_no_update; UPDATE audit_event SET note = 'x' WHERE id = 3;", 3, AuditProblem.ContentHashMismatch)]
    [InlineData("DROP TRIGGER audit_event_no_update; UPDATE audit_event SET detail = replace(detail, 'a.csv', 'z.csv') WHERE id = 3;", 3, AuditProblem.ContentHashMismatch)]
    [InlineData("DROP TRIGGER audit_event_no_update; UPDATE audit_event SET at = '2026-11-20T08:00:05.0000000Z' WHERE id = 5;", 5, AuditProblem.ContentHashMismatch)]
    [InlineData("DROP TRIGGER audit_event_no_update; UPDATE audit_event SET actor = 'someone else' WHERE kind = 'flag.review' AND actor <> 'system';", 0, AuditProblem.ContentHashMismatch)]
    [InlineData("DROP TRIGGER audit_event_no_delete; DELETE FROM audit_event WHERE id = 3;", 4, AuditProblem.GapInIds)]
    [InlineData("DROP TRIGGER audit_event_no_delete; DELETE FROM audit_event WHERE id = 1;", 2, AuditProblem.GapInIds)]
    [InlineData("DROP TRIGGER audit_event_no_delete; DELETE FROM audit_event WHERE id = (SELECT max(id) FROM audit_event);", -1, AuditProblem.MissingAtEnd)]
    public void Verify_names_the_first_entry_changed_or_deleted_with_the_sqlite3_shell(string tamper, long expectedId, AuditProblem problem)
    {
        using var db = new TempDatabase();
        long last, firstReview;
        using (var store = Filled(db))
        {
            Assert.True(store.VerifyAudit().Intact);
            last = long.Parse(Db.Scalar(store.Connection, "SELECT max(id) FROM audit_event")!, System.Globalization.CultureInfo.InvariantCulture);
            firstReview = long.Parse(Db.Scalar(store.Connection, "SELECT min(id) FROM audit_event WHERE kind = 'flag.review' AND actor <> 'system'")!, System.Globalization.CultureInfo.InvariantCulture);
        }

        Sqlite3Shell.Run(db.DatabasePath, "PRAGMA busy_timeout = 5000; " + tamper);

        using var reopened = db.Open();
        var verification = reopened.VerifyAudit();
        var expected = expectedId switch { -1 => last, 0 => firstReview, _ => expectedId };
        Assert.False(verification.Intact);
        Assert.Equal((expected, problem), (verification.FirstBadId, verification.Problem));
        Assert.StartsWith($"audit entry {expected} does not verify: ", verification.Message, StringComparison.Ordinal);
        Assert.Equal(Db.Count(reopened.Connection, "audit_event", $"id < {expected}"), verification.EntriesChecked);
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Rehashing_a_changed_entry_breaks_the_link_of_the_next_one(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        AuditEntry third;
        using (var store = Filled(db))
        {
            third = store.AuditTrailOf("file:" + Build.Sha("a.csv")).Single(e => e.Id == 3);
        }

        // The attacker recomputes entry 3's own hash after the change, so entry 3 verifies; entry 4 still points to the old hash.
        var forged = AuditCanonicalForm.Hash(third with { Note = "x" });
        Db.Tamper(db, $"DROP TRIGGER audit_event_no_update; UPDATE audit_event SET note = 'x', hash = '{forged}' WHERE id = 3;");

        using var reopened = db.Open();
        var verification = reopened.VerifyAudit();
        Assert.Equal((4L, AuditProblem.PreviousHashLinkBroken), (verification.FirstBadId, verification.Problem));
        Assert.Contains($"it holds {third.Hash} where entry 3's hash {forged} was expected", verification.Message, StringComparison.Ordinal);
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void The_database_refuses_updates_deletes_and_unlinked_entries(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = Filled(db);

        foreach (var sql in new[] { "UPDATE audit_event SET note = 'x' WHERE id = 2", "DELETE FROM audit_event WHERE id = 2" })
        {
            var refused = Assert.ThrowsAny<DbException>(() => Db.Execute(store.Connection, sql));
            Assert.Contains("append-only", refused.Message, StringComparison.Ordinal);
        }

        var unlinked = Assert.ThrowsAny<DbException>(() => Db.Execute(store.Connection, $"""
            INSERT INTO audit_event (at, actor, kind, subject, detail, prev_hash, hash)
            VALUES ('2026-11-24T09:00:00.0000000Z', 'x', 'flag.review', 'flag:1', '{"{}"}', '{new string('0', 64)}', '{new string('1', 64)}')
            """));
        Assert.Contains("hash of the entry before", unlinked.Message, StringComparison.Ordinal);
        Assert.True(store.VerifyAudit().Intact);
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void An_empty_trail_verifies(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();

        var verification = store.VerifyAudit();

        Assert.Equal((true, 0L, "the audit trail is empty"), (verification.Intact, verification.EntriesChecked, verification.Message));
    }

    /// <summary>Every kind of event: stored, quarantined, duplicate, a revision (with the system closing a flag), reviews, a digest and its rewrite.</summary>
    internal static BatchStore Filled(TempDatabase db)
    {
        var store = db.Open();
        store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1")), Build.Ingest(Build.Batch("BZ-002"), Build.Day1, Build.Flag("S2")))]);
        store.Commit([Build.Quarantined("bad.csv", 2)]);
        store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1))]);
        var bz2Flag = store.ListFlags().Single(f => f.BatchId == "BZ-002").Id;
        Assert.True(store.ReviewFlag(bz2Flag, ReviewState.InReview, "A. Chen", "asked for the mother liquor assay").Accepted);
        Assert.True(store.ReviewFlag(bz2Flag, ReviewState.Closed, "A. Chen", "assay confirms loss; deviation raised", CloseOutcome.Deviation, "DEV-2026-041").Accepted);
        store.Commit([Build.File("b.csv", Build.Ingest(Build.Batch("BZ-001", productKg: 97.0), Build.Day1))]);
        Assert.True(store.RecordDigest(Build.Day1, ["digests/2026-11-23.html"], 2, rewrite: false, "system").Recorded);
        Assert.True(store.RecordDigest(Build.Day1, ["digests/2026-11-23.html"], 1, rewrite: true, "A. Chen").Recorded);
        return store;
    }

    private static List<string> Kinds(BatchStore store)
    {
        using var command = store.Connection.CreateCommand();
        command.CommandText = "SELECT DISTINCT kind FROM audit_event ORDER BY kind";
        using var reader = command.ExecuteReader();
        var kinds = new List<string>();
        while (reader.Read())
        {
            kinds.Add(reader.GetString(0));
        }

        return kinds;
    }

    private static string Sha256Hex(string text) => Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text)));
}
