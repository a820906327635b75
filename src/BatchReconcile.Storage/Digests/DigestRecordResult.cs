namespace BatchReconcile.Storage.Digests;

/// <summary>What <see cref="BatchStore.RecordDigest"/> did: the write recorded (with its audit entry), or why not.</summary>
public sealed record DigestRecordResult
{
    private DigestRecordResult(DigestWrite? write, long? auditId, string? refusal)
    {
        Write = write;
        AuditId = auditId;
        Refusal = refusal;
    }

    public DigestWrite? Write { get; }

    public long? AuditId { get; }

    /// <summary>Why nothing was recorded: the day already has its digest and no rewrite was asked for.</summary>
    public string? Refusal { get; }

    public bool Recorded => Write is not null;

    public static DigestRecordResult Done(DigestWrite write, long auditId) => new(write, auditId, null);

    public static DigestRecordResult Refused(string reason) => new(null, null, reason);
}
