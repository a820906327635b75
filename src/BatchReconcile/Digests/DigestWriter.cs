using System.Globalization;
using BatchReconcile.Digest.Files;
using BatchReconcile.Digest.Model;
using BatchReconcile.Digest.Rendering;
using BatchReconcile.Hosting;
using BatchReconcile.Intake.Archive;
using BatchReconcile.Pipeline;
using BatchReconcile.Reconciliation.ProductionDays;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Digests;
using BatchReconcile.Storage.Queries;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Options;
using DigestFlaggedStep = BatchReconcile.Digest.Model.FlaggedStep;

namespace BatchReconcile.Digests;

/// <summary>The result of writing one day's digest.</summary>
/// <param name="Written">False when the day already had a digest and no rewrite was asked for.</param>
/// <param name="Issue">The issue number of the day's digest written (1 first, 2 the first rewrite); 0 when nothing was recorded (or provisional).</param>
/// <param name="Reason">Why a rewrite was written; null for a first issue.</param>
/// <param name="Kept">Where the replaced issue's files are kept (numbered).</param>
public sealed record DigestWriteResult(DateOnly Day, bool Written, bool Rewrite, IReadOnlyList<string> Files, int Flags, string? Refusal)
{
    public int Issue { get; init; }

    public string? Reason { get; init; }

    public IReadOnlyList<string> Kept { get; init; } = [];

    public bool Provisional { get; init; }
}

/// <summary>
/// Writes a production day's digest: gathers the day from the store, renders HTML, Markdown and CSV into
/// the digests folder (each file written whole, then renamed into place), and records the write in the
/// store and its audit trail. A rewrite keeps the issue it replaces under numbered names and says at its top
/// what it replaces, when that was written and why.
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
    /// <param name="by">Who asked: "system" for the schedule and the freshness rewrites, otherwise a name.</param>
    public DigestWriteResult Write(DateOnly day, bool rewrite, string by)
    {
        var existing = store.GetDigest(day);
        if (existing is not null && !rewrite)
        {
            return new DigestWriteResult(day, false, false, existing.Latest.Files, existing.Latest.FlagCount, "already written") { Issue = existing.Writes.Count };
        }

        // The counts are read before the day is gathered: a change stored meanwhile makes the day stale again, never hidden.
        var seen = store.DayChangesOf(day);
        var issue = existing is null ? null : new DigestIssue(
            existing.Writes.Count + 1,
            TimeZoneInfo.ConvertTime(existing.Latest.WrittenAt, calendar.Zone),
            RewriteReason.Of(seen.Since(existing.Latest.Seen ?? DayChanges.None), by));
        var data = Gather(day) with { Reissue = issue };
        var names = DigestFileNames.For(day, site.Value.Name);
        var texts = Render(data, names);
        var paths = names.All.Select(n => Path.Combine(folders.Digests, n)).ToList();
        var kept = new List<string>();

        void WriteFiles()
        {
            if (existing is not null)
            {
                kept.AddRange(KeepEarlier(names, existing.Writes.Count));
            }

            foreach (var (path, text) in paths.Zip(texts))
            {
                FileMover.WriteAtomically(path, text);
            }
        }

        var record = store.RecordDigest(new DigestWriteRequest(day, paths, data.Exceptions.Count, existing is not null, by)
        {
            Seen = seen,
            Reason = issue?.Reason,
            Kept = kept,
            ExpectedEarlierWrites = existing?.Writes.Count ?? 0,
            WriteFiles = WriteFiles,
        });
        if (!record.Recorded)
        {
            return new DigestWriteResult(day, false, false, paths, data.Exceptions.Count, record.Refusal);
        }

        // The day as ISO text: a DateOnly would be rendered by the logger as MM/dd/yyyy.
        var dayText = day.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);
        if (issue is not null)
        {
            logger.LogWarning(
                "Digest of {Day} rewritten as issue {Issue} ({Flags} flags): {Reason}; earlier issue kept as {Kept}; {Files}",
                dayText, issue.Number, data.Exceptions.Count, issue.Reason, kept, paths);
        }
        else
        {
            logger.LogInformation("Digest of {Day} written ({Flags} flags): {Files}", dayText, data.Exceptions.Count, paths);
        }

        return new DigestWriteResult(day, true, issue is not null, paths, data.Exceptions.Count, null)
        {
            Issue = record.Write!.Issue,
            Reason = issue?.Reason,
            Kept = kept,
        };
    }

    /// <summary>
    /// A digest of a day that has not ended yet: titled provisional, written under the day's provisional names
    /// (replacing an earlier provisional one) and not recorded, so the schedule still writes the day's digest when due.
    /// </summary>
    public DigestWriteResult WriteProvisional(DateOnly day, string by)
    {
        var data = Gather(day) with { Provisional = true };
        var names = DigestFileNames.ProvisionalFor(day, site.Value.Name);
        var paths = names.All.Select(n => Path.Combine(folders.Digests, n)).ToList();
        foreach (var (path, text) in paths.Zip(Render(data, names)))
        {
            FileMover.WriteAtomically(path, text);
        }

        logger.LogInformation(
            "Provisional digest of {Day} written at the request of {By} ({Flags} flags so far; not the day's digest): {Files}",
            day.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), by, data.Exceptions.Count, paths);
        return new DigestWriteResult(day, true, false, paths, data.Exceptions.Count, null) { Provisional = true };
    }

    /// <summary>
    /// Rewrites every day whose digest no longer shows what the store holds (one cheap query finds them), oldest first.
    /// A day another process rewrote meanwhile is left to it.
    /// </summary>
    public IReadOnlyList<DigestWriteResult> RewriteStale()
    {
        var results = new List<DigestWriteResult>();
        foreach (var day in store.StaleDigestDays())
        {
            var result = Write(day, rewrite: true, DigestService.By);
            if (result.Written)
            {
                results.Add(result);
            }
        }

        return results;
    }

    private static IReadOnlyList<string> Render(DigestData data, DigestFileNames names) =>
    [
        HtmlDigestRenderer.Render(data),
        MarkdownDigestRenderer.Render(data),
        CsvExceptionList.Render(data),
    ];

    /// <summary>Moves the current files of the day (issue <paramref name="issue"/>) to their numbered names; returns where they went.</summary>
    private List<string> KeepEarlier(DigestFileNames names, int issue)
    {
        var kept = new List<string>();
        foreach (var (current, numbered) in names.All.Zip(names.Numbered(issue).All))
        {
            var from = Path.Combine(folders.Digests, current);
            if (!File.Exists(from))
            {
                continue;
            }

            // A numbered file already there (left by hand, or by a write that failed before it was recorded) is never overwritten.
            var to = Path.Combine(folders.Digests, numbered);
            for (var n = 1; File.Exists(to); n++)
            {
                to = Path.Combine(folders.Digests, Path.GetFileNameWithoutExtension(numbered) + "-" + n.ToString(CultureInfo.InvariantCulture) + Path.GetExtension(numbered));
            }

            File.Move(from, to);
            kept.Add(to);
        }

        return kept;
    }

    /// <summary>Everything the digest shows about a day, from the store.</summary>
    public DigestData Gather(DateOnly day)
    {
        var (start, end) = calendar.Bounds(day);
        var counts = store.CountsByDay(day);
        var exceptions = store.ListFlags(day).Select(f => new DigestException(
            f.Id, f.Severity, f.BatchId, f.Revision, f.Recipe, f.Step, f.Code, f.Measured, f.Limit, f.Unit, f.Message,
            new ReviewStatus(f.Review.State, f.Review.Outcome, f.Review.DeviationRef, f.Review.By), f.Subject)).ToList();
        var earlier = store.UnresolvedFlagsBefore(day);
        var openEarlier = earlier.Select(f => new OpenFlagItem(
            f.Id, f.BatchId, f.Step, f.Code, f.Severity, f.ProductionDay, day.DayNumber - f.ProductionDay.DayNumber,
            new ReviewStatus(f.Review.State, f.Review.Outcome, f.Review.DeviationRef, f.Review.By))).ToList();
        var histories = new Dictionary<(string Recipe, string Step), IReadOnlyList<StepHistoryPoint>>();
        IReadOnlyList<StepHistoryPoint> History(string recipe, string step)
        {
            if (!histories.TryGetValue((recipe, step), out var points))
            {
                points = store.StepHistory(recipe, step, RecipeStepYields.MaxHistory, day);
                histories[(recipe, step)] = points;
            }

            return points;
        }

        var flagged = store.FlaggedStepsOfDay(day)
            .Select(f => ToDigest(f) with { Trend = DigestTrends.Note(History(f.Recipe, f.Step.Outcome.Step), f.BatchId) })
            .ToList();
        var yields = store.RecipeStepsOfDay(day).Select(key => Yields(key, day, History(key.Recipe, key.Step))).OfType<RecipeStepYields>().ToList();

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
    private RecipeStepYields? Yields(RecipeStepKey key, DateOnly day, IReadOnlyList<StepHistoryPoint> points)
    {
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
        var signals = DigestTrends.Signals(points);
        var history = points.Select((p, i) => new YieldPoint(p.BatchId, p.ProductionDay, p.YieldPct, p.ProductionDay == day) { Signals = signals[i] }).ToList();
        return new RecipeStepYields(key.Recipe, key.Step, name, latest.YieldMinPct, latest.YieldMaxPct, history);
    }
}
