namespace BatchReconcile.Storage.Audit;

/// <summary>One entry of the audit trail as stored.</summary>
/// <param name="At">UTC text as stored, <c>yyyy-MM-ddTHH:mm:ss.fffffffZ</c> (hashed as this text).</param>
/// <param name="Actor">Who made the change: a reviewer's name as typed, or <c>system</c> for the program's own entries.</param>
/// <param name="Kind">e.g. <c>ingest.stored</c>, <c>batch.revision</c>, <c>flag.review</c>, <c>digest.written</c>.</param>
/// <param name="Subject">What changed, e.g. <c>flag:17</c>, <c>batch:BZ-001</c>, <c>file:&lt;sha256&gt;</c>, <c>digest:2026-11-23</c>.</param>
/// <param name="Detail">JSON text with the rest of the event.</param>
/// <param name="PreviousHash">The <see cref="Hash"/> of the entry before (64 zeros for the first).</param>
/// <param name="Hash">SHA-256 of <see cref="AuditCanonicalForm.Text"/> of this entry, lower-case hex.</param>
public sealed record AuditEntry(
    long Id,
    string At,
    string Actor,
    string Kind,
    string Subject,
    string? FromState,
    string? ToState,
    string? Note,
    string? DeviationRef,
    string Detail,
    string PreviousHash,
    string Hash);
