namespace BatchReconcile.Digest.Model;

/// <summary>One batch's yield at a recipe step, for the history chart.</summary>
/// <param name="YieldPct">Null when the yield could not be computed (a reactant was not charged).</param>
/// <param name="OnDigestDay">Whether the batch belongs to the digest's day (marked in the chart).</param>
public sealed record YieldPoint(string BatchId, DateOnly Day, double? YieldPct, bool OnDigestDay)
{
    /// <summary>The run rules this yield breaks within the history shown (information, never a flag); empty when none.</summary>
    public IReadOnlyList<RuleSignal> Signals { get; init; } = [];
}
