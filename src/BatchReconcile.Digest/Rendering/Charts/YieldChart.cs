using BatchReconcile.Digest.Model;

namespace BatchReconcile.Digest.Rendering.Charts;

/// <summary>One recipe step's yields over its last batches, with its limits as a band; the digest day's batches as filled squares.</summary>
internal static class YieldChart
{
    private const double Width = 372;
    private const double Height = 200;
    private const double PlotLeft = 48;
    private const double PlotRight = 318;
    private const double PlotTop = 12;
    private const double PlotBottom = 150;

    public static string Draw(RecipeStepYields step)
    {
        var values = step.History.Where(p => p.YieldPct is not null).Select(p => p.YieldPct!.Value).ToList();
        // Limits not stored with the batch are drawn as nothing, never assumed.
        var bounds = values.Concat(new[] { step.MinYieldPct, step.MaxYieldPct }.OfType<double>()).DefaultIfEmpty(100).ToList();
        var low = bounds.Min();
        var high = bounds.Max();
        var pad = Math.Max((high - low) * 0.1, 0.5);
        var y = Axis.Over(low - pad, high + pad, PlotBottom, PlotTop, 4);

        var title = $"Yields of recipe {step.Recipe}, step {step.Step} ({step.StepName}) over the last {step.History.Count} batches, "
            + $"limits {HtmlDigestRenderer.YieldLimits(step)}";
        var svg = new Svg(Width, Height, title,
            "Grey band: the step's yield limits. Hollow circles: earlier batches. Filled squares: batches of the digest's day.");

        if (step.MinYieldPct is { } min && step.MaxYieldPct is { } max)
        {
            svg.Rect(PlotLeft, y.Map(max), PlotRight - PlotLeft, y.Map(min) - y.Map(max), Svg.Faint);
        }

        // Limit labels sit in the right margin so they never cover a point.
        if (step.MaxYieldPct is { } top)
        {
            svg.Line(PlotLeft, y.Map(top), PlotRight, y.Map(top), Svg.Mid, 1, dashed: true);
            svg.Text(PlotRight + 4, y.Map(top) + 3, "max " + DigestText.Pct(top), "start", 9, Svg.Mid);
        }

        if (step.MinYieldPct is { } bottom)
        {
            svg.Line(PlotLeft, y.Map(bottom), PlotRight, y.Map(bottom), Svg.Mid, 1, dashed: true);
            svg.Text(PlotRight + 4, y.Map(bottom) + 3, "min " + DigestText.Pct(bottom), "start", 9, Svg.Mid);
        }

        foreach (var tick in y.Ticks())
        {
            var ty = y.Map(tick);
            svg.Line(PlotLeft - 4, ty, PlotLeft, ty, Svg.Mid);
            svg.Text(PlotLeft - 6, ty + 3.5, DigestText.Number(tick, y.Decimals), "end", 9.5, Svg.Mid);
        }

        svg.Line(PlotLeft, PlotTop, PlotLeft, PlotBottom, Svg.Mid);
        svg.Line(PlotLeft, PlotBottom, PlotRight, PlotBottom, Svg.Mid);
        svg.Text(12, (PlotTop + PlotBottom) / 2, "yield %", "middle", 10.5, Svg.Ink, rotate: -90);
        svg.Text((PlotLeft + PlotRight) / 2, PlotBottom + 30, "batches, oldest to newest", "middle", 10.5);
        if (step.History.Count > 0)
        {
            svg.Text(PlotLeft, PlotBottom + 14, DigestText.Date(step.History[0].Day), "start", 9, Svg.Mid);
            svg.Text(PlotRight, PlotBottom + 14, DigestText.Date(step.History[^1].Day), "end", 9, Svg.Mid);
        }
        else
        {
            svg.Text((PlotLeft + PlotRight) / 2, (PlotTop + PlotBottom) / 2, "no batches yet", "middle", 10, Svg.Mid);
        }

        var slot = (PlotRight - PlotLeft) / Math.Max(step.History.Count, 1);
        double X(int i) => PlotLeft + (slot * (i + 0.5));

        // The line breaks where a yield could not be computed, so a gap is never drawn as a trend.
        var run = new List<(double X, double Y)>();
        for (var i = 0; i <= step.History.Count; i++)
        {
            if (i < step.History.Count && step.History[i].YieldPct is { } v)
            {
                run.Add((X(i), y.Map(v)));
                continue;
            }

            svg.Polyline(run, Svg.Mid);
            run.Clear();
        }

        for (var i = 0; i < step.History.Count; i++)
        {
            var point = step.History[i];
            if (point.YieldPct is not { } v)
            {
                continue;
            }

            var tooltip = $"{point.BatchId} ({DigestText.Date(point.Day)}): {DigestText.Pct(v)} %"
                + (point.Signals.Count > 0 ? $"; breaks {string.Join(", ", point.Signals.Select(x => x.Code))} (information, not a flag)" : string.Empty);
            // Only the day's batches are labelled (the caption names them); earlier signals are in the tooltip.
            if (point.Signals.Count > 0 && point.OnDigestDay)
            {
                // A run-rule signal is labelled like the report's control charts ("R2"), above the point.
                var label = ControlChart.Label([.. point.Signals.Select(x => x.Code)]);
                svg.Text(X(i), y.Map(v) - 7, label, "middle", 8.5, Svg.Ink, bold: true, attributes: [("data-signal-label", label)]);
            }

            if (point.OnDigestDay)
            {
                svg.Rect(X(i) - 4, y.Map(v) - 4, 8, 8, Svg.Ink, tooltip: tooltip);
            }
            else
            {
                svg.Circle(X(i), y.Map(v), 3, "#ffffff", Svg.Accent, tooltip);
            }
        }

        return svg.ToMarkup();
    }
}
