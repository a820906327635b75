namespace BatchReconcile.Reconciliation.Outcomes;

/// <summary>
/// A later step of a batch charging the isolated product of an earlier step of the same batch (docs/computation.md,
/// "Steps of one batch"): pure masses on both sides (after assays).
/// </summary>
/// <param name="Material">The intermediate's material code.</param>
/// <param name="FromStep">The step that isolated it.</param>
/// <param name="ToStep">The step that charged it.</param>
/// <param name="IsolatedKg">m_act of <paramref name="FromStep"/>.</param>
/// <param name="AvailableKg">What was left of it for <paramref name="ToStep"/>: the isolated mass less what earlier steps of the batch charged.</param>
/// <param name="ChargedKg">Σ m·a/100 of the intermediate in <paramref name="ToStep"/>'s charges.</param>
/// <param name="TolerancePct">The balance tolerance of <paramref name="ToStep"/>, % of <paramref name="AvailableKg"/>.</param>
public sealed record IntermediateLink(
    string Material,
    string FromStep,
    string ToStep,
    double IsolatedKg,
    double AvailableKg,
    double ChargedKg,
    double TolerancePct)
{
    /// <summary>Charged above what was available by no more than this is within tolerance.</summary>
    public double AllowedKg => AvailableKg * (1 + (TolerancePct / 100));

    /// <summary>"overdrawn", "held-back" or "matched"; a contract (docs/cli.md).</summary>
    public string State => ChargedKg > AllowedKg * (1 + 1e-9) ? "overdrawn"
        : ChargedKg < AvailableKg * (1 - 1e-9) ? "held-back"
        : "matched";

    /// <summary>Available but not charged here (carried over, held back), kg; 0 when all or more was charged.</summary>
    public double HeldBackKg => Math.Max(0, AvailableKg - ChargedKg);
}
