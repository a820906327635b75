namespace BatchReconcile.Storage.Queries;

/// <summary>
/// Which of a step's JSON-held figures <c>BatchStore.StepsOfRecipe</c> reads. The scalar figures (masses, yields,
/// metrics, limits) are always read; the loss ladder and the equivalents are the bulk of a stored step and most of
/// the cost of reading a long history, so a question that does not need them leaves them out.
/// </summary>
[Flags]
public enum StepParts
{
    /// <summary>Scalar figures only: <see cref="Reconciliation.Outcomes.StepOutcome.Ladder"/> and
    /// <see cref="Reconciliation.Outcomes.StepOutcome.Equivalents"/> come back empty and the limits'
    /// <see cref="Reconciliation.Outcomes.StepLimits.EquivalentsRanges"/> null (not read, not "none").</summary>
    Figures = 0,

    /// <summary>The loss ladder.</summary>
    Ladder = 1,

    /// <summary>The equivalents per material and the allowed equivalents ranges.</summary>
    Equivalents = 2,

    All = Ladder | Equivalents,
}
