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
    int FlagCount);
