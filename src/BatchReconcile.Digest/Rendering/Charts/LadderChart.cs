using BatchReconcile.Digest.Model;
using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Digest.Rendering.Charts;

/// <summary>The loss ladder as a horizontal waterfall: charged mass, each rung taken off in turn, isolated product.</summary>
/// <remarks>
/// A negative rung (yield above theory) is drawn as a dashed outline going the other way, never clipped.
/// Solvents and work-up materials are often most of the charged mass, and then the rungs of the reaction and the
/// yield are slivers on a scale set by the solvent. When they are more than half of the charged mass, or a rung
/// that a flag of the step is about would be drawn narrower than <see cref="MinReadablePx"/>, a second panel
/// (<see cref="DrawReaction"/>) shows the ladder without the solvent and recovered rungs, on its own scale from the
/// reactants charged. A second panel rather than a broken axis, because every bar in it stays to scale and the
/// first panel still shows the solvent's true share; rather than labels alone, because the value labels are printed
/// anyway and a bar a pixel wide is still unreadable. A flagged rung is drawn dark, labelled "flag:", and at least
/// <see cref="MinFlaggedPx"/> wide (its value is printed beside it).
/// </remarks>
internal static class LadderChart
{
    /// <summary>A rung drawn narrower than this (px at full size) cannot be read.</summary>
    public const double MinReadablePx = 6;

    /// <summary>A flagged rung is never drawn narrower than this.</summary>
    public const double MinFlaggedPx = 4;

    private const double Width = 700;
    private const double LabelRight = 292;
    private const double PlotLeft = 300;
    private const double PlotRight = 560;
    private const double ValueLeft = 568;
    private const double RowHeight = 22;
    private const double Top = 8;
    private const double AxisSpace = 44;

    private static readonly string[] OutsideReaction = [LadderRungKeys.AuxiliariesNotRecovered, LadderRungKeys.Recovered];

    private static readonly string[] YieldRungs = [LadderRungKeys.ProductInWaste, LadderRungKeys.ProductInSamples, LadderRungKeys.UnexplainedYieldLoss];

    /// <summary>The rung keys a flag is about: the rungs whose size raised it.</summary>
    public static IReadOnlyList<string> RungsOf(FlagCode code) => code switch
    {
        FlagCode.ProductInWaste => [LadderRungKeys.ProductInWaste],
        FlagCode.YieldLow or FlagCode.YieldHigh or FlagCode.YieldOverTheory => YieldRungs,
        FlagCode.EquivalentsOutOfRange => [LadderRungKeys.ExcessReactants],
        _ => [],
    };

    public static string Draw(FlaggedStep step, IReadOnlyCollection<FlagCode> flags)
    {
        var outcome = step.Outcome;
        var flagged = FlaggedRungs(outcome, flags);
        var rows = new List<Row> { new("charged (all inputs)", null, 0, outcome.MassInKg, outcome.MassInKg, 100, true) };
        var running = outcome.MassInKg;
        foreach (var rung in outcome.Ladder)
        {
            rows.Add(new(rung.Label, rung.Key, running - rung.Kg, running, rung.Kg, rung.PctOfCharged, false));
            running -= rung.Kg;
        }

        rows.Add(new("isolated product", null, 0, outcome.ActualKg, outcome.ActualKg, ProductPct(outcome), true));
        var title = $"Loss ladder of batch {step.BatchId}, step {step.Step}: kg from charged mass down to isolated product";
        return Panel(step, rows, flagged, "all", title, Math.Max(outcome.MassInKg, 0));
    }

    /// <summary>The second panel (see the remarks), or null when the first one shows every rung readably.</summary>
    public static string? DrawReaction(FlaggedStep step, IReadOnlyCollection<FlagCode> flags)
    {
        var outcome = step.Outcome;
        if (!NeedsReactionPanel(outcome, flags))
        {
            return null;
        }

        var flagged = FlaggedRungs(outcome, flags);
        var reactants = outcome.MassInKg - outcome.Ladder.Where(r => OutsideReaction.Contains(r.Key)).Sum(r => r.Kg);
        if (!(reactants > 0))
        {
            return null;
        }

        var rows = new List<Row>
        {
            new("reactants charged", null, 0, reactants, reactants, outcome.MassInKg > 0 ? 100 * reactants / outcome.MassInKg : null, true),
        };
        var running = reactants;
        foreach (var rung in outcome.Ladder.Where(r => !OutsideReaction.Contains(r.Key)))
        {
            rows.Add(new(rung.Label, rung.Key, running - rung.Kg, running, rung.Kg, rung.PctOfCharged, false));
            running -= rung.Kg;
        }

        rows.Add(new("isolated product", null, 0, outcome.ActualKg, outcome.ActualKg, ProductPct(outcome), true));
        var title = $"Loss ladder of batch {step.BatchId}, step {step.Step} without solvents, auxiliaries and recovered streams: "
            + "kg from the reactants charged down to isolated product";
        return Panel(step, rows, flagged, "reaction", title, reactants);
    }

    /// <summary>Whether the second panel is drawn: solvents and recovered streams above half the charge, or a flagged rung too thin to read.</summary>
    public static bool NeedsReactionPanel(StepOutcome outcome, IReadOnlyCollection<FlagCode> flags)
    {
        ArgumentNullException.ThrowIfNull(outcome);
        if (!(outcome.MassInKg > 0) || outcome.Ladder.Count == 0)
        {
            return false;
        }

        var outside = outcome.Ladder.Where(r => OutsideReaction.Contains(r.Key)).Sum(r => Math.Abs(r.Kg));
        if (outside > 0.5 * outcome.MassInKg)
        {
            return true;
        }

        var flagged = FlaggedRungs(outcome, flags);
        var low = Math.Min(0, outcome.Ladder.Min(r => r.Kg));
        var pxPerKg = (PlotRight - PlotLeft) / (Math.Max(outcome.MassInKg, 1e-12) - low);
        return outcome.Ladder.Any(r => flagged.Contains(r.Key) && r.Kg != 0 && Math.Abs(r.Kg) * pxPerKg < MinReadablePx);
    }

    private static HashSet<string> FlaggedRungs(StepOutcome outcome, IReadOnlyCollection<FlagCode> flags)
    {
        ArgumentNullException.ThrowIfNull(flags);
        var keys = flags.SelectMany(RungsOf).ToHashSet(StringComparer.Ordinal);
        // Of the yield rungs only those that hold mass: a yield-low step with all of it unexplained points at that rung.
        keys.RemoveWhere(k => outcome.Ladder.FirstOrDefault(r => r.Key == k) is not { } rung || rung.Kg == 0);
        return keys;
    }

    private static double? ProductPct(StepOutcome outcome) => outcome.MassInKg > 0 ? 100 * outcome.ActualKg / outcome.MassInKg : null;

    private static string Panel(FlaggedStep step, List<Row> rows, HashSet<string> flagged, string panel, string title, double scaleKg)
    {
        var decimals = DigestText.KgDecimals(step.Outcome.MassInKg);
        var low = Math.Min(0, rows.Min(r => Math.Min(r.From, r.To)));
        var high = Math.Max(scaleKg, rows.Max(r => Math.Max(r.From, r.To)));
        var x = Axis.Over(low, high, PlotLeft, PlotRight);
        var plotBottom = Top + (rows.Count * RowHeight);
        var height = plotBottom + AxisSpace;

        var svg = new Svg(Width, height, title,
            "Each row is a rung of the loss ladder in kg and % of the charged mass; a dashed outline marks a negative rung; "
            + "a dark bar labelled flag is a rung a flag of the step is about.");
        svg.Attribute("data-panel", panel);

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
            var row = rows[i];
            var y = Top + (i * RowHeight);
            var left = x.Map(Math.Min(row.From, row.To));
            var width = Math.Abs(x.Map(row.To) - x.Map(row.From));
            var negative = !row.Total && row.Kg < 0;
            var isFlagged = row.Key is { } key && flagged.Contains(key);
            var value = $"{DigestText.Kg(row.Kg, decimals)} kg ({DigestText.Pct(row.Pct)} %)";
            var tooltip = $"{row.Label}: {value}{(negative ? ", negative" : string.Empty)}{(isFlagged ? ", flagged" : string.Empty)}";
            var label = isFlagged ? "flag: " + row.Label : row.Label;
            (string, string)[] data = row.Key is { } k
                ? [("data-rung", k), ("data-flagged", isFlagged ? "true" : "false")]
                : [("data-rung", row.Total ? (i == 0 ? "start" : "product") : string.Empty)];

            svg.Text(LabelRight, y + 15, label, "end", 11, Svg.Ink, bold: row.Total || isFlagged);
            if (isFlagged && width < MinFlaggedPx)
            {
                // Drawn from the running total's side that keeps it inside the plot.
                left = Math.Min(left, PlotRight - MinFlaggedPx);
                width = MinFlaggedPx;
            }

            if (negative)
            {
                svg.Rect(left, y + 4, Math.Max(width, 1), RowHeight - 8, isFlagged ? Svg.AccentLight : "#ffffff", Svg.Ink, dashed: true, tooltip: tooltip, attributes: data);
            }
            else
            {
                var fill = isFlagged ? Svg.Ink : row.Total ? Svg.Accent : Svg.AccentLight;
                svg.Rect(left, y + 4, Math.Max(width, 0.5), RowHeight - 8, fill, row.Total ? null : Svg.Accent, tooltip: tooltip, attributes: data);
            }

            // A thin connector carries the running total down to the next rung, as in a waterfall.
            if (i < rows.Count - 1)
            {
                var next = row.Total ? row.To : row.From;
                svg.Line(x.Map(next), y + RowHeight - 4, x.Map(next), y + RowHeight + 4, Svg.Mid, 1, dashed: true);
            }

            svg.Text(ValueLeft, y + 15, negative ? value + " negative" : value, "start", 10.5, Svg.Ink, bold: isFlagged);
        }

        return svg.ToMarkup();
    }

    private sealed record Row(string Label, string? Key, double From, double To, double Kg, double? Pct, bool Total);
}
