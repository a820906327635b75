namespace BatchReconcile.Reconciliation.Outcomes;

/// <summary>
/// The overall yield of a batch's route: the final step's product against the theoretical from the first step's
/// limiting reactant through the stoichiometry of every step (docs/computation.md, "Route yield").
/// </summary>
/// <param name="YieldPct">100·m_act,final/m_theo,route; null when not computable (see <paramref name="Reason"/>).</param>
/// <param name="TheoreticalKg">m_theo,route in kg; null when not computable.</param>
/// <param name="Reason">Why it is not computable; null when it is.</param>
public sealed record RouteYield(double? YieldPct, double? TheoreticalKg, string? Reason)
{
    public static RouteYield NotComputable(string reason) => new(null, null, reason);
}
