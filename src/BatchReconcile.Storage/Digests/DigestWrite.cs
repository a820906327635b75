namespace BatchReconcile.Storage.Digests;

/// <summary>One write of a day's digest.</summary>
/// <param name="Files">The files written, as the host gave them (paths under the data folder's <c>digests/</c>).</param>
/// <param name="FlagCount">Flags listed in that digest.</param>
/// <param name="IsRewrite">False for the day's first write; true for a rewrite on request.</param>
/// <param name="By">Who asked: <c>system</c> for the scheduler, or the name given on the command line.</param>
public sealed record DigestWrite(long Id, DateOnly Day, DateTimeOffset WrittenAt, IReadOnlyList<string> Files, int FlagCount, bool IsRewrite, string By);
