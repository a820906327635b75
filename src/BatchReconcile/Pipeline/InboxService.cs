using BatchReconcile.Hosting;
using BatchReconcile.Intake.Inbox;
using BatchReconcile.Storage;
using Microsoft.Data.Sqlite;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Options;

namespace BatchReconcile.Pipeline;

/// <summary>
/// The service (<c>run</c>): watches the inbox and sends ready files through the pipeline in arrival
/// order, several files per transaction when a backlog is waiting.
/// </summary>
/// <remarks>
/// <para>On stop (SIGTERM, Ctrl-C) the group in hand is finished or, if it was not yet committed, abandoned
/// untouched: its files stay in the inbox and are taken again at the next start.</para>
/// <para>A fault of the database (locked past the busy timeout, disk full, read-only, I/O error) never stops the
/// service and never sends a file to quarantine: the group's files stay in the inbox, one error is logged, and the
/// service waits before it takes files again, 1 s after the first failure and twice as long after each further
/// one, at most <see cref="MaxBackOff"/>, until the database takes a group again.</para>
/// </remarks>
public sealed class InboxService(
    IngestPipeline pipeline,
    CatalogSource catalog,
    DataFolders folders,
    IOptions<IntakeOptions> intake,
    TimeProvider time,
    ILogger<InboxService> logger) : BackgroundService
{
    /// <summary>The longest wait between two tries while the database keeps failing.</summary>
    public static readonly TimeSpan MaxBackOff = TimeSpan.FromSeconds(60);

    /// <summary>The wait after the first failure; doubled after each further one.</summary>
    public static readonly TimeSpan FirstBackOff = TimeSpan.FromSeconds(1);

    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        var options = intake.Value;
        catalog.Watch();
        if (ReadingLink.RemoveStale(folders.Inbox) is > 0 and var stale)
        {
            logger.LogInformation("Removed {Count} hidden second names of files left from an earlier run that stopped while reading", stale);
        }

        using var watcher = new InboxWatcher(
            new InboxOptions(folders.Inbox, TimeSpan.FromSeconds(options.SettleSeconds), TimeSpan.FromSeconds(options.RescanSeconds)),
            time);
        watcher.Start();
        logger.LogInformation("Watching {Inbox} (settle {Settle} s, rescan {Rescan} s)", folders.Inbox, options.SettleSeconds, options.RescanSeconds);
        LogIgnored(watcher);

        TimeSpan? backOff = null;
        DateTimeOffset? failingSince = null;
        while (!stoppingToken.IsCancellationRequested)
        {
            IReadOnlyList<ReadyFile> ready;
            try
            {
                ready = await watcher.NextReadyAsync(options.GroupCommitMaxFiles, stoppingToken);
            }
            catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested)
            {
                break;
            }

            LogIgnored(watcher);
            try
            {
                // The group is processed to the end even when a stop arrives meanwhile: committing and
                // moving are short, and a half-moved group would only be sorted out at the next start.
                pipeline.Process(ready, CancellationToken.None);
                if (failingSince is { } since)
                {
                    logger.LogInformation("The database takes files again after {Seconds:0} s of failures; intake resumed", (time.GetUtcNow() - since).TotalSeconds);
                    (backOff, failingSince) = (null, null);
                }
            }
            catch (Exception e) when (e is StoreException or System.Data.Common.DbException)
            {
                var reason = StoreFaults.ReasonOf(e) ?? e.Message;
                backOff = backOff is { } last ? TimeSpan.FromTicks(Math.Min(last.Ticks * 2, MaxBackOff.Ticks)) : FirstBackOff;
                if (failingSince is null)
                {
                    failingSince = time.GetUtcNow();
                    logger.LogError("The database refused a group of {Count} files: {Reason}. The files stay in the inbox; trying again in {Wait} s, then at growing intervals up to {Max} s", ready.Count, reason, backOff.Value.TotalSeconds, MaxBackOff.TotalSeconds);
                }
                else
                {
                    logger.LogWarning("The database still refuses files ({Reason}); next try in {Wait} s", reason, backOff.Value.TotalSeconds);
                }

                await Task.Delay(backOff.Value, time, stoppingToken).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                logger.LogError(e, "A file of the group could not be read or moved; the group is tried again");
                await Task.Delay(TimeSpan.FromSeconds(options.RescanSeconds), time, stoppingToken).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
            }
            finally
            {
                foreach (var file in ready)
                {
                    watcher.Complete(file);
                }
            }
        }

        logger.LogInformation("Stopped watching {Inbox}", folders.Inbox);
    }

    // Once per link or folder while it stays in the inbox (the watcher remembers what it reported).
    private void LogIgnored(InboxWatcher watcher)
    {
        foreach (var ignored in watcher.TakeNewlyIgnored())
        {
            logger.LogWarning("{Name} in the inbox is a {Kind}; it is never read (put the export file itself in the inbox)", ignored.Name, ignored.KindText);
        }
    }
}
