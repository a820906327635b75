using BatchReconcile.Storage.Audit;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Audit;

/// <summary>
/// audit verify replays the trail and compares it with the live tables: someone with the sqlite3 shell who
/// drops the validation triggers and edits a flag's review or a batch's current revision leaves the chain
/// intact, and the comparison names the flag or batch and both values.
/// </summary>
/// <remarks>
/// The store of <see cref="AuditChainTests.Filled"/>: BZ-001 revision 1 (flag on S1, closed as superseded by
/// the system) and revision 2 (current, no flags); BZ-002 revision 1 with a flag on S2 closed by A. Chen as
/// deviation DEV-2026-041. {flag} stands for that flag's id.
/// </remarks>
public sealed class LiveStateReplayTests
{
    private const string DropFlagTriggers = "DROP TRIGGER flag_review_valid_update; DROP TRIGGER flag_review_valid_insert; ";

    [Theory]
    [InlineData("UPDATE flag SET outcome = 'explained', deviation_ref = NULL WHERE id = {flag};", "flag:{flag}", "outcome", "explained", "deviation")]
    [InlineData("UPDATE flag SET outcome = 'explained', deviation_ref = NULL WHERE id = {flag};", "flag:{flag}", "deviation reference", null, "DEV-2026-041")]
    [InlineData("UPDATE flag SET deviation_ref = 'DEV-2026-099' WHERE id = {flag};", "flag:{flag}", "deviation reference", "DEV-2026-099", "DEV-2026-041")]
    [InlineData("UPDATE flag SET reviewed_by = 'B. Osei' WHERE id = {flag};", "flag:{flag}", "reviewer", "B. Osei", "A. Chen")]
    [InlineData("UPDATE flag SET review_note = 'fine' WHERE id = {flag};", "flag:{flag}", "review note", "fine", "assay confirms loss; deviation raised")]
    [InlineData("UPDATE flag SET state = 'open', outcome = NULL, deviation_ref = NULL WHERE id = {flag};", "flag:{flag}", "state", "open", "closed")]
    [InlineData("UPDATE flag SET is_current = 0 WHERE id = {flag};", "flag:{flag}", "current (shown in lists and digests)", "no", "yes")]
    [InlineData("DELETE FROM flag WHERE id = {flag};", "flag:{flag}", "existence", null, "closed")]
    public void A_flag_edited_in_the_live_table_is_named_with_both_values(string tamper, string subject, string field, string? live, string? trail)
    {
        using var db = new TempDatabase();
        string flag;
        using (var store = AuditChainTests.Filled(db))
        {
            Assert.True(store.VerifyAudit().Intact, store.VerifyAudit().Message);
            flag = store.ListFlags().Single(f => f.BatchId == "BZ-002").Id.ToString(System.Globalization.CultureInfo.InvariantCulture);
        }

        Db.Tamper(db, DropFlagTriggers + tamper.Replace("{flag}", flag, StringComparison.Ordinal));

        using var reopened = db.Open();
        var verification = reopened.VerifyAudit();
        Assert.False(verification.Intact);
        Assert.Equal(AuditProblem.LiveStateDiffers, verification.Problem);
        var expected = new LiveStateDifference(subject.Replace("{flag}", flag, StringComparison.Ordinal), field, live, trail, null);
        var found = Assert.Single(verification.Differences, d => d.Subject == expected.Subject && d.Field == field);
        Assert.Equal((expected.Live, expected.Trail), (found.Live, found.Trail));
        Assert.Contains($"flag {flag}: ", verification.Message, StringComparison.Ordinal);
        // The entry that implies the value is named: the last review of the flag.
        if (field != "current (shown in lists and digests)")
        {
            var lastReview = long.Parse(Db.Scalar(reopened.Connection, $"SELECT max(id) FROM audit_event WHERE subject = 'flag:{flag}'")!, System.Globalization.CultureInfo.InvariantCulture);
            Assert.Equal(lastReview, found.EntryId);
        }
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_superseded_revision_made_current_again_is_named_with_both_revisions(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using (var store = AuditChainTests.Filled(db))
        {
            Assert.True(store.VerifyAudit().Intact);
        }

        // Roll BZ-001 back to revision 1 (the unique index allows one current revision, so revision 2 goes first).
        Db.Tamper(db, """
            UPDATE batch_revision SET superseded_at = '2026-11-24T08:00:05.0000000Z'
             WHERE revision = 2 AND batch_ref = (SELECT id FROM batch WHERE batch_id = 'BZ-001');
            UPDATE batch_revision SET superseded_at = NULL, superseded_by = NULL
             WHERE revision = 1 AND batch_ref = (SELECT id FROM batch WHERE batch_id = 'BZ-001');
            """);

        using var reopened = db.Open();
        var verification = reopened.VerifyAudit();
        Assert.False(verification.Intact);
        var batch = Assert.Single(verification.Differences, d => d.Subject == "batch:BZ-001" && d.Field == "current revision");
        Assert.Equal(("revision 1", "revision 2"), (batch.Live, batch.Trail));
        Assert.Equal("batch BZ-001: current revision is 'revision 1' in the live tables but the trail (entry " +
            batch.EntryId!.Value.ToString(System.Globalization.CultureInfo.InvariantCulture) + ") says 'revision 2'", batch.Message);
        // The flags and steps of revision 1 are still marked as not current: that is named too.
        Assert.Contains(verification.Differences, d => d.Field.StartsWith("step S1 of revision 1", StringComparison.Ordinal));
    }

    [Theory]
    [InlineData(StoreProvider.Sqlite)] // SQLite only: its tampering SQL is SQLite's (printf).
    public void A_batch_the_trail_never_recorded_is_named(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using (var store = AuditChainTests.Filled(db))
        {
            Assert.True(store.VerifyAudit().Intact);
        }

        Db.Tamper(db, """
            INSERT INTO batch (batch_id, first_seen_at) VALUES ('BZ-999', '2026-11-24T08:00:05.0000000Z');
            INSERT INTO batch_revision (batch_ref, revision, ingest_ref, recipe, recipe_version, content_sha256, production_day, stored_at)
            SELECT id, 1, 1, 'BZ-100', 1, printf('%064d', 0), '2026-11-23', '2026-11-24T08:00:05.0000000Z' FROM batch WHERE batch_id = 'BZ-999';
            """);

        using var reopened = db.Open();
        var difference = Assert.Single(reopened.VerifyAudit().Differences);
        Assert.Equal(("batch:BZ-999", "current revision", "revision 1", (string?)null, (long?)null),
            (difference.Subject, difference.Field, difference.Live, difference.Trail, difference.EntryId));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void Reviews_revisions_and_system_closings_made_by_the_program_replay_to_the_live_tables(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = AuditChainTests.Filled(db);

        var verification = store.VerifyAudit();

        Assert.True(verification.Intact, verification.Message);
        Assert.Empty(verification.Differences);
    }
}
