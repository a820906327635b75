namespace BatchReconcile.Storage.Queries;

/// <summary>One line of a list of batches: the current revision and how many flags it carries.</summary>
public sealed record BatchSummary(string BatchId, int Revision, string Recipe, int RecipeVersion, DateOnly ProductionDay, int FlagCount)
{
    /// <summary>Steps stored with the revision (the recipe's steps).</summary>
    public int StepCount { get; init; }

    /// <summary>The stored route yield; null when not computable (<see cref="RouteNote"/> says why).</summary>
    public double? RouteYieldPct { get; init; }

    public string? RouteNote { get; init; }

    /// <summary>Flags of the revision that are not closed (open or in review); <see cref="FlagCount"/> counts every flag.</summary>
    public int OpenFlagCount { get; init; }

    /// <summary>When the batch's last output was recorded (the second key of the production order); null when unknown.</summary>
    public DateTimeOffset? LastOutputAt { get; init; }
}
