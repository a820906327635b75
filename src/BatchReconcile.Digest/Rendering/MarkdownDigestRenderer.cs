using System.Text;
using BatchReconcile.Digest.Files;
using BatchReconcile.Digest.Model;
using BatchReconcile.Digest.Rendering.Charts;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Digest.Rendering;

/// <summary>
/// The digest as Markdown for mail or chat: the same sections in the same order as the HTML page, tables
/// instead of charts. Text from data is escaped so it can neither break a table nor become markup.
/// </summary>
public static class MarkdownDigestRenderer
{
    public static string Render(DigestData data)
    {
        ArgumentNullException.ThrowIfNull(data);
        var md = new StringBuilder(16 * 1024);
        var counts = data.FlagCounts;

        md.Append("# ").Append(DigestText.TitleOf(data)).Append(": ").Append(DigestText.Date(data.Day.Day)).Append(", ").Append(E(data.SiteName)).Append("\n\n");
        if (DigestText.ReissueSentence(data, DigestFileNames.For(data.Day.Day, data.SiteName).Numbered(data.Reissue?.Replaces ?? 1).Markdown) is { } reissue)
        {
            md.Append("> ").Append(E(reissue)).Append("\n\n");
        }

        if (DigestText.ProvisionalSentence(data) is { } provisional)
        {
            md.Append("> ").Append(E(provisional)).Append("\n\n");
        }

        md.Append("- Day runs: ").Append(E(DigestText.DayBounds(data.Day))).Append('\n')
            .Append("- Batches completed: ").Append(DigestText.Count(data.BatchesCompleted)).Append('\n')
            .Append("- Steps reconciled: ").Append(DigestText.Count(data.StepsReconciled)).Append('\n')
            .Append("- Flags raised: ").Append(DigestText.Count(counts.Total)).Append(" (critical ").Append(DigestText.Count(counts.Critical))
            .Append(", major ").Append(DigestText.Count(counts.Major)).Append(", minor ").Append(DigestText.Count(counts.Minor)).Append(")\n")
            .Append("- Still open from earlier days: ").Append(HtmlDigestRenderer.OpenEarlierSentence(data)).Append("\n\n");

        md.Append("## Flags from earlier days still waiting\n\n");
        if (data.OpenEarlier.Count == 0)
        {
            md.Append("None: every flag of earlier days has been closed.\n\n");
        }
        else
        {
            Row(md, "Flag", "Severity", "Batch", "Step", "Code", "Day", "Age", "Review");
            md.Append("|---:|---|---|---|---|---|---:|---|\n");
            foreach (var item in HtmlDigestRenderer.OpenOrder(data.OpenEarlier))
            {
                Row(md, item.FlagId.ToString(System.Globalization.CultureInfo.InvariantCulture), DigestText.Severity(item.Severity), E(item.BatchId), E(item.Step),
                    item.Code.ToText(), DigestText.Date(item.Day), DigestText.AgeDays(item.AgeDays), E(item.Review.Describe()));
            }

            if (data.OpenEarlierCount > data.OpenEarlier.Count)
            {
                md.Append("\nThe ").Append(DigestText.Count(data.OpenEarlier.Count)).Append(" oldest of ").Append(DigestText.Count(data.OpenEarlierCount))
                    .Append(" are listed; `flags list --open` shows all.\n");
            }

            md.Append('\n');
        }

        md.Append("## Exceptions of the day\n\n");
        if (data.Exceptions.Count == 0)
        {
            md.Append("No flags were raised on this day.\n\n");
        }
        else
        {
            Row(md, "Severity", "Batch", "Recipe", "Step", "Flag", "Measured against limit", "What was found", "Review");
            md.Append("|---|---|---|---|---|---:|---|---|\n");
            foreach (var e in ExceptionOrder.Sort(data.Exceptions))
            {
                Row(md, DigestText.Severity(e.Severity), $"{E(e.BatchId)} rev {e.Revision}", E(e.Recipe), E(e.Step),
                    E(DigestText.FlagName(e.Code, e.Subject)), E(DigestText.MeasuredAgainstLimit(e)), E(e.Message), E(e.Review.Describe()));
            }

            md.Append('\n');
        }

        md.Append("## Flagged steps: where the charged mass went\n\n");
        if (data.FlaggedSteps.Count == 0)
        {
            md.Append("No step was flagged on this day.\n\n");
        }

        foreach (var step in HtmlDigestRenderer.StepOrder(data.FlaggedSteps))
        {
            var o = step.Outcome;
            var dec = DigestText.KgDecimals(o.MassInKg);
            md.Append("### Batch ").Append(E(step.BatchId)).Append(" rev ").Append(step.Revision).Append(", recipe ").Append(E(step.RecipeText))
                .Append(", step ").Append(E(step.Step)).Append("\n\n");
            if (step.Trend is { } trend)
            {
                if (DigestText.TrendSentence(trend) is { } context)
                {
                    md.Append(E(context)).Append("\n\n");
                }

                if (DigestText.SignalSentence(trend.Signals, DigestText.WithinLimits(o.YieldPct, o.Limits.YieldMinPct, o.Limits.YieldMaxPct)) is { } signal)
                {
                    md.Append("> ").Append(E(signal)).Append("\n\n");
                }
            }

            Row(md, "Loss ladder", "kg", "% of charged");
            md.Append("|---|---:|---:|\n");
            Row(md, "charged (all inputs)", DigestText.Kg(o.MassInKg, dec), "100.0");
            foreach (var rung in o.Ladder)
            {
                Row(md, E(rung.Label) + (rung.Kg < 0 ? " (negative)" : string.Empty), DigestText.Kg(rung.Kg, dec), DigestText.Pct(rung.PctOfCharged));
            }

            Row(md, "isolated product", DigestText.Kg(o.ActualKg, dec), DigestText.Pct(o.MassInKg > 0 ? 100 * o.ActualKg / o.MassInKg : null));
            md.Append('\n');
            md.Append("Balance: out ").Append(DigestText.Kg(o.MassOutKg, dec)).Append(" kg, vented ").Append(DigestText.Kg(o.VentedKg, dec))
                .Append(" kg (up to ").Append(DigestText.Kg(o.VentedMaxKg, dec)).Append(" kg), gap ").Append(DigestText.Kg(o.GapKg, dec)).Append(" kg; closure ");
            md.Append(HtmlDigestRenderer.ClosureText(step));
            md.Append(", tolerance ").Append(step.TolerancePct is { } tol ? "± " + DigestText.Pct(tol) + " %" : "unknown").Append(".\n\n");
            if (o.HasRows && o.LimitingReactant is null)
            {
                md.Append("Yield-based figures n/a: ").Append(E(DigestText.NotComputable)).Append(".\n\n");
            }
        }

        if (data.RouteYields.Count > 0)
        {
            md.Append("## Route yields\n\n");
            Row(md, "Batch", "Recipe", "Route yield");
            md.Append("|---|---|---:|\n");
            foreach (var r in data.RouteYields.OrderBy(r => r.BatchId, StringComparer.Ordinal))
            {
                Row(md, $"{E(r.BatchId)} rev {r.Revision}", E(r.Recipe), E(DigestText.RouteYield(r)));
            }

            md.Append('\n');
        }

        md.Append("## Yields against limits\n\n");
        if (data.Yields.Count == 0)
        {
            md.Append("No yields on this day.\n\n");
        }
        else
        {
            Row(md, "Recipe", "Step", "Limits %", "This day", "Last batches");
            md.Append("|---|---|---|---|---|\n");
            foreach (var step in HtmlDigestRenderer.YieldOrder(data.Yields))
            {
                var today = step.History.Where(p => p.OnDigestDay).Select(p => $"{E(p.BatchId)} {DigestText.Pct(p.YieldPct)}{HtmlDigestRenderer.Within(step, p)}"
                    + (p.Signals.Count > 0 ? $" (run rules, information only: {string.Join(", ", p.Signals.Select(x => x.Code))})" : string.Empty));
                var history = HistorySummary(step);
                Row(md, E(step.Recipe), $"{E(step.Step)} {E(step.StepName)}", HtmlDigestRenderer.YieldLimits(step, unit: false),
                    string.Join("; ", today) is { Length: > 0 } t ? t : "none", history);
            }

            md.Append('\n');
        }

        md.Append("## Cautions\n\n");
        foreach (var caution in DigestText.Cautions)
        {
            md.Append("- ").Append(E(caution)).Append('\n');
        }

        md.Append("\nWritten by BatchReconcile at ").Append(DigestText.Moment(data.GeneratedAt)).Append(".\n");
        return md.ToString();
    }

    /// <summary>
    /// Escapes text for a Markdown table cell or line: a backslash before the characters that would make markup
    /// (| ` * _ [ ] \), HTML entities for &lt; &gt; and &amp; so no tag survives, and line breaks as spaces.
    /// </summary>
    public static string E(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var sb = new StringBuilder(text.Length + 8);
        foreach (var c in text)
        {
            switch (c)
            {
                case '\\' or '|' or '`' or '*' or '_' or '[' or ']':
                    sb.Append('\\').Append(c);
                    break;
                case '<':
                    sb.Append("&lt;");
                    break;
                case '>':
                    sb.Append("&gt;");
                    break;
                case '&':
                    sb.Append("&amp;");
                    break;
                case '\r' or '\n' or '\t':
                    sb.Append(' ');
                    break;
                default:
                    sb.Append(char.IsControl(c) ? ' ' : c);
                    break;
            }
        }

        return sb.ToString();
    }

    /// <summary>"30 batches, 2 outside the limits, lowest 81.4 %, highest 103.2 %": the chart in one line.</summary>
    private static string HistorySummary(RecipeStepYields step)
    {
        var values = step.History.Where(p => p.YieldPct is not null).Select(p => p.YieldPct!.Value).ToList();
        var outside = step.History.Count(p => HtmlDigestRenderer.Within(step, p).Length > 0);
        var text = $"{DigestText.Count(step.History.Count)} batches, {DigestText.Count(outside)} outside the limits";
        return values.Count == 0 ? text : $"{text}, lowest {DigestText.Pct(values.Min())} %, highest {DigestText.Pct(values.Max())} %";
    }

    private static void Row(StringBuilder md, params string[] cells) =>
        md.Append("| ").AppendJoin(" | ", cells).Append(" |\n");
}
