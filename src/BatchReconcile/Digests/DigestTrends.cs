using BatchReconcile.Analysis.Trends;
using BatchReconcile.Digest.Model;
using BatchReconcile.Storage.Queries;

namespace BatchReconcile.Digests;

/// <summary>
/// The digest's view of a step's yield trend (docs/analysis.md, "In the daily digest"): the history the digest draws (the last
/// 30 batches up to the day), the first 20 of them (or all, when fewer) as the baseline of an individuals chart, and for each
/// batch the run rules its yield breaks. Information only: nothing here raises or changes a flag.
/// </summary>
public static class DigestTrends
{
    /// <summary>How many of the history's first batches set the centre line and the limits.</summary>
    public const int BaselineCount = 20;

    /// <summary>The run rules each point's yield breaks (empty for a point without a yield, or when there are fewer than 2 yields).</summary>
    public static IReadOnlyList<RuleSignal>[] Signals(IReadOnlyList<StepHistoryPoint> history)
    {
        ArgumentNullException.ThrowIfNull(history);
        var result = new IReadOnlyList<RuleSignal>[history.Count];
        Array.Fill(result, []);
        if (Chart(history) is not { } chart)
        {
            return result;
        }

        foreach (var (point, index) in chart.Points.Zip(chart.Indexes))
        {
            result[index] = [.. point.Signals.Select(code => new RuleSignal(code, RunRules.Describe(code)))];
        }

        return result;
    }

    /// <summary>The note for one batch of the history: its run in the trend and the rules it breaks; null when it has no yield or the history is too short.</summary>
    public static TrendNote? Note(IReadOnlyList<StepHistoryPoint> history, string batchId)
    {
        ArgumentNullException.ThrowIfNull(history);
        if (Chart(history) is not { } chart)
        {
            return null;
        }

        var at = chart.Indexes.IndexOf(history.ToList().FindLastIndex(p => p.BatchId == batchId));
        if (at < 0)
        {
            return null;
        }

        var values = chart.Points.Take(at + 1).Select(p => p.Value).ToList();
        var signals = chart.Points[at].Signals.Select(code => new RuleSignal(code, RunRules.Describe(code))).ToList();
        return new TrendNote(TrendContext.Describe(values, chart.Limits.Mean), signals, chart.Limits.Mean, history.Count, chart.Limits.BaselineCount);
    }

    /// <summary>The individuals chart of the history's yields, with the history index of each point; null with fewer than 2 yields.</summary>
    private static (IReadOnlyList<ChartPoint> Points, List<int> Indexes, ControlLimits Limits)? Chart(IReadOnlyList<StepHistoryPoint> history)
    {
        var indexes = Enumerable.Range(0, history.Count).Where(i => history[i].YieldPct is not null).ToList();
        if (indexes.Count < 2)
        {
            return null;
        }

        var chart = IndividualsChart.Build([.. indexes.Select(i => history[i].YieldPct!.Value)], 0, Math.Min(BaselineCount, indexes.Count));
        return (chart.Points, indexes, chart.Limits);
    }
}
