namespace BatchReconcile.Digest.Model;

/// <summary>A batch of the day whose recipe has more than one step, with its route yield (docs/computation.md, "Route yield").</summary>
/// <param name="YieldPct">Null when not computable; <paramref name="Reason"/> then says why.</param>
public sealed record BatchRouteYield(string BatchId, int Revision, string Recipe, double? YieldPct, string? Reason);
