using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Reconciliation.Outcomes;

/// <summary>
/// The limits and settings a step was judged by, kept with its figures so that every reader shows
/// what decided its flags, not what the definitions say today. A null value is unknown (a step stored
/// before they were kept), never a limit of 0.
/// </summary>
/// <param name="YieldMinPct">The master record's minimum percentage yield.</param>
/// <param name="YieldMaxPct">The master record's maximum percentage yield.</param>
/// <param name="BalanceTolerancePct">The allowed gross mass-balance gap, % of the charged mass.</param>
/// <param name="CoverageFactor">k of the balance decision (site setting).</param>
/// <param name="ExpandedUncertaintyKg">U = k·u_c of the step's mass balance, kg.</param>
/// <param name="EquivalentsRanges">The allowed equivalents by reagent code; empty when the step gives none.</param>
/// <param name="ProductInWasteMaxPct">Product in waste, % of theoretical, above which the step is flagged (step value or site default).</param>
public sealed record StepLimits(
    double? YieldMinPct,
    double? YieldMaxPct,
    double? BalanceTolerancePct,
    double? CoverageFactor,
    double? ExpandedUncertaintyKg,
    IReadOnlyDictionary<string, ValueRange>? EquivalentsRanges,
    double? ProductInWasteMaxPct)
{
    /// <summary>Nothing known: a step stored before the limits were kept.</summary>
    public static StepLimits Unknown { get; } = new(null, null, null, null, null, null, null);
}
