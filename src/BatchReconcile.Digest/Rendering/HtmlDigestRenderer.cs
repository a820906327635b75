using System.Net;
using System.Text;
using BatchReconcile.Digest.Files;
using BatchReconcile.Digest.Model;
using BatchReconcile.Digest.Rendering.Charts;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Digest.Rendering;

/// <summary>
/// The digest as one self-contained HTML page: inline CSS and inline SVG, no scripts, fonts, images or links to
/// fetch. Every text that comes from batch data or settings is HTML-encoded. Sections carry stable ids
/// (summary, exceptions, flagged-steps, yields, cautions) and every chart the class "chart".
/// </summary>
public static class HtmlDigestRenderer
{
    internal const string Style = """
        :root { color-scheme: light; }
        * { box-sizing: border-box; }
        body { margin: 0 auto; max-width: 60rem; padding: 1.5rem; color: #1f1f1f; background: #ffffff;
               font-family: Helvetica, Arial, "DejaVu Sans", sans-serif; font-size: 10.5pt; line-height: 1.4; }
        h1 { font-size: 17pt; margin: 0 0 .2rem; font-weight: 600; }
        h2 { font-size: 13pt; margin: 1.8rem 0 .6rem; padding-bottom: .2rem; border-bottom: 1.5px solid #3d5a80; font-weight: 600; }
        h3 { font-size: 11pt; margin: 1.2rem 0 .4rem; font-weight: 600; }
        .lead { margin: 0 0 .8rem; color: #444; }
        dl.facts { display: grid; grid-template-columns: max-content 1fr; gap: .15rem 1.2rem; margin: .6rem 0; }
        dl.facts dt { color: #555; }
        dl.facts dd { margin: 0; }
        table { border-collapse: collapse; width: 100%; margin: .4rem 0 .8rem; font-size: 9.5pt; }
        th, td { text-align: left; vertical-align: top; padding: .25rem .4rem; border-bottom: 1px solid #d9d9d9; }
        th { border-bottom: 1.5px solid #6b6b6b; font-weight: 600; }
        td.num, th.num { text-align: right; white-space: nowrap; }
        td.code { font-family: "DejaVu Sans Mono", Consolas, monospace; font-size: 9pt; white-space: nowrap; }
        td.msg { min-width: 12rem; }
        td.short { white-space: nowrap; }
        /* Batch ids and flag codes are read and searched as one word, so they never break inside (a hyphen is no
           place to break "balance-surplus"); the revision goes under the id, and the message and the measured
           value take the remaining width. Balanced lines keep "167.5 kg" together when "against" has to wrap. */
        .rev { display: block; }
        td.measure { white-space: normal; text-wrap: balance; min-width: 5.5rem; }
        .sev { white-space: nowrap; }
        .sev::before { font-size: 8pt; letter-spacing: 1px; margin-right: .35rem; color: #3d3d3d; }
        .sev-critical::before { content: "\25A0\25A0\25A0"; }
        .sev-major::before { content: "\25A0\25A0\25A1"; }
        .sev-minor::before { content: "\25A0\25A1\25A1"; }
        .none { color: #555; font-style: italic; }
        .notice { margin: .3rem 0 .8rem; padding: .4rem .6rem; border-left: 4px solid #3d5a80; background: #eef1f6; }
        .step { margin-top: 1rem; padding-top: .2rem; border-top: 1px solid #d9d9d9; }
        figure { margin: .4rem 0 .8rem; break-inside: avoid; page-break-inside: avoid; }
        figcaption { font-size: 9pt; color: #555; margin-top: .2rem; }
        svg.chart { display: block; max-width: 100%; height: auto; }
        .yield-grid { display: grid; grid-template-columns: repeat(auto-fill, minmax(372px, 1fr)); gap: .6rem 1.2rem; }
        .yield-grid figure { margin: 0; }
        .balance { display: grid; grid-template-columns: repeat(3, max-content 1fr); gap: .1rem .8rem; font-size: 9.5pt; }
        .balance dt { color: #555; } .balance dd { margin: 0; }
        #cautions ul { padding-left: 1.2rem; }
        footer { margin-top: 2rem; font-size: 8.5pt; color: #666; }
        @page { margin: 14mm 12mm 16mm; }
        @media print {
          body { max-width: none; padding: 0; font-size: 9.5pt; }
          h2 { break-after: avoid; page-break-after: avoid; }
          h3 { break-after: avoid; page-break-after: avoid; }
          tr, .step header, dl.balance { break-inside: avoid; page-break-inside: avoid; }
          thead { display: table-header-group; }
          .yield-grid { grid-template-columns: repeat(2, 1fr); }
          table.exceptions { font-size: 8.5pt; }
          table.exceptions td.code { font-size: 8pt; }
          table.exceptions th, table.exceptions td { padding: .2rem .3rem; }
          a { color: inherit; text-decoration: none; }
        }
        """;

    public static string Render(DigestData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        var html = new StringBuilder(64 * 1024);
        var day = DigestText.Date(data.Day.Day);
        html.Append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
            .Append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
            .Append("<title>").Append(H($"{DigestText.TitleOf(data)} {day}, {data.SiteName}")).Append("</title>\n")
            .Append("<style>\n").Append(Style).Append("\n</style>\n</head>\n<body>\n");

        Summary(html, data);
        Exceptions(html, data);
        FlaggedSteps(html, data);
        RouteYields(html, data);
        Yields(html, data);
        Cautions(html);

        html.Append("<footer>Written by BatchReconcile at ").Append(H(DigestText.Moment(data.GeneratedAt)))
            .Append(". Figures as defined in the reconciliation documentation; kg rounded to 0.01 below 100 kg and to 0.1 above, percentages to 0.1.</footer>\n")
            .Append("</body>\n</html>\n");
        return html.ToString();
    }

    private static void Summary(StringBuilder html, DigestData data)
    {
        var counts = data.FlagCounts;
        html.Append("<header id=\"summary\">\n<h1>").Append(DigestText.TitleOf(data)).Append("</h1>\n");
        if (DigestText.ReissueSentence(data, DigestFileNames.For(data.Day.Day, data.SiteName).Numbered(data.Reissue?.Replaces ?? 1).Html) is { } reissue)
        {
            html.Append("<p class=\"notice\" id=\"reissue\">").Append(H(reissue)).Append("</p>\n");
        }

        if (DigestText.ProvisionalSentence(data) is { } provisional)
        {
            html.Append("<p class=\"notice\" id=\"provisional\">").Append(H(provisional)).Append("</p>\n");
        }

        html
            .Append("<p class=\"lead\">Production day <strong>").Append(DigestText.Date(data.Day.Day)).Append("</strong> at <strong>")
            .Append(H(data.SiteName)).Append("</strong></p>\n<dl class=\"facts\">\n");
        Fact(html, "Day runs", H(DigestText.DayBounds(data.Day)));
        Fact(html, "Batches completed", DigestText.Count(data.BatchesCompleted));
        Fact(html, "Steps reconciled", DigestText.Count(data.StepsReconciled));
        Fact(html, "Flags raised", $"{DigestText.Count(counts.Total)}: <span class=\"sev sev-critical\">critical {DigestText.Count(counts.Critical)}</span>, "
            + $"<span class=\"sev sev-major\">major {DigestText.Count(counts.Major)}</span>, <span class=\"sev sev-minor\">minor {DigestText.Count(counts.Minor)}</span>");
        Fact(html, "Still open from earlier days", OpenEarlierSentence(data));
        html.Append("</dl>\n");

        html.Append("<h2>Flags from earlier days still waiting</h2>\n");
        if (data.OpenEarlier.Count == 0)
        {
            html.Append("<p class=\"none\">None: every flag of earlier days has been closed.</p>\n");
        }
        else
        {
            html.Append("<table class=\"open-flags\">\n<thead><tr><th class=\"num\">Flag</th><th>Severity</th><th>Batch</th><th>Step</th><th>Code</th>")
                .Append("<th>Day</th><th class=\"num\">Age</th><th>Review</th></tr></thead>\n<tbody>\n");
            foreach (var item in OpenOrder(data.OpenEarlier))
            {
                html.Append("<tr><td class=\"num\">").Append(item.FlagId).Append("</td>")
                    .Append("<td>").Append(Severity(item.Severity)).Append("</td>")
                    .Append("<td class=\"code\">").Append(H(item.BatchId)).Append("</td>")
                    .Append("<td class=\"code\">").Append(H(item.Step)).Append("</td>")
                    .Append("<td class=\"code\">").Append(item.Code.ToText()).Append("</td>")
                    .Append("<td>").Append(DigestText.Date(item.Day)).Append("</td>")
                    .Append("<td class=\"num\">").Append(DigestText.AgeDays(item.AgeDays)).Append("</td>")
                    .Append("<td>").Append(H(item.Review.Describe())).Append("</td></tr>\n");
            }

            html.Append("</tbody>\n</table>\n");
            if (data.OpenEarlierCount > data.OpenEarlier.Count)
            {
                html.Append("<p class=\"none\">The ").Append(DigestText.Count(data.OpenEarlier.Count)).Append(" oldest of ")
                    .Append(DigestText.Count(data.OpenEarlierCount)).Append(" are listed; <code>flags list --open</code> shows all.</p>\n");
            }
        }

        html.Append("</header>\n");
    }

    private static void Exceptions(StringBuilder html, DigestData data)
    {
        html.Append("<section id=\"exceptions\">\n<h2>Exceptions of the day</h2>\n");
        if (data.Exceptions.Count == 0)
        {
            html.Append("<p class=\"none\">No flags were raised on this day.</p>\n</section>\n");
            return;
        }

        html.Append("<table class=\"exceptions\">\n<thead><tr><th>Severity</th><th>Batch</th><th>Recipe</th><th>Step</th><th>Flag</th>")
            .Append("<th>Measured against limit</th><th>What was found</th><th>Review</th></tr></thead>\n<tbody>\n");
        foreach (var e in ExceptionOrder.Sort(data.Exceptions))
        {
            html.Append("<tr data-flag-id=\"").Append(e.FlagId).Append("\"><td>").Append(Severity(e.Severity)).Append("</td>")
                .Append("<td class=\"code\">").Append(H(e.BatchId)).Append(" <span class=\"none rev\">rev ").Append(e.Revision).Append("</span></td>")
                .Append("<td class=\"code short\">").Append(H(e.Recipe)).Append("</td>")
                .Append("<td class=\"code short\">").Append(H(e.Step)).Append("</td>")
                .Append("<td class=\"code\">").Append(H(DigestText.FlagName(e.Code, e.Subject))).Append("</td>")
                .Append("<td class=\"num measure\">").Append(H(DigestText.MeasuredAgainstLimit(e))).Append("</td>")
                .Append("<td class=\"msg\">").Append(H(e.Message)).Append("</td>")
                .Append("<td class=\"review\">").Append(H(e.Review.Describe())).Append("</td></tr>\n");
        }

        html.Append("</tbody>\n</table>\n</section>\n");
    }

    private static void FlaggedSteps(StringBuilder html, DigestData data)
    {
        html.Append("<section id=\"flagged-steps\">\n<h2>Flagged steps: where the charged mass went</h2>\n");
        if (data.FlaggedSteps.Count == 0)
        {
            html.Append("<p class=\"none\">No step was flagged on this day.</p>\n</section>\n");
            return;
        }

        var steps = StepOrder(data.FlaggedSteps).ToList();
        for (var i = 0; i < steps.Count; i++)
        {
            var step = steps[i];
            var o = step.Outcome;
            var dec = DigestText.KgDecimals(o.MassInKg);
            var codes = data.Exceptions
                .Where(e => e.BatchId == step.BatchId && e.Revision == step.Revision && e.Step == step.Step)
                .OrderBy(e => e.Severity).Select(e => DigestText.FlagName(e.Code, e.Subject)).Distinct().ToList();

            html.Append("<article class=\"step\" id=\"step-").Append(i + 1).Append("\">\n<header><h3>Batch ").Append(H(step.BatchId))
                .Append(" rev ").Append(step.Revision).Append(", recipe ").Append(H(step.RecipeText)).Append(", step ").Append(H(step.Step)).Append("</h3>\n");
            if (codes.Count > 0)
            {
                html.Append("<p class=\"lead\">Flags: ").Append(H(string.Join(", ", codes))).Append("</p>\n");
            }

            if (step.Trend is { } trend)
            {
                if (DigestText.TrendSentence(trend) is { } context)
                {
                    html.Append("<p class=\"lead trend-context\">").Append(H(context)).Append("</p>\n");
                }

                if (DigestText.SignalSentence(trend.Signals, DigestText.WithinLimits(o.YieldPct, o.Limits.YieldMinPct, o.Limits.YieldMaxPct)) is { } signal)
                {
                    html.Append("<p class=\"notice information\" data-information=\"run-rule\">").Append(H(signal)).Append("</p>\n");
                }
            }

            html.Append("<dl class=\"balance\">\n");
            Fact(html, "Charged", DigestText.Kg(o.MassInKg, dec) + " kg");
            Fact(html, "Out (weighed)", DigestText.Kg(o.MassOutKg, dec) + " kg");
            Fact(html, "Vented (estimate)", $"{DigestText.Kg(o.VentedKg, dec)} kg, up to {DigestText.Kg(o.VentedMaxKg, dec)} kg");
            Fact(html, "Gap", DigestText.Kg(o.GapKg, dec) + " kg");
            Fact(html, "Closure", ClosureText(step));
            Fact(html, "Tolerance", step.TolerancePct is { } tol ? "± " + DigestText.Pct(tol) + " % of charged" : "unknown (not stored with this step)");
            if (o.HasRows && o.LimitingReactant is null)
            {
                Fact(html, "Yield-based figures", "n/a: " + H(DigestText.NotComputable));
            }

            html.Append("</dl>\n</header>\n");

            var flagCodes = data.Exceptions
                .Where(e => e.BatchId == step.BatchId && e.Revision == step.Revision && e.Step == step.Step)
                .Select(e => e.Code).Distinct().ToList();
            html.Append("<figure>\n").Append(LadderChart.Draw(step, flagCodes))
                .Append("\n<figcaption>Loss ladder: from all charged mass down to isolated product, each rung in kg and in % of the charged mass. ")
                .Append("A dashed outline is a negative rung (yield above theory); a dark bar marked \"flag:\" is a rung a flag of this step is about, ")
                .Append("drawn at least ").Append(DigestText.Number(LadderChart.MinFlaggedPx, 0)).Append(" px wide with its value beside it.</figcaption>\n</figure>\n");
            if (LadderChart.DrawReaction(step, flagCodes) is { } reaction)
            {
                html.Append("<figure class=\"reaction-ladder\">\n").Append(reaction)
                    .Append("\n<figcaption>The same ladder without solvents, auxiliaries and recovered streams, on its own scale from the reactants charged, ")
                    .Append("so that the rungs of the reaction and the yield can be read (% still of all charged mass).</figcaption>\n</figure>\n");
            }

            var closure = ClosureChart.Draw(step);
            if (closure is null)
            {
                html.Append("<p class=\"none\">No closure: nothing was charged at this step.</p>\n");
            }
            else
            {
                html.Append("<figure>\n").Append(closure)
                    .Append("\n<figcaption>Mass-balance closure with ± k·u (combined standard uncertainty of the weighings) against the step's tolerance band. ")
                    .Append("The dashed whisker shows the closure if the largest vented estimate had left.</figcaption>\n</figure>\n");
            }

            html.Append("</article>\n");
        }

        html.Append("</section>\n");
    }

    /// <summary>The route yield of each of the day's multi-step batches (docs/computation.md, "Route yield").</summary>
    private static void RouteYields(StringBuilder html, DigestData data)
    {
        if (data.RouteYields.Count == 0)
        {
            return;
        }

        html.Append("<section id=\"route-yields\">\n<h2>Route yields</h2>\n<table class=\"exceptions\">\n")
            .Append("<thead><tr><th>Batch</th><th>Recipe</th><th class=\"num\">Route yield</th></tr></thead>\n<tbody>\n");
        foreach (var r in data.RouteYields.OrderBy(r => r.BatchId, StringComparer.Ordinal))
        {
            html.Append("<tr><td class=\"code\">").Append(H(r.BatchId)).Append(" rev ").Append(r.Revision).Append("</td>")
                .Append("<td class=\"code\">").Append(H(r.Recipe)).Append("</td>")
                .Append("<td class=\"num\">").Append(H(DigestText.RouteYield(r))).Append("</td></tr>\n");
        }

        html.Append("</tbody>\n</table>\n</section>\n");
    }

    private static void Yields(StringBuilder html, DigestData data)
    {
        html.Append("<section id=\"yields\">\n<h2>Yields against limits</h2>\n");
        if (data.Yields.Count == 0)
        {
            html.Append("<p class=\"none\">No yields on this day.</p>\n</section>\n");
            return;
        }

        html.Append("<div class=\"yield-grid\">\n");
        foreach (var step in YieldOrder(data.Yields))
        {
            var today = step.History.Where(p => p.OnDigestDay).ToList();
            html.Append("<figure class=\"yield\">\n<h3>").Append(H(step.Recipe)).Append(" ").Append(H(step.Step)).Append(": ").Append(H(step.StepName)).Append("</h3>\n")
                .Append(YieldChart.Draw(step)).Append("\n<figcaption>Limits ").Append(YieldLimits(step)).Append(", as stored with the latest batch shown. This day: ");
            html.Append(today.Count == 0
                ? "no batch."
                : H(string.Join("; ", today.Select(p => $"{p.BatchId} {DigestText.Pct(p.YieldPct)} %{Within(step, p)}"))) + ".");
            foreach (var p in today.Where(p => p.Signals.Count > 0))
            {
                html.Append(" <span class=\"information\" data-information=\"run-rule\">").Append(H(p.BatchId)).Append(": ")
                    .Append(H(DigestText.SignalSentence(p.Signals, Within(step, p).Length == 0)!)).Append("</span>");
            }

            html.Append("</figcaption>\n</figure>\n");
        }

        html.Append("</div>\n</section>\n");
    }

    private static void Cautions(StringBuilder html)
    {
        html.Append("<section id=\"cautions\">\n<h2>Cautions</h2>\n<ul>\n");
        foreach (var caution in DigestText.Cautions)
        {
            html.Append("<li>").Append(H(caution)).Append("</li>\n");
        }

        html.Append("</ul>\n</section>\n");
    }

    internal static string OpenEarlierSentence(DigestData data)
    {
        if (data.OpenEarlierCount == 0)
        {
            return "none";
        }

        var oldest = data.OpenEarlier.Count > 0 ? data.OpenEarlier.Max(o => o.AgeDays) : (int?)null;
        return DigestText.Count(data.OpenEarlierCount) + (oldest is { } age ? $", the oldest {DigestText.AgeDays(age)} old" : string.Empty);
    }

    internal static IEnumerable<OpenFlagItem> OpenOrder(IEnumerable<OpenFlagItem> items) =>
        items.OrderByDescending(o => o.AgeDays).ThenBy(o => o.Severity).ThenBy(o => o.FlagId);

    internal static IEnumerable<FlaggedStep> StepOrder(IEnumerable<FlaggedStep> steps) =>
        steps.OrderBy(s => s.BatchId, NaturalOrder.Instance).ThenBy(s => s.Revision).ThenBy(s => s.Step, NaturalOrder.Instance);

    internal static IEnumerable<RecipeStepYields> YieldOrder(IEnumerable<RecipeStepYields> yields) =>
        yields.OrderBy(s => s.Recipe, NaturalOrder.Instance).ThenBy(s => s.Step, NaturalOrder.Instance);

    /// <summary>The closure with its expanded uncertainty and coverage factor, or "n/a"; plain text with no markup characters.</summary>
    internal static string ClosureText(FlaggedStep step) => step.Outcome.ClosurePct is { } c
        ? $"{DigestText.Pct(c)} % ± {ClosureChart.Known(ClosureChart.ExpandedUncertaintyPct(step))} (k = {(step.CoverageFactor is { } k ? DigestText.Number(k, 1) : "unknown")})"
        : "n/a";

    /// <summary>"88.0 to 98.0 %" (without the unit for a column headed in %), with "unknown" for a limit not stored.</summary>
    internal static string YieldLimits(RecipeStepYields step, bool unit = true) => step.MinYieldPct is null && step.MaxYieldPct is null
        ? "unknown"
        : $"{(step.MinYieldPct is { } min ? DigestText.Pct(min) : "unknown")} to {(step.MaxYieldPct is { } max ? DigestText.Pct(max) : "unknown")}{(unit ? " %" : "")}";

    // Limits are inclusive and a value within 1e-9 (relative) of one counts as on it, as the flag rules say.
    internal static string Within(RecipeStepYields step, YieldPoint point) => point.YieldPct switch
    {
        null => string.Empty,
        { } v when step.MinYieldPct is { } min && v < min - (1e-9 * Math.Max(1, Math.Abs(min))) => " (below)",
        { } v when step.MaxYieldPct is { } max && v > max + (1e-9 * Math.Max(1, Math.Abs(max))) => " (above)",
        _ => string.Empty,
    };

    private static void Fact(StringBuilder html, string name, string valueHtml) =>
        html.Append("<dt>").Append(name).Append("</dt><dd>").Append(valueHtml).Append("</dd>\n");

    private static string Severity(FlagSeverity severity)
    {
        var text = DigestText.Severity(severity);
        return $"<span class=\"sev sev-{text}\">{text}</span>";
    }

    private static string H(string text) => WebUtility.HtmlEncode(text);
}
