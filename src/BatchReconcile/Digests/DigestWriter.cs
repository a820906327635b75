using System.Globalization;
using BatchReconcile.Digest.Files;
using BatchReconcile.Digest.Model;
using BatchReconcile.Digest.Rendering;
using BatchReconcile.Hosting;
using BatchReconcile.Intake.Archive;
using BatchReconcile.Pipeline;
using BatchReconcile.Reconciliation.ProductionDays;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Queries;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Options;
using DigestFlaggedStep = BatchReconcile.Digest.Model.FlaggedStep;

namespace BatchReconcile.Digests;

/// <summary>The result of writing one day's digest.</summary>
/// <param name="Written">False when the day already had a digest and no rewrite was asked for.</param>
public sealed record DigestWriteResult(DateOnly Day, bool Written, bool Rewrite, IReadOnlyList<string> Files, int Flags, string? Refusal);

/// <summary>
/// Writes a production day's digest: gathers the day from the store, renders HTML, Markdown and CSV into
/// the digests folder (each file written whole, then renamed into place), and records the write in the
/// store and its audit trail.
/// </summary>
public sealed class DigestWriter(
    BatchStore store,
    CatalogSource catalog,
    ProductionDayCalendar calendar,
    DataFolders folders,
    IOptions<SiteOptions> site,
    TimeProvider time,
    ILogger<DigestWriter> logger)
{
    /// <param name="rewrite">Write even when the day has a digest already (the rewrite is recorded and logged).</param>
    /// <param name="by">Who asked: "service" for the schedule, otherwise a name.</param>
    public DigestWriteResult Write(DateOnly day, bool rewrite, string by)
    {
        var existing = store.GetDigest(day);
        if (existing is not null && !rewrite)
        {
            return new DigestWriteResult(day, false, false, existing.Latest.Files, existing.Latest.FlagCount, "already written");
        }

        var data = Gather(day);
        var names = DigestFileNames.For(day, site.Value.Name);
        var files = new[]
        {
            (names.Html, HtmlDigestRenderer.Render(data)),
            (names.Markdown, MarkdownDigestRenderer.Render(data)),
            (names.Csv, CsvExceptionList.Render(data)),
        };
        var paths = new List<string>();
        foreach (var (name, text) in files)
        {
            var path = Path.Combine(folders.Digests, name);
            FileMover.WriteAtomically(path, text);
            paths.Add(path);
        }

        var record = store.RecordDigest(day, paths, data.Exceptions.Count, existing is not null, by);
        if (!record.Recorded)
        {
            return new DigestWriteResult(day, false, false, paths, data.Exceptions.Count, record.Refusal);
        }

        // The day as ISO text: a DateOnly would be rendered by the logger as MM/dd/yyyy.
        var dayText = day.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);
        if (existing is not null)
        {
            logger.LogWarning("Digest of {Day} rewritten at the request of {By} ({Flags} flags): {Files}", dayText, by, data.Exceptions.Count, paths);
        }
        else
        {
            logger.LogInformation("Digest of {Day} written ({Flags} flags): {Files}", dayText, data.Exceptions.Count, paths);
        }

        return new DigestWriteResult(day, true, existing is not null, paths, data.Exceptions.Count, null);
    }

    /// <summary>Everything the digest shows about a day, from the store.</summary>
    public DigestData Gather(DateOnly day)
    {
        var (start, end) = calendar.Bounds(day);
        var counts = store.CountsByDay(day);
        var exceptions = store.ListFlags(day).Select(f => new DigestException(
            f.Id, f.Severity, f.BatchId, f.Revision, f.Recipe, f.Step, f.Code, f.Measured, f.Limit, f.Unit, f.Message,
            new ReviewStatus(f.Review.State, f.Review.Outcome), f.Subject)).ToList();
        var earlier = store.UnresolvedFlagsBefore(day);
        var openEarlier = earlier.Select(f => new OpenFlagItem(
            f.Id, f.BatchId, f.Step, f.Code, f.Severity, f.ProductionDay, day.DayNumber - f.ProductionDay.DayNumber,
            new ReviewStatus(f.Review.State, f.Review.Outcome))).ToList();
        var flagged = store.FlaggedStepsOfDay(day).Select(ToDigest).ToList();
        var yields = store.RecipeStepsOfDay(day).Select(key => Yields(key, day)).OfType<RecipeStepYields>().ToList();

        return new DigestData(
            site.Value.Name,
            new DigestDay(day, calendar.Zone.Id, start, end),
            time.GetUtcNow(),
            counts.Batches,
            counts.StepsReconciled,
            earlier.Count,
            openEarlier,
            exceptions,
            flagged,
            yields)
        {
            RouteYields = store.ListBatches(day)
                .Where(b => b.StepCount > 1)
                .Select(b => new BatchRouteYield(b.BatchId, b.Revision, b.Recipe, b.RouteYieldPct, b.RouteNote))
                .ToList(),
        };
    }

    /// <summary>The step as stored: its figures and the limits it was judged by (never today's definitions).</summary>
    private static DigestFlaggedStep ToDigest(Storage.Queries.FlaggedStep f) =>
        new(f.BatchId, f.Revision, f.Recipe, f.Step.Outcome) { RecipeVersion = f.RecipeVersion, RecipeVersionSource = f.RecipeVersionSource };

    /// <summary>A recipe step's yields of the last batches up to the day, against the limits stored with the latest of them.</summary>
    private RecipeStepYields? Yields(RecipeStepKey key, DateOnly day)
    {
        var points = store.StepHistory(key.Recipe, key.Step, RecipeStepYields.MaxHistory, day);
        if (points.Count == 0)
        {
            return null;
        }

        // The step's name is only a label: from the definitions when they still have the step, else its code.
        var name = catalog.Current.Recipes
            .Where(r => string.Equals(r.Code, key.Recipe, StringComparison.OrdinalIgnoreCase))
            .OrderByDescending(r => r.Version)
            .Select(r => r.FindStep(key.Step)?.Name)
            .FirstOrDefault(n => n is not null) ?? key.Step;
        var latest = points[^1];
        var history = points.Select(p => new YieldPoint(p.BatchId, p.ProductionDay, p.YieldPct, p.ProductionDay == day)).ToList();
        return new RecipeStepYields(key.Recipe, key.Step, name, latest.YieldMinPct, latest.YieldMaxPct, history);
    }
}
