namespace BatchReconcile.Digest.Model;

/// <summary>A digest written again for a day that had one: which issue it is, what it replaces and why.</summary>
/// <param name="Number">This issue's number: 2 for the first rewrite.</param>
/// <param name="PreviousWrittenAt">When the issue it replaces was written, on the plant clock.</param>
/// <param name="Reason">Why, in plain words ("2 batches arrived and 1 review decision was recorded since").</param>
public sealed record DigestIssue(int Number, DateTimeOffset PreviousWrittenAt, string Reason)
{
    public int Number { get; } = Number >= 2
        ? Number
        : throw new ArgumentOutOfRangeException(nameof(Number), Number, "A rewrite is issue 2 or later.");

    public string Reason { get; } = string.IsNullOrWhiteSpace(Reason)
        ? throw new ArgumentException("A rewrite says why it was written.", nameof(Reason))
        : Reason;

    public int Replaces => Number - 1;
}
