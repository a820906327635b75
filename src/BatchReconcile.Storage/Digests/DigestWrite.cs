namespace BatchReconcile.Storage.Digests;

/// <summary>One write of a day's digest.</summary>
/// <param name="Files">The files written, as the host gave them (paths under the data folder's <c>digests/</c>).</param>
/// <param name="FlagCount">Flags listed in that digest.</param>
/// <param name="IsRewrite">False for the day's first write; true for a rewrite (on request, or because the day changed).</param>
/// <param name="By">Who asked: <c>system</c> for the scheduler, or the name given on the command line.</param>
/// <param name="Seen">The day's change counts the write was gathered at.</param>
/// <param name="Reason">Why a rewrite was written, in plain words; null for a first write.</param>
public sealed record DigestWrite(
    long Id, DateOnly Day, DateTimeOffset WrittenAt, IReadOnlyList<string> Files, int FlagCount, bool IsRewrite, string By,
    DayChanges? Seen = null, string? Reason = null)
{
    /// <summary>1 for the first write of the day, 2 for the first rewrite and so on.</summary>
    public int Issue { get; init; } = 1;
}
