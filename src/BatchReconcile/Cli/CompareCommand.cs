using System.CommandLine;
using System.Globalization;
using BatchReconcile.Digest.Model.Report;
using BatchReconcile.RecipeAnalysis;
using BatchReconcile.Records;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Queries;
using Microsoft.Extensions.DependencyInjection;

namespace BatchReconcile.Cli;

/// <summary><c>compare --recipe CODE --versions 1,2 [--from D] [--to D] [--json]</c>: two recipe versions side by side.</summary>
public static class CompareCommand
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    public static Command Create(GlobalOptions globals, TextWriter stdout)
    {
        var shared = new AnalysisOptions();
        var versions = new Option<string>("--versions") { Description = "The two recipe versions, earlier first, e.g. 1,2", Required = true };
        var command = new Command("compare", "Two recipe versions side by side, per step and for the route: yields with 95 % intervals, Welch's test, mass figures, open flags");
        shared.AddTo(command, json: false);
        command.Options.Add(versions);
        command.Options.Add(shared.Json);
        command.SetAction(parse =>
        {
            var recipe = shared.RecipeCode(parse);
            var (from, to) = shared.Period(parse);
            var (a, b) = ParseVersions(parse.GetRequiredValue(versions));
            return HostedCommand.Run(parse, globals, service: false, host =>
            {
                var store = host.Services.GetRequiredService<BatchStore>();
                var steps = TrendCommand.RequireStep(store, recipe, null);
                var comparison = Compare(store, recipe, steps.Select(s => (s, s)).ToList(), from, to, a, b);
                if (parse.GetValue(shared.Json))
                {
                    JsonOutput.Write(stdout, Json(recipe, from, to, comparison), AnalysisJson.Shared.CompareJson);
                }
                else
                {
                    Text(stdout, recipe, from, to, comparison);
                }

                return ExitCodes.Success;
            }, storeOnly: true);
        });
        return command;
    }

    /// <summary>The comparison from the store: the step rows without ladders (scalar figures only) and the batches' links.</summary>
    public static VersionComparison Compare(BatchStore store, string recipe, IReadOnlyList<(string Code, string Name)> steps, DateOnly? from, DateOnly? to, int a, int b)
    {
        var rows = store.StepsOfRecipe(recipe, from, to, null, StepParts.Figures).Where(r => r.RecipeVersion == a || r.RecipeVersion == b).ToList();
        var links = store.StepLinksOfRecipe(recipe, from, to);
        return VersionComparer.Build(rows, steps, links, a, b);
    }

    /// <summary>"1,2": two different whole numbers from 1; anything else is bad input naming the value.</summary>
    public static (int A, int B) ParseVersions(string text)
    {
        var parts = text.Split(',', StringSplitOptions.TrimEntries);
        if (parts.Length == 2
            && int.TryParse(parts[0], NumberStyles.None, Inv, out var a) && a >= 1
            && int.TryParse(parts[1], NumberStyles.None, Inv, out var b) && b >= 1)
        {
            return a != b ? (a, b) : throw new UsageException($"--versions '{SafeText.Escape(text)}': give two different versions, e.g. 1,2");
        }

        throw new UsageException($"--versions '{SafeText.Escape(SafeText.Prefix(text, 40))}' is not two recipe versions: write them as 1,2");
    }

    public static CompareJson Json(string recipe, DateOnly? from, DateOnly? to, VersionComparison c) => new(
        recipe, AnalysisOptions.Text(from), AnalysisOptions.Text(to), [c.VersionA, c.VersionB],
        c.Scopes.Select(s => new ScopeJson(
            s.Scope, s.Name, [Group(s.A), Group(s.B)],
            s.Difference is { } d ? new DifferenceJson(R(d.Difference), R(d.Low), R(d.High), R(d.T), R(d.DegreesOfFreedom), Rounding.To(d.PValue, 6)) : null,
            s.Conclusion.StartsWith(Digest.Rendering.Report.HtmlReportRenderer.TooFew, StringComparison.Ordinal),
            s.Conclusion)).ToList());

    private static GroupJson Group(VersionFigures f) => new(
        f.Version, f.Batches, R(f.MeanYieldPct), R(f.YieldLowPct), R(f.YieldHighPct), R(f.AtomEconomyPct), R(f.RmePct), R(f.Pmi),
        R(f.CompleteEFactor), R(f.SimpleEFactor), R(f.SolventSharePct), R(f.OpenFlagRatePct));

    private static void Text(TextWriter o, string recipe, DateOnly? from, DateOnly? to, VersionComparison c)
    {
        var a = "v" + c.VersionA.ToString(Inv);
        var b = "v" + c.VersionB.ToString(Inv);
        o.WriteLine($"compare recipe {SafeText.Escape(recipe)} {a} and {b}, {Digest.Rendering.Report.HtmlReportRenderer.Period(from, to)}");
        foreach (var s in c.Scopes)
        {
            o.WriteLine();
            o.WriteLine(s.Scope == "route" ? "  route (whole batch)" : $"  step {SafeText.Escape(s.Scope)}");
            o.WriteLine(string.Create(Inv, $"    {"",-30} {a,24} {b,24} {b + " - " + a,14}"));
            Line(o, "batches", s.A.Batches.ToString(Inv), s.B.Batches.ToString(Inv), "");
            Line(o, "mean yield % (95 % interval)", Yield(s.A), Yield(s.B), s.Difference is { } d ? Signed(d.Difference) : "n/a");
            if (s.Difference is { } w)
            {
                Line(o, "  Welch's test", "", "", string.Create(Inv, $"t {w.T:F2}, df {w.DegreesOfFreedom:F1}, p {Digest.Rendering.Report.HtmlReportRenderer.P(w.PValue)}"));
                Line(o, "  difference 95 % interval", "", "", string.Create(Inv, $"{w.Low:F2} to {w.High:F2}"));
            }

            Line(o, "atom economy %", N(s.A.AtomEconomyPct), N(s.B.AtomEconomyPct), D(s.A.AtomEconomyPct, s.B.AtomEconomyPct));
            Line(o, "RME %", N(s.A.RmePct), N(s.B.RmePct), D(s.A.RmePct, s.B.RmePct));
            Line(o, "PMI kg/kg", N(s.A.Pmi), N(s.B.Pmi), D(s.A.Pmi, s.B.Pmi));
            Line(o, "complete E-factor", N(s.A.CompleteEFactor), N(s.B.CompleteEFactor), D(s.A.CompleteEFactor, s.B.CompleteEFactor));
            Line(o, "simple E-factor", N(s.A.SimpleEFactor), N(s.B.SimpleEFactor), D(s.A.SimpleEFactor, s.B.SimpleEFactor));
            Line(o, "solvent share of mass in %", U(s.A.SolventSharePct), U(s.B.SolventSharePct), D(s.A.SolventSharePct, s.B.SolventSharePct));
            Line(o, "batches with open flags %", N(s.A.OpenFlagRatePct), N(s.B.OpenFlagRatePct), D(s.A.OpenFlagRatePct, s.B.OpenFlagRatePct));
            o.WriteLine($"    {s.Conclusion}");
        }

        o.WriteLine();
        o.WriteLine("  The figures support, not replace, the site's procedures and qualified review; batches of two versions differ in more than the recipe.");
    }

    private static void Line(TextWriter o, string name, string a, string b, string d) => o.WriteLine(string.Create(Inv, $"    {name,-30} {a,24} {b,24} {d,14}"));

    private static string Yield(VersionFigures f) => f.MeanYieldPct is not { } m ? "n/a"
        : f.YieldLowPct is { } lo && f.YieldHighPct is { } hi ? string.Create(Inv, $"{m:F2} ({lo:F2} to {hi:F2})") : string.Create(Inv, $"{m:F2} (n < 2)");

    private static string N(double? v) => v is { } x ? x.ToString("F2", Inv) : "n/a";

    private static string U(double? v) => v is { } x ? x.ToString("F2", Inv) : "unknown";

    private static string D(double? a, double? b) => a is { } x && b is { } y ? Signed(y - x) : "";

    private static string Signed(double v) => (v > 0 ? "+" : "") + v.ToString("F2", Inv);

    private static double R(double v) => Rounding.To(v, 4);

    private static double? R(double? v) => v is { } x ? R(x) : null;

    public sealed record CompareJson(string Recipe, string? From, string? To, IReadOnlyList<int> Versions, IReadOnlyList<ScopeJson> Scopes);

    /// <param name="TooFew">Either group has fewer than 3 batches: the conclusion says so and draws none.</param>
    public sealed record ScopeJson(string Scope, string Name, IReadOnlyList<GroupJson> Groups, DifferenceJson? Difference, bool TooFew, string Conclusion);

    /// <param name="SolventSharePct">Null when the batches' solvent mass was not stored ("unknown").</param>
    public sealed record GroupJson(
        int Version, int Batches, double? MeanYieldPct, double? YieldLowPct, double? YieldHighPct, double? AtomEconomyPct, double? RmePct, double? Pmi,
        double? CompleteEFactor, double? SimpleEFactor, double? SolventSharePct, double? OpenFlagRatePct);

    /// <summary>Welch's test of the mean yields, later version minus earlier.</summary>
    public sealed record DifferenceJson(double Difference, double Low, double High, double T, double DegreesOfFreedom, double PValue);
}
