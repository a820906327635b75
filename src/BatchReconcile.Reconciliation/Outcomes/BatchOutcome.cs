using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Outcomes;

/// <summary>A reconciled batch: every step of its recipe in order, with their flags.</summary>
/// <param name="LastOutputAt">Time of the last output row (product, waste, recovered, sample) that has one; null when none has.</param>
public sealed record BatchOutcome(BatchRecord Batch, IReadOnlyList<StepOutcome> Steps, DateTimeOffset? LastOutputAt)
{
    public IEnumerable<Flag> Flags => Steps.SelectMany(s => s.Flags);
}
