using System.Globalization;
using BatchReconcile.Analysis.Trends;
using BatchReconcile.Cli;
using BatchReconcile.Digest.Model.Report;
using BatchReconcile.Storage.Queries;

namespace BatchReconcile.RecipeAnalysis;

/// <summary>Which batches the control limits are computed from: the first N with a value, or those of a range of production days.</summary>
public sealed record BaselineChoice(int? Count = null, DateOnly? From = null, DateOnly? To = null)
{
    /// <summary>The first 20 batches (or all, when fewer), as the issue and docs/analysis.md say.</summary>
    public const int DefaultCount = 20;

    public static BaselineChoice Default { get; } = new();

    /// <summary>"--baseline 12" or "--baseline-from D --baseline-to D", for messages.</summary>
    public string Describe() => From is { } f && To is { } t
        ? string.Create(CultureInfo.InvariantCulture, $"--baseline-from {f:yyyy-MM-dd} --baseline-to {t:yyyy-MM-dd}")
        : string.Create(CultureInfo.InvariantCulture, $"--baseline {Count ?? DefaultCount}");
}

/// <summary>Turns a stored series into a trend with its I-MR chart (docs/analysis.md, "Trend").</summary>
public static class TrendBuilder
{
    /// <summary>The measure's label on charts and in text ("yield", "PMI" ...).</summary>
    public static string Label(StepMeasure measure) => measure.ToText();

    /// <summary>The unit printed after values: "%" for percentages, "kg" for the gap, "" for ratios and equivalents.</summary>
    public static string Unit(StepMeasure measure) => measure.Unit switch
    {
        "%" => "%",
        "kg" => "kg",
        _ => string.Empty,
    };

    /// <summary>
    /// The trend of one step. Batches without a value are left out (counted in <see cref="StepTrend.Omitted"/>). Fewer than 2
    /// values give a trend without limits whose <see cref="StepTrend.NotCharted"/> says so; an explicit baseline that does not
    /// fit the values is bad input.
    /// </summary>
    public static StepTrend Build(string step, string stepName, StepMeasure measure, IReadOnlyList<StepSeriesPoint> series, BaselineChoice baseline)
    {
        ArgumentNullException.ThrowIfNull(series);
        ArgumentNullException.ThrowIfNull(baseline);
        var valued = series.Where(p => p.Value is not null).ToList();
        var values = valued.Select(p => p.Value!.Value).ToList();
        var omitted = series.Count - valued.Count;

        var (start, count, reason) = Baseline(step, valued, baseline);
        if (reason is not null)
        {
            var plain = valued.Select((p, i) => new TrendPoint(p.BatchId, p.Day, p.RecipeVersion, values[i], i == 0 ? null : Math.Abs(values[i] - values[i - 1]), [])).ToList();
            return new StepTrend(step, stepName, Label(measure), Unit(measure), plain, null, reason, omitted);
        }

        var chart = IndividualsChart.Build(values, start, count);
        var l = chart.Limits;
        var points = chart.Points.Select(c => new TrendPoint(valued[c.Index].BatchId, valued[c.Index].Day, valued[c.Index].RecipeVersion, c.Value, c.MovingRange, c.Signals)).ToList();
        return new StepTrend(
            step, stepName, Label(measure), Unit(measure), points,
            new TrendLimits(l.Mean, l.Sigma, l.Ucl, l.Lcl, l.MeanMovingRange, l.MovingRangeUcl, l.BaselineStart, l.BaselineCount),
            null, omitted)
        {
            Context = TrendContext.Describe(values, l.Mean),
        };
    }

    private static (int Start, int Count, string? NotEnough) Baseline(string step, List<StepSeriesPoint> valued, BaselineChoice choice)
    {
        if (choice.From is { } from && choice.To is { } to)
        {
            var inRange = valued.Select((p, i) => (p, i)).Where(x => x.p.Day >= from && x.p.Day <= to).Select(x => x.i).ToList();
            if (inRange.Count < 2)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                    $"{choice.Describe()}: step {step} has {inRange.Count} batch(es) with a value in those days; a baseline needs at least 2"));
            }

            // Production order is by day first, so the batches of a range of days are consecutive.
            return (inRange[0], inRange.Count, null);
        }

        if (choice.Count is { } n)
        {
            if (n < 2)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--baseline {n}: a baseline needs at least 2 batches"));
            }

            if (n > valued.Count && valued.Count >= 2)
            {
                throw new UsageException(string.Create(CultureInfo.InvariantCulture,
                    $"--baseline {n}: step {step} has only {valued.Count} batches with a value in the period"));
            }
        }

        if (valued.Count < 2)
        {
            return (0, 0, string.Create(CultureInfo.InvariantCulture,
                $"step {step}: not enough points for a control chart ({valued.Count} batch(es) with a value; the baseline needs at least 2)"));
        }

        return (0, Math.Min(choice.Count ?? BaselineChoice.DefaultCount, valued.Count), null);
    }
}
