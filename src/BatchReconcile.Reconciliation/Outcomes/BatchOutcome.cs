using BatchReconcile.Reconciliation.Flags;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Reconciliation.Outcomes;

/// <summary>A reconciled batch: every step of its recipe in order, with their flags.</summary>
/// <param name="LastOutputAt">Time of the last output row (product, waste, recovered, sample) that has one; null when none has.</param>
public sealed record BatchOutcome(BatchRecord Batch, IReadOnlyList<StepOutcome> Steps, DateTimeOffset? LastOutputAt)
{
    /// <summary>Each later step that charged an earlier step's product, in recipe order.</summary>
    public IReadOnlyList<IntermediateLink> Links { get; init; } = [];

    /// <summary>The overall yield of the route; not computable until reconciled.</summary>
    public RouteYield Route { get; init; } = RouteYield.NotComputable("not reconciled");

    public IEnumerable<Flag> Flags => Steps.SelectMany(s => s.Flags);
}
