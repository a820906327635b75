namespace BatchReconcile.Storage.Queries;

/// <summary>One batch's value of one figure of one recipe step: a point of <c>BatchStore.StepSeries</c>.</summary>
/// <param name="Value">The figure as stored; null when it was not computable for the batch (or, for equivalents, the
/// material was not charged).</param>
/// <param name="OpenFlags">Flags of the step in this revision that are not closed (open or in review).</param>
public sealed record StepSeriesPoint(string BatchId, int Revision, int RecipeVersion, DateOnly Day, double? Value, int OpenFlags)
{
    /// <summary>When the batch's last output was recorded (the second key of the production order); null when unknown.</summary>
    public DateTimeOffset? LastOutputAt { get; init; }
}
