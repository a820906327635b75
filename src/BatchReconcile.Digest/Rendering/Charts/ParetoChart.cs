using System.Globalization;
using BatchReconcile.Digest.Model.Report;

namespace BatchReconcile.Digest.Rendering.Charts;

/// <summary>
/// The losses of a recipe over a period as a Pareto chart: one bar per step and rung (or material part), largest
/// first, in kg on the left axis, and the cumulative share of all losses as a line on the right axis (0 to 100 %),
/// with the 80 % mark. Bars are numbered; the table under the chart names each number.
/// </summary>
internal static class ParetoChart
{
    /// <summary>The chart shows at most this many bars; the table lists every row.</summary>
    public const int MaxBars = 12;

    private const double Width = 720;
    private const double Height = 280;
    private const double PlotLeft = 64;
    private const double PlotRight = 660;
    private const double PlotTop = 16;
    private const double PlotBottom = 220;

    /// <summary>Null when there is no positive loss to draw.</summary>
    public static string? Draw(string recipe, LossSummary losses)
    {
        ArgumentNullException.ThrowIfNull(losses);
        var rows = losses.Rows.Where(r => r.Kg > 0).Take(MaxBars).ToList();
        if (rows.Count == 0)
        {
            return null;
        }

        var y = Axis.Over(0, rows.Max(r => r.Kg), PlotBottom, PlotTop, 5);
        var title = $"Losses of recipe {recipe} over {losses.Batches} batches: the {rows.Count} largest of {losses.Rows.Count(r => r.Kg > 0)} "
            + "step and rung totals in kg, largest first, with the cumulative share of all losses";
        var svg = new Svg(Width, Height, title,
            "Bars: kg lost at a step and rung, summed over the batches (left axis). Line: cumulative share of all losses (right axis, %). "
            + "Dashed line: 80 % of all losses.");
        svg.Attribute("data-chart", "pareto");

        foreach (var tick in y.Ticks())
        {
            var ty = y.Map(tick);
            svg.Line(PlotLeft, ty, PlotRight, ty, Svg.Faint);
            svg.Text(PlotLeft - 6, ty + 3.5, DigestText.Number(tick, y.Decimals), "end", 9.5, Svg.Mid);
        }

        double Pct(double pct) => PlotBottom - ((PlotBottom - PlotTop) * pct / 100);
        foreach (var pct in new[] { 0.0, 20, 40, 60, 80, 100 })
        {
            svg.Line(PlotRight, Pct(pct), PlotRight + 4, Pct(pct), Svg.Mid);
            svg.Text(PlotRight + 6, Pct(pct) + 3.5, DigestText.Number(pct, 0) + " %", "start", 9.5, Svg.Mid);
        }

        svg.Line(PlotLeft, Pct(80), PlotRight, Pct(80), Svg.Mid, 1, dashed: true, role: "eighty");
        svg.Line(PlotLeft, PlotTop, PlotLeft, PlotBottom, Svg.Mid);
        svg.Line(PlotRight, PlotTop, PlotRight, PlotBottom, Svg.Mid);
        svg.Line(PlotLeft, PlotBottom, PlotRight, PlotBottom, Svg.Mid);
        svg.Text(16, (PlotTop + PlotBottom) / 2, "kg lost", "middle", 10.5, Svg.Ink, rotate: -90);
        svg.Text(Width - 8, (PlotTop + PlotBottom) / 2, "cumulative share", "middle", 10.5, Svg.Ink, rotate: 90);

        var slot = (PlotRight - PlotLeft) / rows.Count;
        var line = new List<(double X, double Y)>();
        for (var i = 0; i < rows.Count; i++)
        {
            var r = rows[i];
            var left = PlotLeft + (slot * i) + (slot * 0.15);
            var top = y.Map(r.Kg);
            var rank = (i + 1).ToString(CultureInfo.InvariantCulture);
            var what = r.Material is null ? r.Label : $"{r.Label}, {r.Material}";
            svg.Rect(left, top, slot * 0.7, PlotBottom - top, Svg.AccentLight, Svg.Accent,
                tooltip: $"{rank}. step {r.Step}: {what}: {DigestText.Kg(r.Kg, DigestText.KgDecimals(r.Kg))} kg, {DigestText.Pct(r.SharePct)} % of losses",
                attributes: [("data-rank", rank), ("data-step", r.Step), ("data-rung", r.RungKey)]);
            var cx = PlotLeft + (slot * (i + 0.5));
            svg.Text(cx, PlotBottom + 13, rank, "middle", 9.5, Svg.Ink, bold: true);
            svg.Text(cx, PlotBottom + 25, r.Step, "middle", 9, Svg.Mid);
            line.Add((cx, Pct(r.CumulativeSharePct)));
        }

        svg.Polyline(line, Svg.Ink);
        foreach (var (p, i) in line.Select((p, i) => (p, i)))
        {
            svg.Circle(p.X, p.Y, 2.5, Svg.Ink, Svg.Ink, $"cumulative {DigestText.Pct(rows[i].CumulativeSharePct)} %");
        }

        svg.Text((PlotLeft + PlotRight) / 2, PlotBottom + 44, "rank (see the table) and step", "middle", 10.5);
        return svg.ToMarkup();
    }
}
