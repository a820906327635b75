using System.CommandLine;
using System.Globalization;
using BatchReconcile.Records;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Queries;
using Microsoft.Extensions.DependencyInjection;

namespace BatchReconcile.Cli;

/// <summary>
/// <c>batches show BATCH [--revision N] [--json]</c>: a stored batch, its steps and flags;
/// <c>batches list [--from D] [--to D] [--recipe CODE] [--flagged] [--json]</c>: current revisions in production order.
/// </summary>
public static class BatchesCommand
{
    public static Command Create(GlobalOptions globals, TextWriter stdout)
    {
        var batchId = new Argument<string>("BATCH") { Description = "Batch identifier, e.g. KB3-BZ-0412" };
        var revision = new Option<int?>("--revision") { Description = "A given revision instead of the latest" };
        var json = new Option<bool>("--json") { Description = "Print one JSON document on stdout" };
        var show = new Command("show", "The latest (or a given) revision of a stored batch: every step's figures and flags") { batchId, revision, json };
        show.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            var store = host.Services.GetRequiredService<BatchStore>();
            var id = parse.GetRequiredValue(batchId);
            var rev = parse.GetValue(revision);
            var view = store.GetBatch(id, rev)
                ?? throw new UsageException(rev is null ? $"batch '{id}' is not stored" : $"batch '{id}' has no revision {rev}");
            if (parse.GetValue(json))
            {
                JsonOutput.Write(stdout, BatchJson.From(view));
                return ExitCodes.Success;
            }

            var state = view.IsCurrent
                ? string.Create(CultureInfo.InvariantCulture, $", revision {view.Revision} of {view.RevisionCount}")
                : string.Create(CultureInfo.InvariantCulture, $", revision {view.Revision} of {view.RevisionCount} (superseded by {view.SupersededByRevision})");
            BatchText.Write(
                stdout,
                BatchText.Header(view.BatchId, view.Recipe, view.RecipeVersion, view.RecipeVersionSource, view.ProductionDay, state),
                [$"from {view.SourceFile}"],
                view.Steps.Select(s => (s.Outcome, (IReadOnlyList<(Reconciliation.Flags.Flag, long?)>)s.Flags.Select(f => (f.Flag, (long?)f.Id)).ToList())));
            BatchText.WriteRoute(stdout, view.Route, view.Links);
            return ExitCodes.Success;
        }, storeOnly: true));

        return new Command("batches", "Stored batches") { show, List(globals, stdout) };
    }

    private static Command List(GlobalOptions globals, TextWriter stdout)
    {
        var history = new HistoryOptions();
        var flagged = new Option<bool>("--flagged") { Description = "Only batches with a flag not yet closed (open or in review)" };
        var json = new Option<bool>("--json") { Description = "Print one JSON document on stdout" };
        var list = new Command("list", "Current batch revisions in production order: day, recipe and version, steps, route yield, open flags") { flagged, json };
        history.AddTo(list);
        list.SetAction(parse => HostedCommand.Run(parse, globals, service: false, host =>
        {
            var (from, to) = history.Days(parse);
            var sites = HostedCommand.Sites(host);
            var across = host.Services.GetRequiredService<Hosting.AppContextOptions>().IsAllSites;
            var recipe = sites.Count == 1 ? history.KnownRecipe(parse, sites[0].Store) : parse.GetValue(history.Recipe)?.Trim();
            var batches = new List<BatchSummary>();
            var siteOf = new List<string>();
            foreach (var (site, store, owned) in sites)
            {
                var found = store.ListBatches(new BatchFilter(from, to, recipe, parse.GetValue(flagged)));
                batches.AddRange(found);
                siteOf.AddRange(found.Select(_ => site));
                if (owned)
                {
                    store.Dispose();
                }
            }

            if (parse.GetValue(json))
            {
                JsonOutput.Write(stdout, batches.Select((b, i) => new BatchListJson(
                    b.BatchId, b.Revision, b.Recipe, b.RecipeVersion, b.ProductionDay.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture),
                    b.StepCount, BatchJson.RoundPct(b.RouteYieldPct), b.RouteYieldPct is null ? b.RouteNote : null, b.FlagCount, b.OpenFlagCount)
                    { Site = across ? siteOf[i] : null }).ToList());
                return ExitCodes.Success;
            }

            if (batches.Count == 0)
            {
                stdout.WriteLine($"no batches{(parse.GetValue(flagged) ? " with open flags" : string.Empty)}{HistoryOptions.Describe(recipe, from, to)}");
                return ExitCodes.Success;
            }

            TextTable.Write(
                stdout,
                across ? ["site", "day", "batch", "rev", "recipe", "steps", "route yield", "open flags"] : ["day", "batch", "rev", "recipe", "steps", "route yield", "open flags"],
                across ? [false, false, false, true, false, true, false, true] : [false, false, true, false, true, false, true],
                batches.Select((b, i) => (across ? new[] { SafeText.Escape(siteOf[i]) } : []).Concat(new[]
                {
                    b.ProductionDay.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture),
                    SafeText.Escape(b.BatchId),
                    b.Revision.ToString(CultureInfo.InvariantCulture),
                    string.Create(CultureInfo.InvariantCulture, $"{SafeText.Escape(b.Recipe)} v{b.RecipeVersion}"),
                    b.StepCount.ToString(CultureInfo.InvariantCulture),
                    b.RouteYieldPct is { } y ? y.ToString("F2", CultureInfo.InvariantCulture) + " %" : "not computable: " + SafeText.Escape(b.RouteNote ?? "no reason stored"),
                    string.Create(CultureInfo.InvariantCulture, $"{b.OpenFlagCount} of {b.FlagCount}"),
                }).ToArray()).ToList());
            stdout.WriteLine(string.Create(CultureInfo.InvariantCulture, $"{batches.Count} batch{(batches.Count == 1 ? "" : "es")}"));
            return ExitCodes.Success;
        }, storeOnly: true, acrossSites: true));
        return list;
    }

    /// <summary>One line of <c>batches list --json</c>; <c>routeYieldNote</c> says why <c>routeYieldPct</c> is null.</summary>
    /// <remarks><c>site</c> only with <c>--site all</c>.</remarks>
    private sealed record BatchListJson(
        string Batch, int Revision, string Recipe, int RecipeVersion, string Day, int Steps, double? RouteYieldPct, string? RouteYieldNote, int Flags, int OpenFlags)
    {
        [System.Text.Json.Serialization.JsonIgnore(Condition = System.Text.Json.Serialization.JsonIgnoreCondition.WhenWritingNull)]
        public string? Site { get; init; }
    }
}
