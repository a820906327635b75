using BatchReconcile.Hosting;
using BatchReconcile.Intake.Inbox;
using BatchReconcile.Storage;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Options;

namespace BatchReconcile.Pipeline;

/// <summary>
/// The service (<c>run</c>): watches the inbox and sends ready files through the pipeline in arrival
/// order, several files per transaction when a backlog is waiting.
/// </summary>
/// <remarks>
/// On stop (SIGTERM, Ctrl-C) the group in hand is finished or, if it was not yet committed, abandoned
/// untouched: its files stay in the inbox and are taken again at the next start.
/// </remarks>
public sealed class InboxService(
    IngestPipeline pipeline,
    CatalogSource catalog,
    DataFolders folders,
    IOptions<IntakeOptions> intake,
    TimeProvider time,
    ILogger<InboxService> logger) : BackgroundService
{
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        var options = intake.Value;
        catalog.Watch();
        using var watcher = new InboxWatcher(
            new InboxOptions(folders.Inbox, TimeSpan.FromSeconds(options.SettleSeconds), TimeSpan.FromSeconds(options.RescanSeconds)),
            time);
        watcher.Start();
        logger.LogInformation("Watching {Inbox} (settle {Settle} s, rescan {Rescan} s)", folders.Inbox, options.SettleSeconds, options.RescanSeconds);
        LogIgnored(watcher);

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
            }
            catch (StoreException e)
            {
                logger.LogError(e, "The database refused a group of {Count} files; they stay in the inbox and are tried again", ready.Count);
                await Task.Delay(TimeSpan.FromSeconds(options.RescanSeconds), time, stoppingToken).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
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
