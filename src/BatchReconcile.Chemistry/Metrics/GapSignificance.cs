namespace BatchReconcile.Chemistry.Metrics;

/// <summary>The rule that decides whether a mass-balance loss or surplus is worth a flag.</summary>
public static class GapSignificance
{
    /// <summary>
    /// True only when <paramref name="amountKg"/> exceeds both the tolerance and the expanded uncertainty k·u_c
    /// (strictly: a gap equal to either limit is not significant).
    /// </summary>
    /// <remarks>
    /// Tolerance alone would flag small batches weighed on coarse balances; uncertainty alone would flag
    /// large batches whose gap is well inside what the recipe accepts. Requiring both keeps flags for
    /// gaps that are real (beyond measurement) and matter (beyond the recipe's allowance).
    /// </remarks>
    public static bool IsSignificant(double amountKg, double toleranceKg, double expandedUncertaintyKg) =>
        amountKg > toleranceKg && amountKg > expandedUncertaintyKg;
}
