using BatchReconcile.Digest.Model.Report;

namespace BatchReconcile.Digest.Rendering.Charts;

/// <summary>
/// An individuals and moving-range (I-MR) chart of one step's measure: the values in production order with the centre
/// line and the 3-sigma limits computed from the baseline (shaded), the master-record limits where they fall on the
/// chart, and every point that breaks a run rule drawn as a filled square labelled with the rule ("R1", "R2,5").
/// Below, the moving ranges with their centre line and upper limit.
/// </summary>
internal static class ControlChart
{
    private const double Width = 720;
    private const double PlotLeft = 54;
    private const double PlotRight = 630;
    private const double PlotTop = 22;
    private const double PlotHeight = 200;
    private const double MrGap = 40;
    private const double MrHeight = 70;
    private const double BottomSpace = 40;

    /// <summary>Width of one character of a signal label at its size (px), to tell whether labels fit beside each other.</summary>
    private const double LabelCharPx = 5.4;

    /// <summary>"R1" for rule-1, "R2,5" for rules 2 and 5.</summary>
    public static string Label(IReadOnlyList<string> signals) =>
        "R" + string.Join(",", signals.Select(s => s.StartsWith("rule-", StringComparison.Ordinal) ? s["rule-".Length..] : s));

    public static string Draw(string recipe, StepTrend trend)
    {
        ArgumentNullException.ThrowIfNull(trend);
        var limits = trend.Limits ?? throw new ArgumentException("A trend without limits is not charted.", nameof(trend));
        var points = trend.Points;
        var values = points.Select(p => p.Value).ToList();
        var slot = (PlotRight - PlotLeft) / Math.Max(points.Count, 1);

        // Labels beside the points while they fit; when they would overlap (many signals close together) every label
        // stands upright in a strip above the chart, over its own point, so each stays readable.
        var longest = points.Where(p => p.Signals.Count > 0).Select(p => Label(p.Signals).Length).DefaultIfEmpty(0).Max();
        var upright = longest * LabelCharPx > slot * 2 - 2;
        var strip = upright ? (longest * LabelCharPx) + 10 : 0;
        var iTop = PlotTop + strip;
        var iBottom = iTop + PlotHeight;
        var mrTop = iBottom + MrGap;
        var mrBottom = mrTop + MrHeight;
        var height = mrBottom + BottomSpace;
        var low = Math.Min(values.DefaultIfEmpty(limits.Lcl).Min(), limits.Lcl);
        var high = Math.Max(values.DefaultIfEmpty(limits.Ucl).Max(), limits.Ucl);
        var pad = Math.Max((high - low) * 0.08, 1e-6);
        var y = Axis.Over(low - pad, high + pad, iBottom, iTop, 5);
        var unit = trend.Unit.Length > 0 ? " " + trend.Unit : string.Empty;
        var signalled = points.Count(p => p.Signals.Count > 0);

        var title = $"{trend.Measure} of recipe {recipe}, step {trend.Step} ({trend.StepName}), {points.Count} batches in production order: "
            + $"centre {Num(limits.Mean)}{unit}, UCL {Num(limits.Ucl)}, LCL {Num(limits.Lcl)} from a baseline of {limits.BaselineCount} batches; "
            + $"{signalled} point(s) break a run rule";
        var svg = new Svg(Width, height, title,
            "Individuals chart (top): each batch's value, the centre line and the 3-sigma control limits from the shaded baseline; "
            + "filled squares labelled R and a rule number break a run rule. Moving-range chart (bottom): the difference between consecutive batches.");
        svg.Attribute("data-chart", "control").Attribute("data-step", trend.Step);

        double X(int i) => PlotLeft + (slot * (i + 0.5));

        // The baseline: the batches the limits were computed from.
        var baseLeft = PlotLeft + (slot * limits.BaselineStart);
        var baseWidth = slot * limits.BaselineCount;
        svg.Rect(baseLeft, iTop, baseWidth, iBottom - iTop, Svg.Faint, attributes: [("data-baseline", "true")],
            tooltip: $"baseline: {limits.BaselineCount} batches");
        svg.Text(baseLeft + 3, upright ? 12 : iTop - 6, $"baseline ({limits.BaselineCount} batches)", "start", 9, Svg.Mid);

        foreach (var tick in y.Ticks())
        {
            var ty = y.Map(tick);
            svg.Line(PlotLeft - 4, ty, PlotLeft, ty, Svg.Mid);
            svg.Text(PlotLeft - 6, ty + 3.5, DigestText.Number(tick, y.Decimals), "end", 9.5, Svg.Mid);
        }

        svg.Line(PlotLeft, iTop, PlotLeft, iBottom, Svg.Mid);
        svg.Line(PlotLeft, iBottom, PlotRight, iBottom, Svg.Mid);
        svg.Text(14, (iTop + iBottom) / 2, trend.Measure + unit, "middle", 10.5, Svg.Ink, rotate: -90);

        // Master-record limits only where they fall on the chart; the caption says when they do not.
        foreach (var (spec, name) in new[] { (trend.SpecMax, "spec max"), (trend.SpecMin, "spec min") })
        {
            if (spec is { } s && s >= y.Min && s <= y.Max)
            {
                svg.Line(PlotLeft, y.Map(s), PlotRight, y.Map(s), Svg.Accent, 1, pattern: "1 2", role: name.Replace(' ', '-'));
                svg.Text(PlotRight + 4, y.Map(s) + 3, $"{name} {Num(s)}", "start", 9, Svg.Accent);
            }
        }

        svg.Line(PlotLeft, y.Map(limits.Ucl), PlotRight, y.Map(limits.Ucl), Svg.Ink, 1, dashed: true, role: "ucl");
        svg.Line(PlotLeft, y.Map(limits.Lcl), PlotRight, y.Map(limits.Lcl), Svg.Ink, 1, dashed: true, role: "lcl");
        svg.Line(PlotLeft, y.Map(limits.Mean), PlotRight, y.Map(limits.Mean), Svg.Mid, 1.5, role: "centre");
        svg.Text(PlotRight + 4, y.Map(limits.Ucl) + 3, "UCL " + Num(limits.Ucl), "start", 9, Svg.Ink);
        svg.Text(PlotRight + 4, y.Map(limits.Mean) + 3, "CL " + Num(limits.Mean), "start", 9, Svg.Mid);
        svg.Text(PlotRight + 4, y.Map(limits.Lcl) + 3, "LCL " + Num(limits.Lcl), "start", 9, Svg.Ink);

        // A recipe version change is marked where it happens, so a shift there is read against it.
        for (var i = 1; i < points.Count; i++)
        {
            if (points[i].RecipeVersion != points[i - 1].RecipeVersion)
            {
                var vx = PlotLeft + (slot * i);
                svg.Line(vx, iTop, vx, mrBottom, Svg.Accent, 1, pattern: "6 3", role: "version");
                svg.Text(vx + 3, iBottom - 4, "v" + points[i].RecipeVersion.ToString(System.Globalization.CultureInfo.InvariantCulture), "start", 9, Svg.Accent);
            }
        }

        svg.Polyline(points.Select((p, i) => (X(i), y.Map(p.Value))).ToList(), Svg.Mid);
        for (var i = 0; i < points.Count; i++)
        {
            var p = points[i];
            var py = y.Map(p.Value);
            var tooltip = $"{p.BatchId} ({DigestText.Date(p.Day)}, v{p.RecipeVersion}): {Num(p.Value)}{unit}";
            if (p.Signals.Count == 0)
            {
                svg.Circle(X(i), py, 2.8, "#ffffff", Svg.Accent, tooltip, [("data-batch", p.BatchId)]);
                continue;
            }

            var label = Label(p.Signals);
            svg.Rect(X(i) - 3.5, py - 3.5, 7, 7, Svg.Ink, tooltip: $"{tooltip}; breaks {string.Join(", ", p.Signals)}",
                attributes: [("data-batch", p.BatchId), ("data-signals", string.Join(' ', p.Signals))]);
            if (upright)
            {
                // Read from below, ending just above the plot, straight over the point.
                svg.Text(X(i) + 3, iTop - 4, label, "start", 8.5, Svg.Ink, bold: true, rotate: -90, attributes: [("data-signal-label", label)]);
                svg.Line(X(i), iTop, X(i), py - 4, Svg.Light, 0.5);
                continue;
            }

            // Away from the centre line; staggered when the points are close, so neighbouring labels do not overlap.
            var above = p.Value >= limits.Mean;
            var offset = 9 + (slot < 14 && i % 2 == 1 ? 9 : 0);
            svg.Text(X(i), above ? py - offset : py + offset + 6, label, "middle", 8.5, Svg.Ink, bold: true, attributes: [("data-signal-label", label)]);
        }

        // Moving ranges.
        var mrValues = points.Where(p => p.MovingRange is not null).Select(p => p.MovingRange!.Value).ToList();
        var mrHigh = Math.Max(mrValues.DefaultIfEmpty(0).Max(), limits.MovingRangeUcl);
        var my = Axis.Over(0, mrHigh * 1.05, mrBottom, mrTop, 2);
        foreach (var tick in my.Ticks())
        {
            var ty = my.Map(tick);
            svg.Line(PlotLeft - 4, ty, PlotLeft, ty, Svg.Mid);
            svg.Text(PlotLeft - 6, ty + 3.5, DigestText.Number(tick, my.Decimals), "end", 9, Svg.Mid);
        }

        svg.Line(PlotLeft, mrTop, PlotLeft, mrBottom, Svg.Mid);
        svg.Line(PlotLeft, mrBottom, PlotRight, mrBottom, Svg.Mid);
        svg.Text(14, (mrTop + mrBottom) / 2, "MR", "middle", 10, Svg.Ink, rotate: -90);
        svg.Line(PlotLeft, my.Map(limits.MovingRangeUcl), PlotRight, my.Map(limits.MovingRangeUcl), Svg.Ink, 1, dashed: true, role: "mr-ucl");
        svg.Line(PlotLeft, my.Map(limits.MeanMovingRange), PlotRight, my.Map(limits.MeanMovingRange), Svg.Mid, 1, role: "mr-centre");
        svg.Text(PlotRight + 4, my.Map(limits.MovingRangeUcl) + 3, "UCL " + Num(limits.MovingRangeUcl), "start", 9, Svg.Ink);
        // The two labels sit 10 px apart at least, the mean's below its line when the limit is close above it.
        var meanLabelY = Math.Max(my.Map(limits.MeanMovingRange) + 3, my.Map(limits.MovingRangeUcl) + 13);
        svg.Text(PlotRight + 4, meanLabelY, "mean MR " + Num(limits.MeanMovingRange), "start", 9, Svg.Mid);
        var mrLine = new List<(double X, double Y)>();
        for (var i = 0; i < points.Count; i++)
        {
            if (points[i].MovingRange is { } mr)
            {
                mrLine.Add((X(i), my.Map(mr)));
                var over = mr > limits.MovingRangeUcl;
                svg.Circle(X(i), my.Map(mr), 2.2, over ? Svg.Ink : "#ffffff", Svg.Accent, $"{points[i].BatchId}: moving range {Num(mr)}{(over ? ", above its UCL" : string.Empty)}");
            }
        }

        svg.Polyline(mrLine, Svg.Mid);

        if (points.Count > 0)
        {
            svg.Text(PlotLeft, mrBottom + 14, DigestText.Date(points[0].Day), "start", 9, Svg.Mid);
            svg.Text(PlotRight, mrBottom + 14, DigestText.Date(points[^1].Day), "end", 9, Svg.Mid);
        }

        svg.Text((PlotLeft + PlotRight) / 2, mrBottom + 30, "batches in production order", "middle", 10.5);
        return svg.ToMarkup();
    }

    /// <summary>Values to 0.01 (yields, closures in %, PMI): the charts are read to that, the JSON carries more.</summary>
    internal static string Num(double value) => DigestText.Number(value, 2);
}
