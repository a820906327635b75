using BatchReconcile.Reconciliation.Outcomes;

namespace BatchReconcile.Storage.Queries;

/// <summary>One current step result of a recipe with its batch: a row of <c>BatchStore.StepsOfRecipe</c>.</summary>
/// <param name="Outcome">Every stored figure of the step, the limits it was judged by included. Its
/// <see cref="StepOutcome.Flags"/> is empty: the flags are counted in <paramref name="OpenFlags"/> and
/// <see cref="FlagCount"/> (<c>GetBatch</c> and <c>GetFlag</c> give them whole).</param>
/// <param name="OpenFlags">Flags of the step in this revision that are not closed (open or in review).</param>
public sealed record RecipeStepRow(string BatchId, int Revision, int RecipeVersion, DateOnly Day, StepOutcome Outcome, int OpenFlags)
{
    /// <summary>Flags of the step in this revision, whatever their state.</summary>
    public int FlagCount { get; init; }

    /// <summary>The step's place in its recipe (1, 2 ...).</summary>
    public int StepOrder { get; init; }

    /// <summary>When the batch's last output was recorded (the second key of the production order); null when unknown.</summary>
    public DateTimeOffset? LastOutputAt { get; init; }

    /// <summary>The batch's route yield as stored with its revision (the same on every step row of the batch).</summary>
    public RouteYield Route { get; init; } = RouteYield.NotComputable("not stored");
}
