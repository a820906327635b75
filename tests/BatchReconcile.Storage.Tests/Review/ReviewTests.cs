using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Records.Definitions;
using BatchReconcile.Storage.Review;
using BatchReconcile.Storage.Tests.Support;

namespace BatchReconcile.Storage.Tests.Review;

public sealed class ReviewTests
{
    private const string Reviewer = "A. Chen";

    /// <summary>Every pair of states: the four allowed moves succeed, every other one is refused with its reason.</summary>
    [Theory]
    [InlineData(ReviewState.Open, ReviewState.InReview, null, null)]
    [InlineData(ReviewState.Open, ReviewState.Closed, null, null)]
    [InlineData(ReviewState.InReview, ReviewState.Closed, null, null)]
    [InlineData(ReviewState.Closed, ReviewState.InReview, null, null)]
    [InlineData(ReviewState.Open, ReviewState.Open, ReviewRefusal.SameState, "is already open")]
    [InlineData(ReviewState.InReview, ReviewState.InReview, ReviewRefusal.SameState, "is already in review (by A. Chen on 2026-11-24T08:00Z); close it with --state closed")]
    [InlineData(ReviewState.Closed, ReviewState.Closed, ReviewRefusal.SameState, "is already closed (explained by A. Chen on 2026-11-24T08:00Z); reopen it with --state in-review")]
    [InlineData(ReviewState.InReview, ReviewState.Open, ReviewRefusal.TransitionNotAllowed, "cannot go from in-review to open: a reviewed flag never returns to open; from in-review it can go to closed")]
    [InlineData(ReviewState.Closed, ReviewState.Open, ReviewRefusal.TransitionNotAllowed, "cannot go from closed to open: a reviewed flag never returns to open; from closed it can go to in-review")]
    public void Transitions_between_states(ReviewState from, ReviewState to, ReviewRefusal? refusal, string? reason)
    {
        using var db = new TempDatabase();
        using var store = db.Open(time: new FixedTime(new DateTimeOffset(2026, 11, 24, 8, 0, 30, TimeSpan.Zero)));
        var flag = OneFlag(store);
        PutInState(store, flag, from);
        var auditBefore = Db.Count(store.Connection, "audit_event");

        var result = store.ReviewFlag(flag, to, "B. Okafor", "second look", to == ReviewState.Closed ? CloseOutcome.Corrected : null);

        var stored = Assert.Single(store.ListFlags()).Review;
        if (refusal is null)
        {
            Assert.True(result.Accepted, result.Reason);
            Assert.Equal(to, result.Review?.State);
            Assert.Equal((to, "B. Okafor", "second look"), (stored.State, stored.By, stored.Note));
            Assert.Equal(to == ReviewState.Closed ? CloseOutcome.Corrected : null, stored.Outcome);
            Assert.Equal(auditBefore + 1, Db.Count(store.Connection, "audit_event"));
        }
        else
        {
            Assert.False(result.Accepted);
            Assert.Equal(refusal, result.Refusal);
            Assert.Equal($"flag {flag} {reason}", result.Reason);
            Assert.Equal(from, stored.State);
            Assert.Equal(auditBefore, Db.Count(store.Connection, "audit_event"));
        }
    }

    /// <summary>What the reviewer typed is checked before anything is looked up or written.</summary>
    [Theory]
    [InlineData(ReviewState.Closed, "A. Chen", "checked", null, null, ReviewRefusal.OutcomeMissing, "closing a flag needs an outcome")]
    [InlineData(ReviewState.Closed, "A. Chen", "checked", CloseOutcome.Deviation, null, ReviewRefusal.DeviationRefMissing, "needs the deviation's reference (--deviation REF)")]
    [InlineData(ReviewState.Closed, "A. Chen", "checked", CloseOutcome.Deviation, "  ", ReviewRefusal.DeviationRefMissing, "needs the deviation's reference")]
    [InlineData(ReviewState.Closed, "A. Chen", "checked", CloseOutcome.Superseded, null, ReviewRefusal.OutcomeNotAllowed, "the outcome superseded is set by the system")]
    [InlineData(ReviewState.Closed, "A. Chen", "checked", CloseOutcome.Explained, "DEV-2026-041", ReviewRefusal.DeviationRefNotAllowed, "only with --outcome deviation")]
    [InlineData(ReviewState.InReview, "A. Chen", "checked", CloseOutcome.Explained, null, ReviewRefusal.OutcomeNotAllowed, "only given when closing (--state closed), not with --state in-review")]
    [InlineData(ReviewState.Closed, "A. Chen", "", CloseOutcome.Explained, null, ReviewRefusal.NoteMissing, "a note is required")]
    [InlineData(ReviewState.InReview, "A. Chen", " \n ", null, null, ReviewRefusal.NoteMissing, "a note is required")]
    [InlineData(ReviewState.InReview, "", "checked", null, null, ReviewRefusal.ReviewerMissing, "a reviewer name is required (--by NAME)")]
    [InlineData(ReviewState.InReview, "System", "checked", null, null, ReviewRefusal.ReviewerMissing, "kept for the program's own entries")]
    // Look-alikes of the reserved name (issue 10 item 12): Cyrillic dze, Cyrillic u and ie, Greek capitals,
    // full-width and mathematical bold letters (NFKC), a zero-width space, Latin small capitals.
    [InlineData(ReviewState.InReview, "\u0455ystem", "checked", null, null, ReviewRefusal.ReviewerMissing, "kept for the program's own entries")]
    [InlineData(ReviewState.InReview, "s\u0443st\u0435m", "checked", null, null, ReviewRefusal.ReviewerMissing, "kept for the program's own entries")]
    [InlineData(ReviewState.InReview, "SY\u0405\u03A4\u0395\u039C", "checked", null, null, ReviewRefusal.ReviewerMissing, "kept for the program's own entries")]
    [InlineData(ReviewState.InReview, "\uFF53\uFF59\uFF53\uFF54\uFF45\uFF4D", "checked", null, null, ReviewRefusal.ReviewerMissing, "kept for the program's own entries")]
    [InlineData(ReviewState.InReview, "\U0001D42C\U0001D432\U0001D42C\U0001D42D\U0001D41E\U0001D426", "checked", null, null, ReviewRefusal.ReviewerMissing, "kept for the program's own entries")]
    [InlineData(ReviewState.InReview, "sys\u200Btem", "checked", null, null, ReviewRefusal.ReviewerMissing, "kept for the program's own entries")]
    [InlineData(ReviewState.InReview, "\uA731\u028F\uA731\u1D1B\u1D07\u1D0D", "checked", null, null, ReviewRefusal.ReviewerMissing, "kept for the program's own entries")]
    [InlineData(ReviewState.InReview, "A. Chen\u202E", "checked", null, null, ReviewRefusal.BadText, "the reviewer name has a bidirectional control character (U+202E) at position 8")]
    [InlineData(ReviewState.InReview, "A. Chen", "bell\u0007here", null, null, ReviewRefusal.BadText, "the note has a control character (U+0007) at position 5")]
    [InlineData(ReviewState.InReview, "A.\tChen", "checked", null, null, ReviewRefusal.BadText, "the reviewer name has a control character (U+0009) at position 3")]
    public void Incomplete_or_bad_input_is_refused_and_nothing_is_written(
        ReviewState to, string by, string note, CloseOutcome? outcome, string? deviation, ReviewRefusal refusal, string reason)
    {
        using var db = new TempDatabase();
        using var store = db.Open();
        var flag = OneFlag(store);
        var auditBefore = Db.Count(store.Connection, "audit_event");

        var result = store.ReviewFlag(flag, to, by, note, outcome, deviation);

        Assert.Equal(refusal, result.Refusal);
        Assert.Contains(reason, result.Reason, StringComparison.Ordinal);
        Assert.Equal(ReviewState.Open, Assert.Single(store.ListFlags()).Review.State);
        Assert.Equal(auditBefore, Db.Count(store.Connection, "audit_event"));
    }

    [Theory]
    [InlineData("system", true)]
    [InlineData("  SYSTEM ", true)]
    [InlineData("\u0455\u0443\u0455t\u0435m", true)]
    [InlineData("systems", false)]
    [InlineData("A. Chen", false)]
    [InlineData("\u041E\u043B\u044C\u0433\u0430 \u0421\u043C\u0438\u0440\u043D\u043E\u0432\u0430", false)] // a Cyrillic name stays a name
    [InlineData("J\u00FCrgen M\u00FCller", false)]
    public void Only_the_reserved_name_and_its_look_alikes_are_reserved(string name, bool reserved) =>
        Assert.Equal(reserved, ReviewRules.IsReservedName(name, "system"));

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void An_unknown_flag_id_is_refused(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        OneFlag(store);

        var result = store.ReviewFlag(999, ReviewState.InReview, Reviewer, "looking");

        Assert.Equal((ReviewRefusal.UnknownFlag, "flag 999 does not exist"), (result.Refusal, result.Reason));
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_deviation_keeps_its_reference_reopening_clears_the_outcome_and_every_change_is_in_the_trail(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        var clock = new FixedTime(new DateTimeOffset(2026, 11, 25, 9, 12, 0, TimeSpan.Zero));
        using var store = db.Open(time: clock);
        var flag = OneFlag(store);

        Assert.True(store.ReviewFlag(flag, ReviewState.InReview, Reviewer, "asked the shift lead for the filter weights").Accepted);
        clock.Now = clock.Now.AddHours(2);
        var closed = store.ReviewFlag(flag, ReviewState.Closed, Reviewer, "filter cake loss above limit", CloseOutcome.Deviation, " DEV-2026-041 ");
        Assert.True(closed.Accepted, closed.Reason);

        var review = Assert.Single(store.ListFlags()).Review;
        Assert.Equal(new FlagReview(ReviewState.Closed, CloseOutcome.Deviation, "filter cake loss above limit", "DEV-2026-041", Reviewer, clock.Now), review);
        Assert.Equal(review, Assert.Single(store.GetLatestBatch("BZ-001")!.Flags).Review);

        clock.Now = clock.Now.AddDays(1);
        Assert.True(store.ReviewFlag(flag, ReviewState.InReview, "B. Okafor", "deviation rejected by QA head; recheck").Accepted);
        var reopened = Assert.Single(store.ListFlags(unresolvedOnly: true)).Review;
        Assert.Equal((ReviewState.InReview, null, null, "B. Okafor"), (reopened.State, reopened.Outcome, reopened.DeviationRef, reopened.By));

        var trail = store.AuditTrailOf($"flag:{flag}");
        Assert.Equal(
            [("A. Chen", "open", "in-review", null), ("A. Chen", "in-review", "closed", "DEV-2026-041"), ("B. Okafor", "closed", "in-review", null)],
            trail.Select(e => (e.Actor, e.FromState, e.ToState, e.DeviationRef)));
        Assert.All(trail, e => Assert.Equal("flag.review", e.Kind));
        Assert.Equal("2026-11-25T11:12:00.0000000Z", trail[1].At);
        Assert.Contains("\"outcome\":\"deviation\"", trail[1].Detail, StringComparison.Ordinal);
        Assert.Equal("filter cake loss above limit", trail[1].Note);
        Assert.True(store.VerifyAudit().Intact);
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void A_new_revision_closes_the_unclosed_flags_of_the_old_one_as_superseded_in_the_trail(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        var first = Assert.Single(store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1,
            Build.Flag("S1"), Build.Flag("S2", FlagCode.BalanceGap), Build.Flag("S2", FlagCode.ProductInWaste, FlagSeverity.Minor)))]));
        var (stillOpen, inReview, explained) = (first.Batches[0].FlagIds[0], first.Batches[0].FlagIds[1], first.Batches[0].FlagIds[2]);
        Assert.True(store.ReviewFlag(inReview, ReviewState.InReview, Reviewer, "looking").Accepted);
        Assert.True(store.ReviewFlag(explained, ReviewState.Closed, Reviewer, "sampling loss, known", CloseOutcome.Explained).Accepted);

        store.Commit([Build.File("b.csv", Build.Ingest(Build.Batch("BZ-001", productKg: 97.0), Build.Day1, Build.Flag("S2")))]);

        var old = store.GetBatch("BZ-001", 1)!.Flags.ToDictionary(f => f.Id, f => f.Review);
        foreach (var id in new[] { stillOpen, inReview })
        {
            Assert.Equal((ReviewState.Closed, CloseOutcome.Superseded, "superseded by revision 2 from file b.csv", "system"),
                (old[id].State, old[id].Outcome, old[id].Note, old[id].By));
        }

        Assert.Equal((CloseOutcome.Explained, Reviewer), (old[explained].Outcome, old[explained].By));
        var systemClosings = new[] { stillOpen, inReview }.Select(id => store.AuditTrailOf($"flag:{id}")[^1]).ToList();
        Assert.Equal([("system", "open", "closed"), ("system", "in-review", "closed")], systemClosings.Select(e => (e.Actor, e.FromState!, e.ToState!)));
        Assert.All(systemClosings, e => Assert.Contains("\"outcome\":\"superseded\"", e.Detail, StringComparison.Ordinal));
        Assert.Single(store.AuditTrailOf($"flag:{explained}"));

        // And the flag of the old revision can no longer be reviewed.
        var refused = store.ReviewFlag(stillOpen, ReviewState.InReview, Reviewer, "reopen?");
        Assert.Equal(ReviewRefusal.FlagSuperseded, refused.Refusal);
        Assert.Equal(
            $"flag {stillOpen} belongs to revision 1 of batch BZ-001, which revision 2 superseded on 2026-11-24T08:00Z and which can no longer be reviewed " +
            "(the flag is closed, superseded); review the flags of the current revision instead",
            refused.Reason);
        Assert.True(store.VerifyAudit().Intact);
    }

    [Theory]
    [MemberData(nameof(Providers.Both), MemberType = typeof(Providers))]
    public void When_the_revision_file_fails_its_superseded_closings_are_rolled_back_with_it(StoreProvider provider)
    {
        using var db = new TempDatabase(provider);
        using var store = db.Open();
        var flag = Assert.Single(store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1")))])).Batches[0].FlagIds[0];
        var auditBefore = Db.Count(store.Connection, "audit_event");

        // The same step twice breaks the step table's key after the old flag was closed: the file fails inside its savepoint.
        var twice = new Reconciliation.Outcomes.BatchOutcome(Build.Batch("BZ-001", productKg: 97.0), [Build.Step("S1", 1.0, []), Build.Step("S1", 2.0, [])], null);
        var broken = Assert.Single(store.Commit([Build.File("b.csv", new Storage.Ingest.BatchIngest(twice, Build.Day1))]));

        Assert.False(broken.Committed);
        Assert.Equal(ReviewState.Open, Assert.Single(store.ListFlags(), f => f.Id == flag).Review.State);
        Assert.Equal(auditBefore, Db.Count(store.Connection, "audit_event"));
        Assert.True(store.VerifyAudit().Intact);
    }

    [Theory]
    [InlineData(ReviewState.Open, "in-review,closed")]
    [InlineData(ReviewState.InReview, "closed")]
    [InlineData(ReviewState.Closed, "in-review")]
    public void The_rules_table_names_the_next_states(ReviewState from, string next)
    {
        Assert.Equal(next, string.Join(",", ReviewRules.Next(from).Select(s => s.ToText())));
    }

    [Theory]
    [InlineData("open", ReviewState.Open)]
    [InlineData("in-review", ReviewState.InReview)]
    [InlineData("closed", ReviewState.Closed)]
    public void State_texts_round_trip(string text, ReviewState state)
    {
        Assert.True(ReviewText.TryParseState(text, out var parsed));
        Assert.Equal(state, parsed);
        Assert.Equal(text, state.ToText());
        Assert.False(ReviewText.TryParseState(text.ToUpperInvariant(), out _));
    }

    private static long OneFlag(BatchStore store) =>
        Assert.Single(store.Commit([Build.File("a.csv", Build.Ingest(Build.Batch("BZ-001"), Build.Day1, Build.Flag("S1")))])).Batches[0].FlagIds[0];

    /// <summary>Moves a fresh flag to a state through the API, as a reviewer would.</summary>
    private static void PutInState(BatchStore store, long flag, ReviewState state)
    {
        switch (state)
        {
            case ReviewState.InReview:
                Assert.True(store.ReviewFlag(flag, ReviewState.InReview, Reviewer, "looking").Accepted);
                break;
            case ReviewState.Closed:
                Assert.True(store.ReviewFlag(flag, ReviewState.Closed, Reviewer, "yield in the accepted band", CloseOutcome.Explained).Accepted);
                break;
        }
    }
}
