using BatchReconcile.Digest.Model;

namespace BatchReconcile.Digest.Rendering.Charts;

/// <summary>The loss ladder as a horizontal waterfall: charged mass, each rung taken off in turn, isolated product.</summary>
/// <remarks>A negative rung (yield above theory) is drawn as a dashed outline going the other way, never clipped.</remarks>
internal static class LadderChart
{
    private const double Width = 700;
    private const double LabelRight = 292;
    private const double PlotLeft = 300;
    private const double PlotRight = 560;
    private const double ValueLeft = 568;
    private const double RowHeight = 22;
    private const double Top = 8;
    private const double AxisSpace = 44;

    public static string Draw(FlaggedStep step)
    {
        var outcome = step.Outcome;
        var decimals = DigestText.KgDecimals(outcome.MassInKg);
        var rows = new List<(string Label, double From, double To, double Kg, double? Pct, bool Total)>
        {
            ("charged (all inputs)", 0, outcome.MassInKg, outcome.MassInKg, 100, true),
        };

        var running = outcome.MassInKg;
        foreach (var rung in outcome.Ladder)
        {
            rows.Add((rung.Label, running - rung.Kg, running, rung.Kg, rung.PctOfCharged, false));
            running -= rung.Kg;
        }

        var productPct = outcome.MassInKg > 0 ? 100 * outcome.ActualKg / outcome.MassInKg : (double?)null;
        rows.Add(("isolated product", 0, outcome.ActualKg, outcome.ActualKg, productPct, true));

        var low = Math.Min(0, rows.Min(r => Math.Min(r.From, r.To)));
        var high = Math.Max(outcome.MassInKg, rows.Max(r => Math.Max(r.From, r.To)));
        var x = Axis.Over(low, high, PlotLeft, PlotRight);
        var plotBottom = Top + (rows.Count * RowHeight);
        var height = plotBottom + AxisSpace;

        var title = $"Loss ladder of batch {step.BatchId}, step {step.Step}: kg from charged mass down to isolated product";
        var svg = new Svg(Width, height, title,
            "Each row is a rung of the loss ladder in kg and % of the charged mass; a dashed outline marks a negative rung.");

        foreach (var tick in x.Ticks())
        {
            var tx = x.Map(tick);
            svg.Line(tx, Top, tx, plotBottom, Svg.Faint);
            svg.Line(tx, plotBottom, tx, plotBottom + 4, Svg.Mid);
            svg.Text(tx, plotBottom + 16, DigestText.Number(tick, x.Decimals), "middle", 10, Svg.Mid);
        }

        svg.Line(PlotLeft, plotBottom, PlotRight, plotBottom, Svg.Mid);
        svg.Line(x.Map(0), Top, x.Map(0), plotBottom, Svg.Mid);
        svg.Text((PlotLeft + PlotRight) / 2, plotBottom + 34, "mass (kg)", "middle", 11, Svg.Ink);

        for (var i = 0; i < rows.Count; i++)
        {
            var (label, from, to, kg, pct, total) = rows[i];
            var y = Top + (i * RowHeight);
            var left = x.Map(Math.Min(from, to));
            var width = Math.Abs(x.Map(to) - x.Map(from));
            var negative = !total && kg < 0;
            var value = $"{DigestText.Kg(kg, decimals)} kg ({DigestText.Pct(pct)} %)";
            var tooltip = $"{label}: {value}{(negative ? ", negative" : string.Empty)}";

            svg.Text(LabelRight, y + 15, label, "end", 11, Svg.Ink, bold: total);
            if (negative)
            {
                svg.Rect(left, y + 4, Math.Max(width, 1), RowHeight - 8, "#ffffff", Svg.Ink, dashed: true, tooltip: tooltip);
            }
            else
            {
                svg.Rect(left, y + 4, Math.Max(width, 0.5), RowHeight - 8, total ? Svg.Accent : Svg.AccentLight, total ? null : Svg.Accent, tooltip: tooltip);
            }

            // A thin connector carries the running total down to the next rung, as in a waterfall.
            if (i < rows.Count - 1)
            {
                var next = total ? to : from;
                svg.Line(x.Map(next), y + RowHeight - 4, x.Map(next), y + RowHeight + 4, Svg.Mid, 1, dashed: true);
            }

            svg.Text(ValueLeft, y + 15, negative ? value + " negative" : value, "start", 10.5, Svg.Ink);
        }

        return svg.ToMarkup();
    }
}
