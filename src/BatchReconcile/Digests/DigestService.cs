using BatchReconcile.Reconciliation.ProductionDays;
using BatchReconcile.Storage;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;

namespace BatchReconcile.Digests;

/// <summary>
/// Part of <c>run</c>: writes each production day's digest once it falls due, and on start the digests
/// missed while the service was down (at most <c>Site:DigestCatchUpDays</c> days back). Between due times it
/// looks every <see cref="StaleCheckInterval"/> for days whose digest no longer shows what the store holds (a
/// late batch, a re-export, a review decision) and rewrites them (<see cref="DigestWriter.RewriteStale"/>);
/// <c>digest --day</c> rewrites on request.
/// </summary>
public sealed class DigestService(
    DigestWriter writer,
    DigestSchedule schedule,
    BatchStore store,
    TimeProvider time,
    ILogger<DigestService> logger) : BackgroundService
{
    /// <summary>The name recorded for writes made by the schedule.</summary>
    public const string By = "system";

    /// <summary>How often the service looks for stale digests: one indexed query that returns only stale days.</summary>
    public static readonly TimeSpan StaleCheckInterval = TimeSpan.FromSeconds(2);

    /// <summary>After a failed pass (a full disk, a folder not writable) the next one waits this long, so the log is not flooded.</summary>
    public static readonly TimeSpan RetryAfterFailure = TimeSpan.FromMinutes(1);

    /// <summary>After a pass refused by the database (locked, full, read-only) the next one waits this long.</summary>
    public static readonly TimeSpan RetryAfterStoreFault = TimeSpan.FromSeconds(10);

    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        while (!stoppingToken.IsCancellationRequested)
        {
            var now = time.GetUtcNow();
            var interval = StaleCheckInterval;
            try
            {
                Pass(now);
            }
            catch (Exception e) when (StoreFaults.ReasonOf(e) is { } reason)
            {
                // A fault of the database (a lock held past the busy timeout, a full disk): expected, said in one
                // line without a stack trace, and tried again soon; the digests stay stale meanwhile, not lost.
                logger.LogWarning("Writing a due or stale digest waits for the database: {Reason}; tried again in {Seconds} s", reason, RetryAfterStoreFault.TotalSeconds);
                interval = RetryAfterStoreFault;
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException or StoreException or System.Data.Common.DbException)
            {
                logger.LogError(e, "Writing a due or stale digest failed; it is tried again in {Minutes} minute(s) or at the next due time", RetryAfterFailure.TotalMinutes);
                interval = RetryAfterFailure;
            }

            var untilDue = schedule.NextDue(now) - time.GetUtcNow();
            var wait = untilDue < interval ? untilDue : interval;
            try
            {
                await Task.Delay(wait > TimeSpan.Zero ? wait : TimeSpan.FromSeconds(1), time, stoppingToken);
            }
            catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested)
            {
                break;
            }
        }
    }

    /// <summary>One pass of the service: the digests due at <paramref name="now"/>, then the stale ones rewritten.</summary>
    public IReadOnlyList<DigestWriteResult> Pass(DateTimeOffset now) => [.. WriteDue(now), .. writer.RewriteStale()];

    /// <summary>Writes every digest due at <paramref name="now"/> and not yet written, oldest first.</summary>
    public IReadOnlyList<DigestWriteResult> WriteDue(DateTimeOffset now)
    {
        var lastComplete = schedule.LastCompleteDay(now);
        var written = store.DigestDays(lastComplete.AddDays(-schedule.CatchUpDays), lastComplete).ToHashSet();
        return schedule.DueDays(now, written).Select(day => writer.Write(day, rewrite: false, By)).ToList();
    }
}
