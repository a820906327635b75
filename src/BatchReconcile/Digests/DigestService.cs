using BatchReconcile.Reconciliation.ProductionDays;
using BatchReconcile.Storage;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;

namespace BatchReconcile.Digests;

/// <summary>
/// Part of <c>run</c>: writes each production day's digest once it falls due, and on start the digests
/// missed while the service was down (at most <c>Site:DigestCatchUpDays</c> days back). A day with a
/// digest already is never written again by the schedule; <c>digest --day</c> rewrites on request.
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

    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        while (!stoppingToken.IsCancellationRequested)
        {
            var now = time.GetUtcNow();
            try
            {
                WriteDue(now);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException or StoreException)
            {
                logger.LogError(e, "Writing a due digest failed; it is tried again at the next due time");
            }

            var wait = schedule.NextDue(now) - time.GetUtcNow();
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

    /// <summary>Writes every digest due at <paramref name="now"/> and not yet written, oldest first.</summary>
    public IReadOnlyList<DigestWriteResult> WriteDue(DateTimeOffset now)
    {
        var lastComplete = schedule.LastCompleteDay(now);
        var written = store.DigestDays(lastComplete.AddDays(-schedule.CatchUpDays), lastComplete).ToHashSet();
        return schedule.DueDays(now, written).Select(day => writer.Write(day, rewrite: false, By)).ToList();
    }
}
