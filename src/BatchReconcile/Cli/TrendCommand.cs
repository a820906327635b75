using System.CommandLine;
using System.Globalization;
using BatchReconcile.Analysis.Trends;
using BatchReconcile.Digest.Model.Report;
using BatchReconcile.RecipeAnalysis;
using BatchReconcile.Records;
using BatchReconcile.Storage;
using BatchReconcile.Storage.Queries;
using Microsoft.Extensions.DependencyInjection;

namespace BatchReconcile.Cli;

/// <summary>
/// <c>trend --recipe CODE --step S [--measure M] [--from D] [--to D] [--version V] [--baseline N | --baseline-from D --baseline-to D] [--json]</c>:
/// one step's figure batch by batch with its I-MR control chart and run-rule signals (docs/analysis.md).
/// </summary>
public static class TrendCommand
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    public static Command Create(GlobalOptions globals, TextWriter stdout)
    {
        var shared = new AnalysisOptions();
        var step = new Option<string>("--step") { Description = "Step code, e.g. S1", Required = true };
        var measure = new Option<string?>("--measure") { Description = "Figure to follow: " + string.Join(", ", StepMeasure.Names) + " (default yield)" };
        var version = new Option<string?>("--version") { Description = "Only batches reconciled with this recipe version" };
        var baseline = new Option<string?>("--baseline") { Description = "The first N batches are the baseline (default 20)" };
        var baselineFrom = new Option<string?>("--baseline-from") { Description = "Baseline: the batches from this production day (with --baseline-to)" };
        var baselineTo = new Option<string?>("--baseline-to") { Description = "Baseline: the batches up to this production day (with --baseline-from)" };
        var command = new Command("trend", "One step's figure batch by batch with an individuals (I-MR) control chart and run-rule signals");
        shared.AddTo(command, json: false);
        command.Options.Add(step);
        command.Options.Add(measure);
        command.Options.Add(version);
        command.Options.Add(baseline);
        command.Options.Add(baselineFrom);
        command.Options.Add(baselineTo);
        command.Options.Add(shared.Json);
        command.SetAction(parse =>
        {
            // Every option is checked before the store is opened: bad input never waits for the database.
            var recipe = shared.RecipeCode(parse);
            var (from, to) = shared.Period(parse);
            var stepCode = parse.GetRequiredValue(step).Trim();
            var what = ParseMeasure(parse.GetValue(measure));
            var v = ParseVersion(parse.GetValue(version));
            var choice = ParseBaseline(parse.GetValue(baseline), parse.GetValue(baselineFrom), parse.GetValue(baselineTo));
            return HostedCommand.Run(parse, globals, service: false, host =>
            {
                var store = host.Services.GetRequiredService<BatchStore>();
                RequireStep(store, recipe, stepCode);
                var series = store.StepSeries(recipe, stepCode, what, from, to, v);
                var trend = TrendBuilder.Build(stepCode, stepCode, what, series, choice);
                if (parse.GetValue(shared.Json))
                {
                    JsonOutput.Write(stdout, Json(recipe, trend), AnalysisJson.Shared.TrendJson);
                }
                else
                {
                    Text(stdout, recipe, trend, from, to, v);
                }

                return ExitCodes.Success;
            }, storeOnly: true);
        });
        return command;
    }

    /// <summary>The recipe must have stored batches and the step must be one of its steps; else bad input naming the option.</summary>
    public static IReadOnlyList<string> RequireStep(BatchStore store, string recipe, string? step)
    {
        var steps = store.RecipeSteps(recipe);
        if (steps.Count == 0)
        {
            throw new UsageException($"--recipe '{SafeText.Escape(recipe)}': no batch of that recipe is stored");
        }

        if (step is not null && !steps.Contains(step, StringComparer.Ordinal))
        {
            throw new UsageException($"--step '{SafeText.Escape(step)}': recipe {SafeText.Escape(recipe)} has no such step (its steps: {string.Join(", ", steps.Select(SafeText.Escape))})");
        }

        return steps;
    }

    public static StepMeasure ParseMeasure(string? text) =>
        text is null ? StepMeasure.Yield
        : StepMeasure.TryParse(text, out var m) ? m
        : throw new UsageException($"--measure '{SafeText.Escape(SafeText.Prefix(text, 40))}' is not a figure: expected one of {string.Join(", ", StepMeasure.Names)}");

    public static int? ParseVersion(string? text) =>
        text is null ? null
        : int.TryParse(text.Trim(), NumberStyles.None, Inv, out var v) && v >= 1 ? v
        : throw new UsageException($"--version '{SafeText.Escape(SafeText.Prefix(text, 40))}' is not a recipe version (a whole number from 1)");

    public static BaselineChoice ParseBaseline(string? count, string? from, string? to)
    {
        if (count is not null && (from is not null || to is not null))
        {
            throw new UsageException($"--baseline '{SafeText.Escape(SafeText.Prefix(count, 40))}': give either --baseline N or --baseline-from and --baseline-to, not both");
        }

        if ((from is null) != (to is null))
        {
            throw new UsageException(from is null ? "--baseline-to: give --baseline-from as well" : "--baseline-from: give --baseline-to as well");
        }

        if (from is not null)
        {
            var f = AnalysisOptions.Day("--baseline-from", from)!.Value;
            var t = AnalysisOptions.Day("--baseline-to", to)!.Value;
            return f <= t ? new BaselineChoice(null, f, t)
                : throw new UsageException(string.Create(Inv, $"--baseline-from {f:yyyy-MM-dd} is after --baseline-to {t:yyyy-MM-dd}"));
        }

        if (count is null)
        {
            return BaselineChoice.Default;
        }

        return int.TryParse(count.Trim(), NumberStyles.None, Inv, out var n) && n >= 2
            ? new BaselineChoice(n)
            : throw new UsageException($"--baseline '{SafeText.Escape(SafeText.Prefix(count, 40))}' is not a number of batches (a whole number from 2)");
    }

    /// <summary>The JSON of docs/cli.md and the interfaces spec.</summary>
    public static TrendJson Json(string recipe, StepTrend t)
    {
        BaselineJson? baseline = t.Limits is { } l
            ? new(Day(t.Points[l.BaselineStart].Day), Day(t.Points[l.BaselineStart + l.BaselineCount - 1].Day), l.BaselineCount)
            : null;
        return new TrendJson(
            recipe, t.Step, t.Measure, baseline,
            R(t.Limits?.Mean), R(t.Limits?.Sigma), R(t.Limits?.Ucl), R(t.Limits?.Lcl),
            t.Points.Select(p => new PointJson(p.BatchId, Day(p.Day), R(p.Value), R(p.MovingRange), p.Signals)).ToList());
    }

    private static void Text(TextWriter o, string recipe, StepTrend t, DateOnly? from, DateOnly? to, int? version)
    {
        var unit = t.Unit.Length > 0 ? " " + t.Unit : string.Empty;
        var scope = Digest.Rendering.Report.HtmlReportRenderer.Period(from, to) + (version is { } v ? string.Create(Inv, $", version {v} only") : string.Empty);
        o.WriteLine(string.Create(Inv, $"trend of recipe {SafeText.Escape(recipe)}, step {SafeText.Escape(t.Step)}: {t.Measure}{(unit.Length > 0 ? $" ({t.Unit})" : "")}, {t.Points.Count} batches ({scope})"));
        if (t.Omitted > 0)
        {
            o.WriteLine(string.Create(Inv, $"  {t.Omitted} batch(es) without a value (not computable) left out"));
        }

        if (t.Limits is not { } l)
        {
            o.WriteLine("  " + t.NotCharted);
            foreach (var p in t.Points)
            {
                o.WriteLine(string.Create(Inv, $"  {p.Day:yyyy-MM-dd}  {SafeText.Escape(p.BatchId),-16} v{p.RecipeVersion}  {F(p.Value)}"));
            }

            return;
        }

        var first = t.Points[l.BaselineStart];
        var last = t.Points[l.BaselineStart + l.BaselineCount - 1];
        o.WriteLine(string.Create(Inv, $"  baseline: {l.BaselineCount} batches, {first.Day:yyyy-MM-dd} to {last.Day:yyyy-MM-dd}"));
        o.WriteLine(string.Create(Inv, $"  centre {F(l.Mean)}{unit}, sigma {F(l.Sigma)} (mean moving range {F(l.MeanMovingRange)} / 1.128), UCL {F(l.Ucl)}, LCL {F(l.Lcl)}; moving range UCL {F(l.MovingRangeUcl)}"));
        o.WriteLine();
        o.WriteLine(string.Create(Inv, $"  {"#",4} {"mark",-4} {"day",-10}  {"batch",-16} {"v",3} {"value",10} {"MR",8}  signals"));
        for (var i = 0; i < t.Points.Count; i++)
        {
            var p = t.Points[i];
            var inBase = i >= l.BaselineStart && i < l.BaselineStart + l.BaselineCount;
            var mark = (inBase ? "b" : "") + (p.Signals.Count > 0 ? "*" : "");
            o.WriteLine(string.Create(Inv, $"  {i + 1,4} {mark,-4} {p.Day:yyyy-MM-dd}  {SafeText.Escape(p.BatchId),-16} {p.RecipeVersion,3} {F(p.Value),10} {(p.MovingRange is { } mr ? F(mr) : "-"),8}  {string.Join(", ", p.Signals)}").TrimEnd());
        }

        o.WriteLine();
        o.WriteLine("  marks: b = baseline batch, * = breaks a run rule (information for review, not a flag)");
        var fired = t.Points.SelectMany(p => p.Signals).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToList();
        if (fired.Count == 0)
        {
            o.WriteLine("  no point breaks a run rule");
        }
        else
        {
            o.WriteLine("  run rules that fired:");
            foreach (var code in fired)
            {
                o.WriteLine(string.Create(Inv, $"    {code}: {RunRules.Describe(code).TrimEnd('.')} ({t.Points.Count(p => p.Signals.Contains(code))} point(s))"));
            }
        }

        if (t.Context is { } context)
        {
            o.WriteLine($"  latest batch: {context}");
        }

        o.WriteLine("  Control limits describe the process, not the specification: the master-record limits decide acceptance.");
    }

    private static string F(double v) => v.ToString("F2", Inv);

    private static string Day(DateOnly d) => d.ToString("yyyy-MM-dd", Inv);

    /// <summary>Values to 0.0001 in JSON: enough for yields in % and for PMI, without binary noise.</summary>
    private static double R(double v) => Rounding.To(v, 4);

    private static double? R(double? v) => v is { } x ? R(x) : null;

    public sealed record TrendJson(string Recipe, string Step, string Measure, BaselineJson? Baseline, double? Mean, double? Sigma, double? Ucl, double? Lcl, IReadOnlyList<PointJson> Points);

    public sealed record BaselineJson(string From, string To, int N);

    public sealed record PointJson(string Batch, string Day, double Value, double? MovingRange, IReadOnlyList<string> Signals);
}
