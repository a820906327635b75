using BatchReconcile.Reconciliation.Flags;
using System.Globalization;
using BatchReconcile.Storage.Audit;
using BatchReconcile.Storage.Review;
using BatchReconcile.Storage.Sql;
using Microsoft.Data.Sqlite;

namespace BatchReconcile.Storage;

public sealed partial class BatchStore
{
    private const string FindFlagForReview = """
        SELECT f.state, f.outcome, f.review_note, f.deviation_ref, f.reviewed_by, f.reviewed_at,
               b.batch_id, r.revision, n.revision, r.superseded_at, f.step, f.code
        FROM flag f
        JOIN batch_revision r ON r.id = f.revision_ref
        JOIN batch b ON b.id = r.batch_ref
        LEFT JOIN batch_revision n ON n.id = r.superseded_by
        WHERE f.id = $id
        """;

    private const string UpdateFlagReview = """
        UPDATE flag SET state = $to, outcome = $outcome, review_note = $note, deviation_ref = $deviation,
                        reviewed_by = $by, reviewed_at = $at
        WHERE id = $id AND state = $from
        """;

    /// <summary>
    /// Moves a flag's review on (<c>flags review</c>) and writes the change to the audit trail, in
    /// one transaction. Refusals (unknown flag, a flag of a superseded revision, a transition that
    /// is not allowed, a missing outcome, note or deviation reference) come back as a result with
    /// the reason; nothing is written then.
    /// </summary>
    /// <param name="by">The reviewer's name as typed: free text, no login (an identity provider can fill it later).</param>
    /// <param name="note">Required for every change.</param>
    /// <param name="outcome">Required when closing, not allowed otherwise; <see cref="CloseOutcome.Superseded"/> is the system's.</param>
    /// <param name="deviationRef">Required with <see cref="CloseOutcome.Deviation"/>, not allowed otherwise.</param>
    /// <exception cref="StoreException">The database could not be written (locked, full, read-only); nothing was changed.</exception>
    public ReviewResult ReviewFlag(long flagId, ReviewState to, string by, string note, CloseOutcome? outcome = null, string? deviationRef = null) =>
        Guarded(() => ReviewFlagInStore(flagId, to, by, note, outcome, deviationRef));

    private ReviewResult ReviewFlagInStore(long flagId, ReviewState to, string by, string note, CloseOutcome? outcome, string? deviationRef)
    {
        var id = flagId.ToString(CultureInfo.InvariantCulture);
        var inputProblem = CheckReviewInput(flagId, to, by, note, outcome, deviationRef);
        if (inputProblem is not null)
        {
            return inputProblem;
        }

        by = by.Trim();
        deviationRef = deviationRef?.Trim();
        lock (_gate)
        {
            ThrowIfDisposed();
            // IMMEDIATE: the state read and the change it is checked against happen under the write
            // lock, so two reviewers cannot both move the flag from the same state.
            using var transaction = BeginWrite();
            FlagReview current;
            string batch, step, code;
            int revision;
            using (var find = new PreparedCommand(_connection, transaction, FindFlagForReview, ("$id", SqliteType.Integer)))
            using (var reader = find.Set("$id", flagId).Read())
            {
                if (!reader.Read())
                {
                    return ReviewResult.Refused(flagId, ReviewRefusal.UnknownFlag, $"flag {id} does not exist");
                }

                current = ReadReview(reader, 0, 1);
                batch = reader.GetString(6);
                revision = reader.GetInt32(7);
                step = reader.GetString(10);
                code = reader.GetString(11);
                if (!reader.IsDBNull(9))
                {
                    var successor = reader.IsDBNull(8) ? "a later revision" : "revision " + reader.GetInt32(8).ToString(CultureInfo.InvariantCulture);
                    return ReviewResult.Refused(flagId, ReviewRefusal.FlagSuperseded,
                        $"flag {id} belongs to revision {revision.ToString(CultureInfo.InvariantCulture)} of batch {batch}, which {successor} superseded " +
                        $"on {ShortTime(DbText.ParseTime(reader.GetString(9)))} and which can no longer be reviewed " +
                        $"(the flag is {current.State.ToText()}{(current.Outcome is { } o ? ", " + o.ToText() : string.Empty)}); review the flags of the current revision instead");
                }
            }

            var refusal = CheckTransition(flagId, current, to);
            if (refusal is not null)
            {
                return refusal;
            }

            var now = _time.GetUtcNow();
            var review = new FlagReview(to, to == ReviewState.Closed ? outcome : null, note, deviationRef, by, now);
            using (var update = new PreparedCommand(
                _connection, transaction, UpdateFlagReview,
                ("$to", SqliteType.Text), ("$outcome", SqliteType.Text), ("$note", SqliteType.Text), ("$deviation", SqliteType.Text),
                ("$by", SqliteType.Text), ("$at", SqliteType.Text), ("$id", SqliteType.Integer), ("$from", SqliteType.Text)))
            {
                var changed = update
                    .Set("$to", to.ToText()).Set("$outcome", review.Outcome?.ToText()).Set("$note", note).Set("$deviation", deviationRef)
                    .Set("$by", by).Set("$at", DbText.Time(now)).Set("$id", flagId).Set("$from", current.State.ToText())
                    .Execute();
                if (changed != 1)
                {
                    throw new InvalidOperationException($"Flag {id} changed state under the write lock.");
                }
            }

            long auditId;
            using (var audit = new AuditWriter(_connection, transaction))
            {
                auditId = audit.Append(
                    now, by, "flag.review", "flag:" + id,
                    StoreJson.Detail(new { batch, revision, step, code, outcome = review.Outcome?.ToText() }),
                    current.State.ToText(), to.ToText(), note, deviationRef);
            }

            transaction.Commit();
            return ReviewResult.Done(flagId, review, auditId);
        }
    }

    private static ReviewResult? CheckReviewInput(long flagId, ReviewState to, string by, string note, CloseOutcome? outcome, string? deviationRef)
    {
        // Every reason names the flag once, so that the command line can print it as it is.
        ReviewResult Refuse(ReviewRefusal why, string reason) =>
            ReviewResult.Refused(flagId, why, $"flag {flagId.ToString(CultureInfo.InvariantCulture)}: {reason}");

        if (string.IsNullOrWhiteSpace(by))
        {
            return Refuse(ReviewRefusal.ReviewerMissing, "a reviewer name is required (--by NAME)");
        }

        if (ReviewRules.IsReservedName(by, AuditWriter.SystemActor))
        {
            return Refuse(ReviewRefusal.ReviewerMissing, $"the name '{AuditWriter.SystemActor}' is kept for the program's own entries; give the reviewer's name");
        }

        if (string.IsNullOrWhiteSpace(note))
        {
            return Refuse(ReviewRefusal.NoteMissing, "a note is required for every review change (--note TEXT)");
        }

        var badText = ReviewRules.CheckText("reviewer name", by, ReviewRules.MaxNameLength, multiLine: false)
            ?? ReviewRules.CheckText("note", note, ReviewRules.MaxNoteLength, multiLine: true)
            ?? (deviationRef is null ? null : ReviewRules.CheckText("deviation reference", deviationRef, ReviewRules.MaxDeviationRefLength, multiLine: false));
        if (badText is not null)
        {
            return Refuse(ReviewRefusal.BadText, badText);
        }

        if (outcome == CloseOutcome.Superseded)
        {
            return Refuse(ReviewRefusal.OutcomeNotAllowed,
                "the outcome superseded is set by the system when a re-export replaces the flag's revision; close with explained, deviation or corrected");
        }

        if (to == ReviewState.Closed && outcome is null)
        {
            return Refuse(ReviewRefusal.OutcomeMissing, "closing a flag needs an outcome: --outcome explained, deviation or corrected");
        }

        if (to != ReviewState.Closed && outcome is not null)
        {
            return Refuse(ReviewRefusal.OutcomeNotAllowed, $"an outcome is only given when closing (--state closed), not with --state {to.ToText()}");
        }

        if (outcome == CloseOutcome.Deviation && string.IsNullOrWhiteSpace(deviationRef))
        {
            return Refuse(ReviewRefusal.DeviationRefMissing, "the outcome deviation needs the deviation's reference (--deviation REF)");
        }

        if (outcome != CloseOutcome.Deviation && deviationRef is not null)
        {
            return Refuse(ReviewRefusal.DeviationRefNotAllowed, "a deviation reference goes only with --outcome deviation");
        }

        return null;
    }

    private static ReviewResult? CheckTransition(long flagId, FlagReview current, ReviewState to)
    {
        var id = flagId.ToString(CultureInfo.InvariantCulture);
        if (current.State == to)
        {
            var how = current.State switch
            {
                ReviewState.Closed => $"closed ({current.Outcome?.ToText()}{Since(current)}); reopen it with --state in-review",
                ReviewState.InReview => $"in review ({Since(current).TrimStart()}); close it with --state closed",
                _ => "open",
            };
            return ReviewResult.Refused(flagId, ReviewRefusal.SameState, $"flag {id} is already {how}");
        }

        if (!ReviewRules.IsAllowed(current.State, to))
        {
            var next = string.Join(" or ", ReviewRules.Next(current.State).Select(s => s.ToText()));
            return ReviewResult.Refused(flagId, ReviewRefusal.TransitionNotAllowed,
                $"flag {id} cannot go from {current.State.ToText()} to {to.ToText()}: a reviewed flag never returns to open; from {current.State.ToText()} it can go to {next}");
        }

        return null;
    }

    private static string Since(FlagReview review) =>
        review.By is null || review.At is null ? string.Empty : $" by {review.By} on {ShortTime(review.At.Value)}";

    private static string ShortTime(DateTimeOffset at) =>
        at.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm'Z'", CultureInfo.InvariantCulture);
}
