using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Storage.Queries;

/// <summary>One line of <c>flags list</c>.</summary>
public sealed record FlagListItem(
    long Id,
    string BatchId,
    int Revision,
    string Step,
    FlagCode Code,
    FlagSeverity Severity,
    string State,
    DateOnly ProductionDay,
    string Message,
    double? Measured,
    double? Limit,
    string Unit,
    string? Subject,
    bool IsCurrent);
