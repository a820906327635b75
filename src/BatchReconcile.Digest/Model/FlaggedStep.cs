using BatchReconcile.Reconciliation.Outcomes;

namespace BatchReconcile.Digest.Model;

/// <summary>A step with at least one flag on the digest's day, with the figures its charts are drawn from.</summary>
/// <param name="Outcome">The step's reconciled figures: ladder rungs, masses in and out, vented, gap, closure, combined uncertainty.</param>
/// <param name="CoverageFactor">k of the balance decision (site setting), for the ± k·u band.</param>
/// <param name="TolerancePct">The step's balance tolerance, % of the charged mass.</param>
public sealed record FlaggedStep(
    string BatchId,
    int Revision,
    string Recipe,
    StepOutcome Outcome,
    double CoverageFactor,
    double TolerancePct)
{
    public double CoverageFactor { get; } = CoverageFactor > 0 && double.IsFinite(CoverageFactor)
        ? CoverageFactor
        : throw new ArgumentOutOfRangeException(nameof(CoverageFactor), CoverageFactor, "The coverage factor is a positive number.");

    public double TolerancePct { get; } = TolerancePct >= 0 && double.IsFinite(TolerancePct)
        ? TolerancePct
        : throw new ArgumentOutOfRangeException(nameof(TolerancePct), TolerancePct, "The tolerance is a non-negative percentage.");

    public string Step => Outcome.Step;
}
