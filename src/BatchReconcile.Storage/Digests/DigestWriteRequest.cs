namespace BatchReconcile.Storage.Digests;

/// <summary>A digest write to record (<see cref="BatchStore.RecordDigest(DigestWriteRequest)"/>).</summary>
/// <param name="Files">The files of this write, as they stand once it is done.</param>
/// <param name="Rewrite">Write even when the day has a digest already.</param>
/// <param name="By">Who asked: <c>system</c> for the scheduler and the freshness rewrites, or a name.</param>
public sealed record DigestWriteRequest(DateOnly Day, IReadOnlyList<string> Files, int FlagCount, bool Rewrite, string By)
{
    /// <summary>The day's change counts the digest was gathered at; null takes the counts as they stand when it is recorded.</summary>
    public DayChanges? Seen { get; init; }

    /// <summary>Why a rewrite is written (recorded with it and in its audit entry).</summary>
    public string? Reason { get; init; }

    /// <summary>The earlier issue's files as they are kept (numbered), for the audit entry.</summary>
    public IReadOnlyList<string> Kept { get; init; } = [];

    /// <summary>
    /// How many writes of the day the caller saw; when the store holds another number (another process wrote the
    /// day meanwhile) nothing is done and the result says so.
    /// </summary>
    public int? ExpectedEarlierWrites { get; init; }

    /// <summary>Writes the files; run under the store's write lock after the checks and before the record is made.</summary>
    public Action? WriteFiles { get; init; }
}
