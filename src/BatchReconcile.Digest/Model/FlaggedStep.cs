using BatchReconcile.Reconciliation.Outcomes;
using BatchReconcile.Records.Exports;

namespace BatchReconcile.Digest.Model;

/// <summary>A step with at least one flag on the digest's day, with the figures its charts are drawn from.</summary>
/// <param name="Outcome">The step's reconciled figures (ladder rungs, masses in and out, vented, gap, closure) and the
/// limits stored with it (<see cref="StepOutcome.Limits"/>): the digest draws those, never today's definitions.</param>
public sealed record FlaggedStep(
    string BatchId,
    int Revision,
    string Recipe,
    StepOutcome Outcome)
{
    /// <summary>The recipe version the batch was reconciled with.</summary>
    public int? RecipeVersion { get; init; }

    /// <summary>How the version was chosen; null when unknown (stored before it was recorded).</summary>
    public RecipeVersionSource? RecipeVersionSource { get; init; }

    public string Step => Outcome.Step;

    /// <summary>The step's yield against its recent trend; null when not computed (too little history, or no yield).</summary>
    public TrendNote? Trend { get; init; }

    /// <summary>k of the balance decision, as stored with the step; null when unknown.</summary>
    public double? CoverageFactor => Outcome.Limits.CoverageFactor;

    /// <summary>The step's balance tolerance, % of the charged mass, as stored with the step; null when unknown.</summary>
    public double? TolerancePct => Outcome.Limits.BalanceTolerancePct;

    /// <summary>"recipe R v2 (version source: export)" as the digest names it.</summary>
    public string RecipeText =>
        RecipeVersion is { } v
            ? FormattableString.Invariant($"{Recipe} v{v} (version source: {RecipeVersionSource?.ToText() ?? "unknown"})")
            : Recipe;
}
