namespace BatchReconcile.Digest.Model;

/// <summary>A recipe step's yield limits and its recent history, oldest batch first.</summary>
/// <param name="MinYieldPct">The limits stored with the latest batch of the history; null when not known (never assumed).</param>
public sealed record RecipeStepYields(
    string Recipe,
    string Step,
    string StepName,
    double? MinYieldPct,
    double? MaxYieldPct,
    IReadOnlyList<YieldPoint> History)
{
    /// <summary>How many batches the history chart shows at most.</summary>
    public const int MaxHistory = 30;

    public double? MaxYieldPct { get; } = MaxYieldPct is null || MinYieldPct is null || MaxYieldPct >= MinYieldPct
        ? MaxYieldPct
        : throw new ArgumentException($"The yield limits are reversed ({MinYieldPct} > {MaxYieldPct}).", nameof(MaxYieldPct));

    public IReadOnlyList<YieldPoint> History { get; } = History.Count <= MaxHistory
        ? History
        : throw new ArgumentException($"At most {MaxHistory} batches of history, got {History.Count}.", nameof(History));
}
