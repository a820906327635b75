namespace BatchReconcile.Intake.Inbox;

/// <summary>One look at a folder of exports (the <c>ingest FOLDER</c> case): no watching, no waiting beyond one settle interval.</summary>
public static class InboxScanner
{
    /// <summary>
    /// Lists the candidate files of <paramref name="folder"/>, waits <paramref name="settle"/> once and
    /// returns those whose size and last-write time did not change meanwhile and that open exclusively.
    /// Pass the site's settle interval when the folder may still be written to; zero for a folder known
    /// to be finished (then only the exclusive open is checked).
    /// </summary>
    public static async Task<InboxScan> ScanOnceAsync(string folder, TimeSpan settle, TimeProvider time, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(time);
        // The rescan interval never elapses during a one-shot; events are not needed for one look.
        var options = new InboxOptions(folder, settle, TimeSpan.FromDays(1), useFileSystemEvents: false);
        using var watcher = new InboxWatcher(options, time);
        watcher.Start();
        var ready = new List<ReadyFile>(watcher.TakeReady(int.MaxValue, out _));
        if (settle > TimeSpan.Zero)
        {
            await Task.Delay(settle, time, cancellationToken).ConfigureAwait(false);
            ready.AddRange(watcher.TakeReady(int.MaxValue, out var wait));
            // A timer can fire a hair before the interval has passed on the monotonic clock; files that were
            // only short of it get one more look. Files that changed meanwhile would need a whole interval.
            if (watcher.PendingNames().Count > 0 && wait < settle / 2)
            {
                await Task.Delay(wait, time, cancellationToken).ConfigureAwait(false);
                ready.AddRange(watcher.TakeReady(int.MaxValue, out _));
            }
        }

        return new InboxScan(ready, watcher.PendingNames());
    }
}
