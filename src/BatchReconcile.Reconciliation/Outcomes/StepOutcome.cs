using BatchReconcile.Reconciliation.Flags;

namespace BatchReconcile.Reconciliation.Outcomes;

/// <summary>Every figure of one reconciled step (docs/computation.md), plus its flags.</summary>
/// <remarks>
/// Figures that cannot be computed (no limiting reactant because a reactant was not charged,
/// no product so no PMI) are null, never NaN or infinity.
/// </remarks>
/// <param name="Limits">Every limit and setting that decided the step's flags, as they were when it was reconciled.</param>
public sealed record StepOutcome(
    string Step,
    bool HasRows,
    string? LimitingReactant,
    double? ExtentMaxMol,
    double? TheoreticalKg,
    double ActualKg,
    double? YieldPct,
    double AtomEconomyPct,
    double? StoichiometricFactor,
    double? RmePct,
    double? Mrp,
    double? OverallRmePct,
    double? Pmi,
    double? CompleteEFactor,
    double? SimpleEFactor,
    double MassInKg,
    double ReactantMassKg,
    double? StoichiometricMassKg,
    double RecoveredKg,
    double MassOutKg,
    double VentedKg,
    double VentedMaxKg,
    double GapKg,
    double? ClosurePct,
    double CombinedUncertaintyKg,
    IReadOnlyDictionary<string, double> Equivalents,
    IReadOnlyList<LadderRung> Ladder,
    IReadOnlyList<Flag> Flags,
    StepLimits Limits);
