namespace BatchReconcile.Storage.Queries;

/// <summary>One batch's figures for one recipe step, a point in that step's history.</summary>
public sealed record StepHistoryPoint(
    string BatchId,
    int Revision,
    DateOnly ProductionDay,
    DateTimeOffset? LastOutputAt,
    double? YieldPct,
    double ActualKg,
    double? TheoreticalKg,
    double? Pmi,
    double GapKg,
    double? ClosurePct,
    int FlagCount)
{
    /// <summary>The yield limits this batch's step was judged by; null when unknown (stored before they were kept).</summary>
    public double? YieldMinPct { get; init; }

    public double? YieldMaxPct { get; init; }
}
