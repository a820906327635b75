using System.CommandLine;
using System.Globalization;
using BatchReconcile.Digest.Model.Report;
using BatchReconcile.RecipeAnalysis;
using BatchReconcile.Records;
using BatchReconcile.Storage;
using Microsoft.Extensions.DependencyInjection;

namespace BatchReconcile.Cli;

/// <summary><c>losses --recipe CODE [--from D] [--to D] [--json]</c>: the loss ladders summed per step and rung, as a Pareto.</summary>
public static class LossesCommand
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    public static Command Create(GlobalOptions globals, TextWriter stdout)
    {
        var shared = new AnalysisOptions();
        var command = new Command("losses", "The loss ladder summed over a recipe's batches, per step and rung, largest first with the cumulative share");
        shared.AddTo(command);
        command.SetAction(parse =>
        {
            var recipe = shared.RecipeCode(parse);
            var (from, to) = shared.Period(parse);
            return HostedCommand.Run(parse, globals, service: false, host =>
            {
                var store = host.Services.GetRequiredService<BatchStore>();
                TrendCommand.RequireStep(store, recipe, null);
                var losses = LossBuilder.Build(store.LossTotalsOfRecipe(recipe, from, to));
                if (parse.GetValue(shared.Json))
                {
                    JsonOutput.Write(stdout, Json(recipe, from, to, losses), AnalysisJson.Shared.LossesJson);
                }
                else
                {
                    Text(stdout, recipe, from, to, losses);
                }

                return ExitCodes.Success;
            }, storeOnly: true);
        });
        return command;
    }

    public static LossesJson Json(string recipe, DateOnly? from, DateOnly? to, LossSummary l) => new(
        recipe, AnalysisOptions.Text(from), AnalysisOptions.Text(to), l.Batches, R(l.TotalChargedKg),
        l.Rows.Select(r => new RowJson(
            r.Step, r.RungKey, r.Label, R(r.Kg), R(r.PctOfCharged), R(r.SharePct), R(r.CumulativeSharePct),
            l.Parts.Where(p => p.Step == r.Step && p.RungKey == r.RungKey).OrderByDescending(p => p.Kg)
                .Select(p => new PartJson(p.Material, R(p.Kg), R(p.PctOfCharged), R(p.PctOfRung))).ToList())).ToList());

    private static void Text(TextWriter o, string recipe, DateOnly? from, DateOnly? to, LossSummary l)
    {
        o.WriteLine(string.Create(Inv, $"losses of recipe {SafeText.Escape(recipe)}, {Digest.Rendering.Report.HtmlReportRenderer.Period(from, to)}: {l.Batches} batches, {l.TotalChargedKg:F1} kg charged at all steps"));
        if (l.Rows.Count == 0)
        {
            o.WriteLine("  no loss ladder stored for these batches");
            return;
        }

        o.WriteLine(string.Create(Inv, $"  {"#",3} {"step",-6} {"where the mass went",-50} {"kg",12} {"% charged",10} {"share",8} {"cumul.",8}"));
        var rank = 0;
        foreach (var r in l.Rows)
        {
            var negative = r.Kg < 0;
            var label = SafeText.Escape(r.Label) + (negative ? " (negative, no share)" : string.Empty);
            o.WriteLine(string.Create(Inv,
                $"  {(negative ? "" : (++rank).ToString(Inv)),3} {SafeText.Escape(r.Step),-6} {label,-50} {r.Kg,12:F1} {r.PctOfCharged,8:F2} % {(negative ? "" : r.SharePct.ToString("F1", Inv) + " %"),8} {(negative ? "" : r.CumulativeSharePct.ToString("F1", Inv) + " %"),8}"));
            foreach (var p in l.Parts.Where(p => p.Step == r.Step && p.RungKey == r.RungKey).OrderByDescending(p => p.Kg))
            {
                var part = "of which " + SafeText.Escape(p.Material);
                o.WriteLine(string.Create(Inv, $"  {"",3} {"",-6} {"  " + part,-50} {p.Kg,12:F1} {p.PctOfCharged,8:F2} % {p.PctOfRung,6:F1} % of the rung"));
            }
        }

        o.WriteLine("  share: of all positive losses; cumul.: running total, largest first");
    }

    private static double R(double v) => Rounding.To(v, 3);

    public sealed record LossesJson(string Recipe, string? From, string? To, int Batches, double ChargedKg, IReadOnlyList<RowJson> Rows);

    public sealed record RowJson(string Step, string Rung, string Label, double Kg, double PctOfCharged, double SharePct, double CumulativeSharePct, IReadOnlyList<PartJson> Parts);

    public sealed record PartJson(string Material, double Kg, double PctOfCharged, double PctOfRung);
}
