using BatchReconcile.Digest.Model;

namespace BatchReconcile.Digest.Rendering.Charts;

/// <summary>
/// Mass-balance closure on a % axis: the step's tolerance band around 100 %, the closure with its ± k·u band,
/// and how far the largest vented estimate would take it.
/// </summary>
internal static class ClosureChart
{
    private const double Width = 700;
    private const double Height = 120;
    private const double PlotLeft = 40;
    private const double PlotRight = 660;
    private const double BandTop = 26;
    private const double BandBottom = 70;

    /// <summary>Null when the closure cannot be computed (nothing charged).</summary>
    public static string? Draw(FlaggedStep step)
    {
        var outcome = step.Outcome;
        if (outcome.ClosurePct is not { } closure || !(outcome.MassInKg > 0))
        {
            return null;
        }

        // Unknown limits (a step stored before they were kept) are drawn as nothing, never as a band of 0.
        var kuKnown = ExpandedUncertaintyPct(step);
        var kuPct = kuKnown ?? 0;
        var closureAtMaxVent = closure + (100 * (outcome.VentedMaxKg - outcome.VentedKg) / outcome.MassInKg);
        var tolKnown = step.TolerancePct;
        var tol = tolKnown ?? 0;
        var low = Math.Min(Math.Min(Math.Min(100 - tol, closure - kuPct), closureAtMaxVent), 100);
        var high = Math.Max(Math.Max(Math.Max(100 + tol, closure + kuPct), closureAtMaxVent), 100);
        var pad = Math.Max((high - low) * 0.1, 0.2);
        var x = Axis.Over(low - pad, high + pad, PlotLeft, PlotRight, 8);

        var title = $"Mass-balance closure of batch {step.BatchId}, step {step.Step}: {DigestText.Pct(closure)} % "
            + $"± {Known(kuKnown)} (k = {(step.CoverageFactor is { } k ? DigestText.Number(k, 1) : "unknown")}), tolerance ± {Known(tolKnown)}";
        var svg = new Svg(Width, Height, title,
            "Grey band: the step's tolerance around 100 %. Blue band: closure ± k times the combined standard uncertainty. Dark line: the closure.");

        if (tolKnown is not null)
        {
            svg.Rect(x.Map(100 - tol), BandTop, x.Map(100 + tol) - x.Map(100 - tol), BandBottom - BandTop, Svg.Faint, Svg.Light,
                tooltip: $"tolerance 100 ± {DigestText.Pct(tol)} %");
        }

        svg.Line(x.Map(100), BandTop - 6, x.Map(100), BandBottom + 2, Svg.Mid, 1, dashed: true);
        svg.Text(x.Map(100), BandTop - 9, "100 %", "middle", 10, Svg.Mid);

        foreach (var tick in x.Ticks())
        {
            var tx = x.Map(tick);
            svg.Line(tx, BandBottom + 8, tx, BandBottom + 12, Svg.Mid);
            svg.Text(tx, BandBottom + 24, DigestText.Number(tick, x.Decimals), "middle", 10, Svg.Mid);
        }

        svg.Line(PlotLeft, BandBottom + 8, PlotRight, BandBottom + 8, Svg.Mid);
        svg.Text((PlotLeft + PlotRight) / 2, BandBottom + 42, "closure, % of charged mass", "middle", 11);

        if (kuKnown is not null)
        {
            var uLeft = x.Map(closure - kuPct);
            svg.Rect(uLeft, BandTop + 10, Math.Max(x.Map(closure + kuPct) - uLeft, 1), BandBottom - BandTop - 20, Svg.AccentLight, Svg.Accent,
                tooltip: $"closure ± k·u: {DigestText.Pct(closure - kuPct)} to {DigestText.Pct(closure + kuPct)} %");
        }

        if (closureAtMaxVent > closure)
        {
            var mid = (BandTop + BandBottom) / 2;
            svg.Line(x.Map(closure), mid, x.Map(closureAtMaxVent), mid, Svg.Ink, 1, dashed: true);
            svg.Line(x.Map(closureAtMaxVent), mid - 5, x.Map(closureAtMaxVent), mid + 5, Svg.Ink);
        }

        svg.Line(x.Map(closure), BandTop + 2, x.Map(closure), BandBottom - 2, Svg.Ink, 2.5);
        var labelAnchor = x.Map(closure) > (PlotLeft + PlotRight) / 2 ? "end" : "start";
        var labelX = x.Map(closure) + (labelAnchor == "end" ? -6 : 6);
        svg.Text(labelX, BandTop + 8, $"closure {DigestText.Pct(closure)} %", labelAnchor, 11, Svg.Ink, bold: true);
        return svg.ToMarkup();
    }

    /// <summary>The stored expanded uncertainty U = k · u as % of the charged mass; null when not known.</summary>
    public static double? ExpandedUncertaintyPct(FlaggedStep step) =>
        step.Outcome.Limits.ExpandedUncertaintyKg is { } u ? (step.Outcome.MassInKg > 0 ? 100 * u / step.Outcome.MassInKg : 0) : null;

    /// <summary>"1.5 %", or "unknown" for a limit not stored with the step.</summary>
    public static string Known(double? pct) => pct is { } p ? DigestText.Pct(p) + " %" : "unknown";
}
