using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Digest.Model;

/// <summary>Everything one day's digest shows. The host fills it from the store; the renderers only read it.</summary>
/// <param name="OpenEarlierCount">All flags from earlier days still open or in review.</param>
/// <param name="OpenEarlier">Those flags listed (the host may list fewer than it counts).</param>
/// <param name="Exceptions">The day's flags, in any order (the renderers sort them).</param>
/// <param name="FlaggedSteps">The day's steps with at least one flag.</param>
/// <param name="Yields">The recipe steps run on the day, with their yield history.</param>
public sealed record DigestData(
    string SiteName,
    DigestDay Day,
    DateTimeOffset GeneratedAt,
    int BatchesCompleted,
    int StepsReconciled,
    int OpenEarlierCount,
    IReadOnlyList<OpenFlagItem> OpenEarlier,
    IReadOnlyList<DigestException> Exceptions,
    IReadOnlyList<FlaggedStep> FlaggedSteps,
    IReadOnlyList<RecipeStepYields> Yields)
{
    public int BatchesCompleted { get; } = BatchesCompleted >= 0
        ? BatchesCompleted
        : throw new ArgumentOutOfRangeException(nameof(BatchesCompleted), BatchesCompleted, "A count is not negative.");

    public int StepsReconciled { get; } = StepsReconciled >= 0
        ? StepsReconciled
        : throw new ArgumentOutOfRangeException(nameof(StepsReconciled), StepsReconciled, "A count is not negative.");

    public int OpenEarlierCount { get; } = OpenEarlierCount >= OpenEarlier.Count
        ? OpenEarlierCount
        : throw new ArgumentException($"{OpenEarlier.Count} open flags listed but only {OpenEarlierCount} counted.", nameof(OpenEarlierCount));

    /// <summary>The day's batches of recipes with more than one step, with their route yields; empty when none.</summary>
    public IReadOnlyList<BatchRouteYield> RouteYields { get; init; } = [];

    /// <summary>Set when this digest replaces an earlier issue of the day (the renderers say so at the top).</summary>
    public DigestIssue? Reissue { get; init; }

    /// <summary>
    /// A digest asked for before the day ended: titled provisional, written under its own file names and never
    /// recorded as the day's digest. <see cref="Reissue"/> is then null.
    /// </summary>
    public bool Provisional { get; init; }

    /// <summary>The day's flags by severity, counted from <see cref="Exceptions"/> so the two never disagree.</summary>
    public SeverityCounts FlagCounts => new(
        Exceptions.Count(e => e.Severity == FlagSeverity.Critical),
        Exceptions.Count(e => e.Severity == FlagSeverity.Major),
        Exceptions.Count(e => e.Severity == FlagSeverity.Minor));
}
