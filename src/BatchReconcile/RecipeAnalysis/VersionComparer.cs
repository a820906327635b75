using System.Globalization;
using BatchReconcile.Analysis.Statistics;
using BatchReconcile.Digest.Model.Report;
using BatchReconcile.Digest.Rendering.Report;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Storage.Queries;

namespace BatchReconcile.RecipeAnalysis;

/// <summary>Two recipe versions side by side, per step and for the route (docs/analysis.md, "Compare").</summary>
public static class VersionComparer
{
    /// <summary>A group smaller than this gives no conclusion.</summary>
    public const int MinBatches = 3;

    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <param name="rows">The current step rows of the recipe in the period (any versions; others than the two are ignored).</param>
    /// <param name="steps">The recipe's steps in order, each with a name for the report.</param>
    /// <param name="links">Each batch's step links (null for a revision stored before links were kept): the intermediate charged per step.</param>
    public static VersionComparison Build(
        IReadOnlyList<RecipeStepRow> rows, IReadOnlyList<(string Code, string Name)> steps, IReadOnlyDictionary<string, IReadOnlyList<IntermediateLink>?> links,
        int versionA, int versionB)
    {
        ArgumentNullException.ThrowIfNull(rows);
        ArgumentNullException.ThrowIfNull(steps);
        ArgumentNullException.ThrowIfNull(links);
        var scopes = new List<ComparisonScope>();
        foreach (var (code, name) in steps)
        {
            var a = rows.Where(r => r.RecipeVersion == versionA && r.Outcome.Step == code && r.Outcome.HasRows).ToList();
            var b = rows.Where(r => r.RecipeVersion == versionB && r.Outcome.Step == code && r.Outcome.HasRows).ToList();
            scopes.Add(Scope(code, name, StepFigures(versionA, a), StepFigures(versionB, b), Yields(a), Yields(b), versionA, versionB));
        }

        var routeA = Batches(rows, versionA);
        var routeB = Batches(rows, versionB);
        var codes = steps.Select(s => s.Code).ToList();
        scopes.Add(Scope(
            "route", "whole route",
            RouteFiguresOf(versionA, routeA, codes, links), RouteFiguresOf(versionB, routeB, codes, links),
            RouteYields(routeA), RouteYields(routeB), versionA, versionB));
        return new VersionComparison(versionA, versionB, scopes);
    }

    /// <summary>The plain sentence under a scope: too few batches, no variation, or what Welch's test says at the 5 % level.</summary>
    public static string Conclusion(int nA, int nB, WelchTest? test, int versionA, int versionB)
    {
        if (nA < MinBatches || nB < MinBatches)
        {
            return string.Create(Inv, $"{HtmlReportRenderer.TooFew}: v{versionA} has {nA}, v{versionB} has {nB} batch(es) with a yield");
        }

        if (test is null)
        {
            return "no variation within either version: Welch's test does not apply";
        }

        var p = HtmlReportRenderer.P(test.PValue);
        return test.PValue < 0.05
            ? string.Create(Inv, $"the mean yield of v{versionB} differs from v{versionA} at the 5 % level: {(test.Difference > 0 ? "+" : "")}{test.Difference:F2} % (95 % interval {test.Low:F2} to {test.High:F2}), p = {p}")
            : string.Create(Inv, $"no difference in mean yield shown at the 5 % level (p = {p})");
    }

    private static ComparisonScope Scope(string code, string name, VersionFigures a, VersionFigures b, List<double> ya, List<double> yb, int va, int vb)
    {
        var test = ya.Count >= 2 && yb.Count >= 2 ? WelchTest.Compare(ya, yb) : null;
        var difference = test is null ? null : new YieldDifference(test.Difference, test.Low, test.High, test.T, test.DegreesOfFreedom, test.PValue);
        return new ComparisonScope(code, name, a, b, difference, Conclusion(ya.Count, yb.Count, test, va, vb));
    }

    private static List<double> Yields(IEnumerable<RecipeStepRow> rows) => rows.Where(r => r.Outcome.YieldPct is not null).Select(r => r.Outcome.YieldPct!.Value).ToList();

    private static VersionFigures StepFigures(int version, List<RecipeStepRow> rows)
    {
        var y = Mean(Yields(rows));
        var withSolvent = rows.Where(r => r.Outcome.SolventInKg is not null).ToList();
        var massIn = withSolvent.Sum(r => r.Outcome.MassInKg);
        return new VersionFigures(
            version, rows.Count, y?.Mean, y?.Low, y?.High,
            Avg(rows.Select(r => (double?)r.Outcome.AtomEconomyPct)),
            Avg(rows.Select(r => r.Outcome.RmePct)),
            Avg(rows.Select(r => r.Outcome.Pmi)),
            Avg(rows.Select(r => r.Outcome.CompleteEFactor)),
            Avg(rows.Select(r => r.Outcome.SimpleEFactor)),
            withSolvent.Count > 0 && massIn > 0 ? 100 * withSolvent.Sum(r => r.Outcome.SolventInKg!.Value) / massIn : null,
            rows.Count > 0 ? 100.0 * rows.Count(r => r.OpenFlags > 0) / rows.Count : null);
    }

    private static List<List<RecipeStepRow>> Batches(IReadOnlyList<RecipeStepRow> rows, int version) =>
        rows.Where(r => r.RecipeVersion == version).GroupBy(r => r.BatchId, StringComparer.Ordinal).Select(g => g.ToList()).ToList();

    private static List<double> RouteYields(List<List<RecipeStepRow>> batches) =>
        batches.Where(b => b[0].Route.YieldPct is not null).Select(b => b[0].Route.YieldPct!.Value).ToList();

    private static VersionFigures RouteFiguresOf(int version, List<List<RecipeStepRow>> batches, List<string> codes, IReadOnlyDictionary<string, IReadOnlyList<IntermediateLink>?> links)
    {
        var y = Mean(RouteYields(batches));
        var masses = batches.Select(b => Masses(b, codes, links.GetValueOrDefault(b[0].BatchId))).ToList();
        var solventKnown = batches.Where(b => b.All(r => r.Outcome.SolventInKg is not null)).ToList();
        var solventIn = solventKnown.Sum(b => b.Sum(r => r.Outcome.MassInKg));
        return new VersionFigures(
            version, batches.Count, y?.Mean, y?.Low, y?.High, null, null,
            Avg(masses.Select(m => m is null ? null : RouteFigures.CumulativePmi(m))),
            Avg(masses.Select(m => m is null ? null : RouteFigures.CompleteEFactor(m))),
            null,
            solventKnown.Count > 0 && solventIn > 0 ? 100 * solventKnown.Sum(b => b.Sum(r => r.Outcome.SolventInKg!.Value)) / solventIn : null,
            batches.Count > 0 ? 100.0 * batches.Count(b => b.Any(r => r.OpenFlags > 0)) / batches.Count : null);
    }

    /// <summary>The batch's steps in recipe order with the intermediate each charged; null when a step is missing or the links are unknown.</summary>
    public static IReadOnlyList<RouteStepMass>? Masses(IReadOnlyList<RecipeStepRow> batch, IReadOnlyList<string> codes, IReadOnlyList<IntermediateLink>? links)
    {
        if (links is null)
        {
            return null;
        }

        var list = new List<RouteStepMass>();
        for (var k = 0; k < codes.Count; k++)
        {
            var row = batch.FirstOrDefault(r => r.Outcome.Step == codes[k]);
            if (row is null || !row.Outcome.HasRows)
            {
                return null;
            }

            var charged = k == 0 ? 0 : links.Where(l => l.ToStep == codes[k] && l.FromStep == codes[k - 1]).Sum(l => l.ChargedKg);
            list.Add(new RouteStepMass(codes[k], row.Outcome.MassInKg, row.Outcome.RecoveredKg, row.Outcome.ActualKg, charged));
        }

        return list;
    }

    private static MeanEstimate? Mean(List<double> values) => values.Count == 0 ? null : MeanEstimate.Of(values);

    private static double? Avg(IEnumerable<double?> values)
    {
        var known = values.OfType<double>().ToList();
        return known.Count == 0 ? null : known.Average();
    }
}
