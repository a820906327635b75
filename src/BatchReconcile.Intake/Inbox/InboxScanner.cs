namespace BatchReconcile.Intake.Inbox;

/// <summary>One look at a folder of exports (the <c>ingest FOLDER</c> case): no watching, and waiting only for files written within the last settle interval.</summary>
public static class InboxScanner
{
    /// <summary>
    /// Lists the candidate files of <paramref name="folder"/> and returns those that are complete
    /// (the watcher's rule: not written for <paramref name="settle"/>, opens exclusively). Files last
    /// written at least <paramref name="settle"/> ago are returned without any wait; only when some
    /// file was written more recently, or is held open, does the scan wait for it, and never much
    /// longer than one settle interval. Zero for a folder known to be finished (then only the
    /// exclusive open is checked).
    /// </summary>
    public static async Task<InboxScan> ScanOnceAsync(string folder, TimeSpan settle, TimeProvider time, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(time);
        // The rescan interval never elapses during a one-shot; events are not needed for one look.
        var options = new InboxOptions(folder, settle, TimeSpan.FromDays(1), useFileSystemEvents: false);
        using var watcher = new InboxWatcher(options, time);
        watcher.Start();
        var started = time.GetTimestamp();
        // Half an interval of slack: a timer can fire a hair before its time, and a file found a moment
        // after the listing started is due a moment after one interval. A file that is still changing, or
        // held open, after that is left for a later run rather than waited for again.
        var budget = settle + (settle / 2);
        var ready = new List<ReadyFile>();
        while (true)
        {
            ready.AddRange(watcher.TakeReady(int.MaxValue, out var wait));
            if (settle <= TimeSpan.Zero || watcher.PendingNames().Count == 0 || time.GetElapsedTime(started) + wait > budget)
            {
                break;
            }

            await Task.Delay(wait, time, cancellationToken).ConfigureAwait(false);
        }

        return new InboxScan(ready, watcher.PendingNames(), watcher.Ignored());
    }
}
