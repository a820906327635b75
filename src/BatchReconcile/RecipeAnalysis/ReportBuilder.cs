using BatchReconcile.Analysis.Trends;
using BatchReconcile.Cli;
using BatchReconcile.Digest.Model.Report;
using BatchReconcile.Pipeline;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Queries;

namespace BatchReconcile.RecipeAnalysis;

/// <summary>Gathers the analysis report of one recipe over a period from the store (docs/analysis.md, "The report").</summary>
public static class ReportBuilder
{
    /// <summary>The plain sentence of every run rule, as the statistics library words it (without the full stop, for legends).</summary>
    public static IReadOnlyDictionary<string, string> RuleDescriptions { get; } =
        RunRules.Codes.ToDictionary(c => c, c => RunRules.Describe(c).TrimEnd('.'), StringComparer.Ordinal);

    public static ReportData Build(BatchStore store, CatalogSource? catalog, string siteName, DateTimeOffset now, string recipe, DateOnly? from, DateOnly? to)
    {
        ArgumentNullException.ThrowIfNull(store);
        var codes = TrendCommand.RequireStep(store, recipe, null);
        var steps = codes.Select(c => (Code: c, Name: StepName(catalog, recipe, c))).ToList();
        var rows = store.StepsOfRecipe(recipe, from, to, null, StepParts.Figures);
        var versions = rows.Select(r => r.RecipeVersion).Distinct().Order().ToList();
        // Over a change of recipe version the charts follow the newest version with its own baseline, once it has batches
        // enough for a full default baseline; until then every batch of the period is charted (docs/analysis.md).
        int? charted = versions.Count >= 2
            && rows.Where(r => r.RecipeVersion == versions[^1]).Select(r => r.BatchId).Distinct(StringComparer.Ordinal).Count() >= BaselineChoice.DefaultCount
            ? versions[^1] : null;

        var trends = steps.Select(s =>
        {
            var trend = TrendBuilder.Build(s.Code, s.Name, StepMeasure.Yield, store.StepSeries(recipe, s.Code, StepMeasure.Yield, from, to, charted), BaselineChoice.Default);
            // The master-record limits stored with the latest batch of the step (never today's definitions).
            var latest = rows.LastOrDefault(r => r.Outcome.Step == s.Code);
            return trend with { SpecMin = latest?.Outcome.Limits.YieldMinPct, SpecMax = latest?.Outcome.Limits.YieldMaxPct };
        }).ToList();

        var comparison = versions.Count >= 2 ? CompareCommand.Compare(store, recipe, steps, from, to, versions[^2], versions[^1]) : null;
        return new ReportData(siteName, recipe, from, to, now, trends, LossBuilder.Build(store.LossTotalsOfRecipe(recipe, from, to)), comparison)
        {
            RuleDescriptions = RuleDescriptions,
            Versions = versions,
            ChartedVersion = charted,
        };
    }

    /// <summary>The step's name from the newest definitions that still have it; its code when none do (it is only a label).</summary>
    public static string StepName(CatalogSource? catalog, string recipe, string step) =>
        catalog?.Current.Recipes
            .Where(r => string.Equals(r.Code, recipe, StringComparison.OrdinalIgnoreCase))
            .OrderByDescending(r => r.Version)
            .Select(r => r.FindStep(step)?.Name)
            .FirstOrDefault(n => n is not null) ?? step;
}
