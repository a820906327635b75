using System.Globalization;
using System.Net;
using System.Text;
using BatchReconcile.Digest.Model.Report;
using BatchReconcile.Digest.Rendering.Charts;

namespace BatchReconcile.Digest.Rendering.Report;

/// <summary>
/// The analysis report of one recipe as one self-contained HTML page, with the digest's styles and chart helpers:
/// a control chart per step, the loss Pareto and the version comparison. Inline CSS and SVG only: no scripts,
/// fonts, images or links to fetch. Every text from data is HTML-encoded. Sections carry stable ids
/// (summary, trends, losses, comparison, cautions); each step's trend is <c>article#trend-STEP</c>.
/// </summary>
public static class HtmlReportRenderer
{
    public const string Title = "Recipe analysis report";

    private const string ReportStyle = """
        .trend { margin-top: 1rem; padding-top: .2rem; border-top: 1px solid #d9d9d9; }
        ul.rules { margin: .2rem 0 .6rem; padding-left: 1.2rem; font-size: 9.5pt; }
        ul.rules code, td.code code { font-family: "DejaVu Sans Mono", Consolas, monospace; }
        .context { margin: .2rem 0; }
        tr.part td { border-bottom-style: dotted; font-size: 9pt; }
        table.compare td.num, table.compare th.num { min-width: 6rem; }
        table.compare td.conclusion { font-style: italic; }
        @media print {
          .trend header { break-after: avoid; page-break-after: avoid; }
          table.pareto, table.compare, table.signals { font-size: 8.5pt; }
        }
        """;

    /// <summary>What a group too small for a comparison says (compare and the report use the same words).</summary>
    public const string TooFew = "too few batches to conclude (n < 3)";

    /// <summary>The cautions closing the report.</summary>
    public static IReadOnlyList<string> Cautions { get; } =
    [
        "Control limits describe the process as it ran in the baseline batches, not the specification: a point inside the control limits may be outside the master-record limits, and a point outside them may still be within specification. The master-record limits decide acceptance; the control limits only show whether the process has changed.",
        "A run-rule signal asks for a look at the batch and what changed around it; it is not a finding, and it is not a flag. Several rules fire by chance now and then on a stable process.",
        "These figures support the site's procedures, deviation handling and the judgement of a qualified reviewer; they do not replace any of them.",
        "Reactive steps, vented gases and solvents are handled under the site's process-safety practice and local codes.",
    ];

    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    public static string Render(ReportData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        var html = new StringBuilder(128 * 1024);
        html.Append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
            .Append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
            .Append("<title>").Append(H($"{Title}: {data.Recipe}, {Period(data.From, data.To)}, {data.SiteName}")).Append("</title>\n")
            .Append("<style>\n").Append(HtmlDigestRenderer.Style).Append('\n').Append(ReportStyle).Append("\n</style>\n</head>\n<body>\n");

        Summary(html, data);
        Trends(html, data);
        Losses(html, data);
        Comparison(html, data);
        html.Append("<section id=\"cautions\">\n<h2>Cautions</h2>\n<ul>\n");
        foreach (var caution in Cautions)
        {
            html.Append("<li>").Append(H(caution)).Append("</li>\n");
        }

        html.Append("</ul>\n</section>\n")
            .Append("<footer>Written by BatchReconcile at ").Append(H(DigestText.Moment(data.GeneratedAt)))
            .Append(". Formulas and sources: the analysis documentation (docs/analysis.md). Values on the charts to 0.01; kg as in the digest.</footer>\n")
            .Append("</body>\n</html>\n");
        return html.ToString();
    }

    /// <summary>"2026-11-01 to 2026-11-30", "from 2026-11-01", "up to 2026-11-30" or "all stored batches".</summary>
    public static string Period(DateOnly? from, DateOnly? to) => (from, to) switch
    {
        ({ } f, { } t) => $"{DigestText.Date(f)} to {DigestText.Date(t)}",
        ({ } f, null) => $"from {DigestText.Date(f)}",
        (null, { } t) => $"up to {DigestText.Date(t)}",
        _ => "all stored batches",
    };

    private static void Summary(StringBuilder html, ReportData data)
    {
        html.Append("<header id=\"summary\">\n<h1>").Append(Title).Append(": ").Append(H(data.Recipe)).Append("</h1>\n")
            .Append("<p class=\"lead\">").Append(H(data.SiteName)).Append(", production days ").Append(H(Period(data.From, data.To))).Append("</p>\n")
            .Append("<dl class=\"facts\">\n");
        Fact(html, "Batches", DigestText.Count(data.Losses.Batches));
        Fact(html, "Steps", H(string.Join(", ", data.Trends.Select(t => $"{t.Step} ({t.StepName})"))));
        var versions = data.Versions.Count > 0 ? data.Versions.ToList() : data.Trends.SelectMany(t => t.Points).Select(p => p.RecipeVersion).Distinct().Order().ToList();
        Fact(html, "Recipe versions", versions.Count == 0 ? "none" : H(string.Join(", ", versions.Select(v => "v" + v.ToString(Inv)))));
        Fact(html, "Run-rule signals", DigestText.Count(data.Trends.Sum(t => t.Points.Count(p => p.Signals.Count > 0))) + " point(s); information for review, not flags");
        html.Append("</dl>\n<p class=\"notice\">").Append(H(Cautions[0])).Append("</p>\n</header>\n");
    }

    private static void Trends(StringBuilder html, ReportData data)
    {
        html.Append("<section id=\"trends\">\n<h2>Trends with control limits (I-MR)</h2>\n");
        if (data.Trends.Count == 0)
        {
            html.Append("<p class=\"none\">The recipe has no stored steps in this period.</p>\n</section>\n");
            return;
        }

        if (data.ChartedVersion is { } charted)
        {
            html.Append("<p class=\"lead\">").Append(H(string.Create(Inv,
                $"The charts show the batches of recipe v{charted}, the newest version in the period, with control limits from its own first batches: a deliberate change of recipe makes a new process, and limits from the version before would mark every batch after the change. The earlier versions are set against it under \"Recipe versions compared\"."))).Append("</p>\n");
        }

        foreach (var t in data.Trends)
        {
            html.Append("<article class=\"trend\" id=\"trend-").Append(H(Id(t.Step))).Append("\">\n<header><h3>Step ").Append(H(t.Step)).Append(": ")
                .Append(H(t.StepName)).Append(", ").Append(H(t.Measure)).Append("</h3></header>\n");
            if (t.Limits is not { } limits)
            {
                html.Append("<p class=\"none\">").Append(H(t.NotCharted ?? "not enough batches for a control chart")).Append("</p>\n</article>\n");
                continue;
            }

            var unit = t.Unit.Length > 0 ? " " + t.Unit : string.Empty;
            var baseFrom = t.Points[limits.BaselineStart];
            var baseTo = t.Points[limits.BaselineStart + limits.BaselineCount - 1];
            html.Append("<figure>\n").Append(ControlChart.Draw(data.Recipe, t)).Append("\n<figcaption>")
                .Append(H($"Centre line {ControlChart.Num(limits.Mean)}{unit}, sigma {ControlChart.Num(limits.Sigma)} (mean moving range / 1.128), "
                    + $"control limits {ControlChart.Num(limits.Lcl)} to {ControlChart.Num(limits.Ucl)}{unit}; moving-range UCL {ControlChart.Num(limits.MovingRangeUcl)} (3.267 × mean moving range). "
                    + $"Baseline: {limits.BaselineCount} batches, {baseFrom.BatchId} ({DigestText.Date(baseFrom.Day)}) to {baseTo.BatchId} ({DigestText.Date(baseTo.Day)}), shaded. "))
                .Append(H(SpecSentence(t, unit)));
            if (t.Omitted > 0)
            {
                html.Append(H($" {DigestText.Count(t.Omitted)} batch(es) of the period have no value (not computable) and are left out."));
            }

            html.Append("</figcaption>\n</figure>\n");
            if (t.Context is { } context)
            {
                html.Append("<p class=\"context\">Latest batch: ").Append(H(context)).Append(".</p>\n");
            }

            var fired = t.Points.SelectMany(p => p.Signals).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToList();
            if (fired.Count == 0)
            {
                html.Append("<p class=\"none\">No point breaks a run rule.</p>\n</article>\n");
                continue;
            }

            html.Append("<p>Run rules that fired (R and the rule's number on the chart):</p>\n<ul class=\"rules\">\n");
            foreach (var code in fired)
            {
                html.Append("<li data-rule=\"").Append(H(code)).Append("\"><strong>").Append(H(ControlChart.Label([code]))).Append("</strong> <code>").Append(H(code)).Append("</code>: ")
                    .Append(H(data.RuleDescriptions.TryGetValue(code, out var text) ? text.TrimEnd('.') : code)).Append(" (")
                    .Append(DigestText.Count(t.Points.Count(p => p.Signals.Contains(code)))).Append(" point(s))</li>\n");
            }

            html.Append("</ul>\n<table class=\"signals\">\n<thead><tr><th>Batch</th><th>Day</th><th>Version</th><th class=\"num\">Value</th><th>Rules</th></tr></thead>\n<tbody>\n");
            foreach (var p in t.Points.Where(p => p.Signals.Count > 0))
            {
                html.Append("<tr><td class=\"code\">").Append(H(p.BatchId)).Append("</td><td>").Append(DigestText.Date(p.Day)).Append("</td><td>v")
                    .Append(p.RecipeVersion.ToString(Inv)).Append("</td><td class=\"num\">").Append(H(ControlChart.Num(p.Value) + unit)).Append("</td><td class=\"code\">")
                    .Append(H(string.Join(", ", p.Signals))).Append("</td></tr>\n");
            }

            html.Append("</tbody>\n</table>\n</article>\n");
        }

        html.Append("</section>\n");
    }

    /// <summary>Where the master-record limits are, against the control limits.</summary>
    internal static string SpecSentence(StepTrend t, string unit)
    {
        if (t.SpecMin is null && t.SpecMax is null)
        {
            return "Master-record limits for this figure: none or unknown.";
        }

        var min = t.SpecMin is { } a ? ControlChart.Num(a) : "none";
        var max = t.SpecMax is { } b ? ControlChart.Num(b) : "none";
        return $"Master-record limits {min} to {max}{unit} (dotted where they fall on the chart): they decide acceptance, the control limits do not.";
    }

    private static void Losses(StringBuilder html, ReportData data)
    {
        var losses = data.Losses;
        html.Append("<section id=\"losses\">\n<h2>Losses by step and rung (Pareto)</h2>\n");
        if (losses.Rows.Count == 0)
        {
            html.Append("<p class=\"none\">No losses: no batch of the recipe in this period has a loss ladder.</p>\n</section>\n");
            return;
        }

        var dec = DigestText.KgDecimals(losses.TotalChargedKg);
        html.Append("<p class=\"lead\">The loss ladders of ").Append(DigestText.Count(losses.Batches)).Append(" batches summed: ")
            .Append(DigestText.Kg(losses.TotalChargedKg, dec)).Append(" kg charged in all. Share: of all positive losses; cumulative: largest first.</p>\n");
        if (ParetoChart.Draw(data.Recipe, losses) is { } chart)
        {
            html.Append("<figure>\n").Append(chart).Append("\n<figcaption>Bars: kg per step and rung, numbered as in the table (at most ")
                .Append(DigestText.Count(ParetoChart.MaxBars)).Append("). Line: cumulative share of all losses; dashed: 80 %.</figcaption>\n</figure>\n");
        }

        html.Append("<table class=\"pareto\">\n<thead><tr><th class=\"num\">#</th><th>Step</th><th>Where the mass went</th><th>Material</th>")
            .Append("<th class=\"num\">kg</th><th class=\"num\">% of charged</th><th class=\"num\">Share</th><th class=\"num\">Cumulative</th></tr></thead>\n<tbody>\n");
        var rank = 0;
        foreach (var r in losses.Rows)
        {
            var negative = r.Kg < 0;
            html.Append("<tr data-rung=\"").Append(H(r.RungKey)).Append("\"><td class=\"num\">").Append(negative ? "" : (++rank).ToString(Inv)).Append("</td>")
                .Append("<td class=\"code\">").Append(H(r.Step)).Append("</td><td>").Append(H(r.Label)).Append(negative ? " (negative, not counted in the shares)" : "").Append("</td>")
                .Append("<td class=\"code\">").Append(H(r.Material ?? "")).Append("</td>")
                .Append("<td class=\"num\">").Append(DigestText.Kg(r.Kg, dec)).Append("</td>")
                .Append("<td class=\"num\">").Append(DigestText.Pct(r.PctOfCharged)).Append(" %</td>")
                .Append("<td class=\"num\">").Append(negative ? "" : DigestText.Pct(r.SharePct) + " %").Append("</td>")
                .Append("<td class=\"num\">").Append(negative ? "" : DigestText.Pct(r.CumulativeSharePct) + " %").Append("</td></tr>\n");
            foreach (var part in losses.Parts.Where(p => p.Step == r.Step && p.RungKey == r.RungKey && r.Material is null).OrderByDescending(p => p.Kg))
            {
                html.Append("<tr class=\"part\" data-rung=\"").Append(H(r.RungKey)).Append("\" data-material=\"").Append(H(part.Material)).Append("\"><td></td><td></td>")
                    .Append("<td class=\"none\">of which</td><td class=\"code\">").Append(H(part.Material)).Append("</td>")
                    .Append("<td class=\"num\">").Append(DigestText.Kg(part.Kg, dec)).Append("</td>")
                    .Append("<td class=\"num\">").Append(DigestText.Pct(part.PctOfCharged)).Append(" %</td>")
                    .Append("<td class=\"num none\" colspan=\"2\">").Append(DigestText.Pct(part.PctOfRung)).Append(" % of the rung</td></tr>\n");
            }
        }

        html.Append("</tbody>\n</table>\n</section>\n");
    }

    private static void Comparison(StringBuilder html, ReportData data)
    {
        html.Append("<section id=\"comparison\">\n<h2>Recipe versions compared</h2>\n");
        if (data.Comparison is not { } c)
        {
            html.Append("<p class=\"none\">The period has batches of one recipe version only: nothing to compare.</p>\n</section>\n");
            return;
        }

        var a = "v" + c.VersionA.ToString(Inv);
        var b = "v" + c.VersionB.ToString(Inv);
        html.Append("<p class=\"lead\">Means over each version's batches; yield with its 95 % Student t interval; the difference ")
            .Append(H(b)).Append(" − ").Append(H(a)).Append(" with Welch's test (unequal variances).</p>\n");
        foreach (var s in c.Scopes)
        {
            html.Append("<table class=\"compare\" data-scope=\"").Append(H(s.Scope)).Append("\">\n<caption>").Append(H(s.Scope == "route" ? "Route (whole batch)" : $"Step {s.Scope}: {s.Name}"))
                .Append("</caption>\n<thead><tr><th>Figure</th><th class=\"num\">").Append(H(a)).Append("</th><th class=\"num\">").Append(H(b))
                .Append("</th><th class=\"num\">").Append(H(b)).Append(" − ").Append(H(a)).Append("</th></tr></thead>\n<tbody>\n");
            Row(html, "Batches", DigestText.Count(s.A.Batches), DigestText.Count(s.B.Batches), "");
            Row(html, "Mean yield (95 % interval)", YieldText(s.A), YieldText(s.B), s.Difference is { } d
                ? $"{Signed(d.Difference)} % ({ControlChart.Num(d.Low)} to {ControlChart.Num(d.High)}), p = {P(d.PValue)}"
                : "n/a");
            Row(html, "Atom economy %", Opt(s.A.AtomEconomyPct), Opt(s.B.AtomEconomyPct), Diff(s.A.AtomEconomyPct, s.B.AtomEconomyPct));
            Row(html, "RME %", Opt(s.A.RmePct), Opt(s.B.RmePct), Diff(s.A.RmePct, s.B.RmePct));
            Row(html, "PMI (kg/kg)", Opt(s.A.Pmi), Opt(s.B.Pmi), Diff(s.A.Pmi, s.B.Pmi));
            Row(html, "Complete E-factor", Opt(s.A.CompleteEFactor), Opt(s.B.CompleteEFactor), Diff(s.A.CompleteEFactor, s.B.CompleteEFactor));
            Row(html, "Simple E-factor", Opt(s.A.SimpleEFactor), Opt(s.B.SimpleEFactor), Diff(s.A.SimpleEFactor, s.B.SimpleEFactor));
            Row(html, "Solvent share of mass in %", Unknown(s.A.SolventSharePct), Unknown(s.B.SolventSharePct), Diff(s.A.SolventSharePct, s.B.SolventSharePct));
            Row(html, "Batches with open flags %", Opt(s.A.OpenFlagRatePct), Opt(s.B.OpenFlagRatePct), Diff(s.A.OpenFlagRatePct, s.B.OpenFlagRatePct));
            html.Append("<tr><td>Conclusion</td><td class=\"conclusion\" colspan=\"3\">").Append(H(s.Conclusion)).Append("</td></tr>\n</tbody>\n</table>\n");
        }

        html.Append("</section>\n");
    }

    private static string YieldText(VersionFigures f) => f.MeanYieldPct is not { } m
        ? "n/a"
        : f.YieldLowPct is { } lo && f.YieldHighPct is { } hi
            ? $"{ControlChart.Num(m)} % ({ControlChart.Num(lo)} to {ControlChart.Num(hi)})"
            : $"{ControlChart.Num(m)} % (n < 2, no interval)";

    private static string Opt(double? v) => v is { } x ? ControlChart.Num(x) : "n/a";

    private static string Unknown(double? v) => v is { } x ? ControlChart.Num(x) : "unknown";

    private static string Diff(double? a, double? b) => a is { } x && b is { } y ? Signed(y - x) : "";

    private static string Signed(double v) => (v > 0 ? "+" : "") + ControlChart.Num(v);

    /// <summary>p to 4 decimals, "&lt; 0.0001" below that.</summary>
    public static string P(double p) => p < 0.0001 ? "< 0.0001" : p.ToString("0.####", Inv);

    private static void Row(StringBuilder html, string name, string a, string b, string diff) =>
        html.Append("<tr><td>").Append(H(name)).Append("</td><td class=\"num\">").Append(H(a)).Append("</td><td class=\"num\">").Append(H(b))
            .Append("</td><td class=\"num\">").Append(H(diff)).Append("</td></tr>\n");

    private static void Fact(StringBuilder html, string name, string valueHtml) =>
        html.Append("<dt>").Append(name).Append("</dt><dd>").Append(valueHtml).Append("</dd>\n");

    /// <summary>An id from a step code: letters, digits, '-' and '_' kept, anything else as '_'.</summary>
    public static string Id(string step) => new(step.Select(ch => char.IsAsciiLetterOrDigit(ch) || ch is '-' or '_' ? ch : '_').ToArray());

    private static string H(string text) => WebUtility.HtmlEncode(text);
}
