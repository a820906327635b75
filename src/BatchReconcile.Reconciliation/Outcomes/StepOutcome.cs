using BatchReconcile.Reconciliation.Flags;

namespace BatchReconcile.Reconciliation.Outcomes;

/// <summary>Every figure of one reconciled step (docs/computation.md), plus its flags.</summary>
/// <remarks>
/// Figures that cannot be computed (no limiting reactant because a reactant was not charged,
/// no product so no PMI) are null, never NaN or infinity.
/// </remarks>
/// <param name="Limits">Every limit and setting that decided the step's flags, as they were when it was reconciled.</param>
/// <param name="SolventInKg">Solvent charged, kg: rows whose role is solvent plus the solvent components of solutions,
/// never a reactant of the equation (docs/computation.md). Null when not known (stored before schema version 9).</param>
/// <param name="WaterInKg">Water charged, kg, counted the same way; null when not known (stored before schema version 9).</param>
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
    StepLimits Limits,
    double? SolventInKg = null,
    double? WaterInKg = null);
