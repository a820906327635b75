namespace BatchReconcile.Records.Definitions;

/// <summary>The findings a step reconciliation can raise. Their text codes are a contract (docs/cli.md).</summary>
public enum FlagCode
{
    YieldLow,
    YieldHigh,
    YieldOverTheory,
    BalanceGap,
    BalanceSurplus,
    EquivalentsOutOfRange,
    ReactantMissing,
    StepMissing,
    ProductInWaste,
    IntermediateOverdrawn,

    /// <summary>The export gave no recipe version and no effective date decided one; the newest was used.</summary>
    RecipeVersionUnstated,
}
