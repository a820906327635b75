using BatchReconcile.Reconciliation.Outcomes;

namespace BatchReconcile.Storage.Queries;

/// <summary>One stored step: every figure as reconciled, and its flags with their ids.</summary>
/// <param name="Outcome">The step as it was stored; its <see cref="StepOutcome.Flags"/> are the findings of <paramref name="Flags"/>, in the same order.</param>
public sealed record StoredStep(StepOutcome Outcome, IReadOnlyList<StoredFlag> Flags);
