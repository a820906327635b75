namespace BatchReconcile.Intake.Inbox;

/// <summary>The result of a one-shot look at a folder (<see cref="InboxScanner"/>).</summary>
/// <param name="Ready">Complete files in arrival order (last-write time, then name).</param>
/// <param name="NotReady">Names of candidate files that were still changing or held open by a writer.</param>
/// <param name="Ignored">Symbolic links and folders in the folder, which are never read.</param>
public sealed record InboxScan(IReadOnlyList<ReadyFile> Ready, IReadOnlyList<string> NotReady, IReadOnlyList<IgnoredEntry> Ignored);
