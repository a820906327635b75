using BatchReconcile.Reconciliation.Flags;

namespace BatchReconcile.Storage.Queries;

/// <summary>A flag as stored: the finding, its id (shown to people) and its review state.</summary>
/// <param name="State">"open" until the review workflow moves it on.</param>
/// <param name="IsCurrent">False once its revision has been superseded by a re-export.</param>
public sealed record StoredFlag(long Id, Flag Flag, string State, DateOnly ProductionDay, bool IsCurrent, DateTimeOffset CreatedAt);
