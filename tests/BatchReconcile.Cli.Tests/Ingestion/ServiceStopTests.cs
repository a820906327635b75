using BatchReconcile.Cli.Tests.Support;
using Xunit.Abstractions;

namespace BatchReconcile.Cli.Tests.Ingestion;

/// <summary>
/// Stopping the service: SIGTERM (systemd, Ctrl-C) stops it cleanly with exit 0 after the group in
/// hand; SIGKILL in the middle of a backlog loses and doubles nothing once it is started again.
/// </summary>
[Collection(ServiceCollection.Name)]
public class ServiceStopTests(ITestOutputHelper output)
{
    private const string Benzamide = "2026-11-23T1705_KB3-NB-0158.csv";
    private static readonly TimeSpan StopTimeout = TimeSpan.FromSeconds(60);

    [Fact]
    public async Task Sigterm_stops_an_idle_service_with_exit_code_0_and_a_log_line()
    {
        using var sandbox = new ServiceSandbox();
        using var service = await sandbox.StartAsync();

        var exit = await service.TerminateAsync(StopTimeout);

        Assert.True(exit == 0, $"exit {exit}; stderr:\n{service.Stderr}");
        Assert.Contains("Stopped watching", service.Stderr, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Sigterm_during_a_backlog_exits_0_and_leaves_every_file_either_stored_and_archived_or_untouched_in_the_inbox()
    {
        // Enough files that the stop lands inside the backlog even when this machine is busy and the
        // service has taken many groups before the signal arrives (60 files were once all done first).
        const int count = 300;
        using var sandbox = new ServiceSandbox(groupCommitMaxFiles: 4);
        var names = WriteBacklog(sandbox, count, "term");
        using var service = await sandbox.StartAsync(waitUntilWatching: false);

        await Poll.UntilAsync(() => sandbox.Data.ArchivedFiles().Count > 0 || service.HasExited, ServiceSandbox.Patience, () => "nothing archived", intervalMs: 2);
        var exit = await service.TerminateAsync(StopTimeout);
        output.WriteLine($"{sandbox.Data.ArchivedFiles().Count} of {count} archived at the stop");

        Assert.True(exit == 0, $"exit {exit}; stderr:\n{service.Stderr}");
        Assert.Contains("Stopped watching", service.Stderr, StringComparison.Ordinal);
        var archived = sandbox.Data.ArchivedFiles();
        var waiting = sandbox.Data.InboxFiles();
        Assert.True(waiting.Count > 0, $"the stop came after the whole backlog of {count} files: nothing was tested");
        Assert.Equal(names, archived.Concat(waiting).Order(StringComparer.Ordinal));
        Assert.Empty(sandbox.Data.QuarantinedFiles());
        // What was archived was stored (once); what is still in the inbox was not touched.
        var log = sandbox.IngestLog();
        Assert.Equal(archived, log.Select(l => l.File).Order(StringComparer.Ordinal));
        Assert.All(log, l => Assert.Equal("stored", l.Outcome));
        Assert.Equal(archived.Count, sandbox.Data.Scalar("SELECT COUNT(*) FROM batch"));
    }

    [Fact]
    public async Task A_restart_after_kill_9_mid_backlog_stores_every_batch_exactly_once()
    {
        const int count = 150;
        // Small groups: many commits, so the kill lands between or inside them rather than after the last.
        using var sandbox = new ServiceSandbox(groupCommitMaxFiles: 8);
        var names = WriteBacklog(sandbox, count, "crash");

        // Three crashes in a row, each as soon as the service has archived more than before: every kill
        // lands while files are still waiting, some perhaps between a commit and the moves after it.
        var archivedAtKills = new List<int>();
        for (var crash = 0; crash < 3; crash++)
        {
            var before = sandbox.Data.ArchivedFiles().Count;
            var victim = await sandbox.StartAsync(waitUntilWatching: false);
            await Poll.UntilAsync(
                () => sandbox.Data.ArchivedFiles().Count > before || sandbox.Data.InboxCandidates().Count == 0 || victim.HasExited,
                ServiceSandbox.Patience,
                () => $"nothing archived after {before}",
                intervalMs: 2);
            Assert.False(victim.HasExited, $"the service exited on its own; stderr:\n{victim.Stderr}");
            await victim.KillHardAsync();
            archivedAtKills.Add(sandbox.Data.ArchivedFiles().Count);
        }

        Assert.True(archivedAtKills[0] < count, $"the first kill came after all {count} files were archived: nothing was tested");

        var survivor = await sandbox.StartAsync();
        await sandbox.WaitUntilTakenAsync(count, survivor);
        var exit = await survivor.TerminateAsync(StopTimeout);
        Assert.True(exit == 0, $"exit {exit}; stderr:\n{survivor.Stderr}");

        // Every original file in the archive exactly once (no "name (2).csv"), none left, none quarantined.
        Assert.Equal(names, sandbox.Data.ArchivedFiles());
        Assert.Empty(sandbox.Data.InboxCandidates());
        Assert.Empty(sandbox.Data.QuarantinedFiles());
        // Every batch stored exactly once, as revision 1.
        Assert.Equal(count, sandbox.Data.Scalar("SELECT COUNT(*) FROM batch"));
        Assert.Equal(count, sandbox.Data.Scalar("SELECT COUNT(*) FROM batch_revision"));
        Assert.Equal(1, sandbox.Data.Scalar("SELECT MAX(revision) FROM batch_revision"));
        Assert.Equal(count * ExportText.FromSample(Benzamide).DataRowCount, sandbox.Data.Scalar("SELECT coalesce(sum(line_count), 0) FROM raw_rows"));
        // Each file stored once; a file committed but not yet moved at the kill is logged again as a duplicate.
        var log = sandbox.IngestLog();
        Assert.Equal(names, log.Where(l => l.Outcome == "stored").Select(l => l.File).Order(StringComparer.Ordinal));
        Assert.All(log.Where(l => l.Outcome != "stored"), l => Assert.Equal("duplicate", l.Outcome));
        // The crash window is one group: at most its files were committed and not yet moved.
        var duplicates = log.Where(l => l.Outcome == "duplicate").Select(l => l.File).ToList();
        Assert.True(duplicates.Count <= 3 * 8, $"{duplicates.Count} duplicates, more than one group of 8 per crash");
        Assert.All(duplicates, d => Assert.Contains(d, names));
        output.WriteLine($"archived at the kills: {string.Join(", ", archivedAtKills)} of {count}; duplicates: [{string.Join(", ", duplicates)}]");
    }

    /// <summary>Writes <paramref name="count"/> one-batch files into the inbox before the service starts; returns their names, sorted.</summary>
    private static List<string> WriteBacklog(ServiceSandbox sandbox, int count, string prefix)
    {
        var sample = ExportText.FromSample(Benzamide);
        var names = new List<string>(count);
        for (var i = 1; i <= count; i++)
        {
            var name = $"{prefix}-{i:D3}.csv";
            sample.WithBatchId($"E2E-{prefix.ToUpperInvariant()}-{i:D3}").WriteTo(Path.Combine(sandbox.Data.Inbox, name));
            names.Add(name);
        }

        return names;
    }
}
