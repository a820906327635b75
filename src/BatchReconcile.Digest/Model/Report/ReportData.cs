namespace BatchReconcile.Digest.Model.Report;

/// <summary>
/// Everything the analysis report of one recipe shows: a control chart per step, the loss Pareto and the
/// version comparison. Plain values, filled by the host from the store and the statistics; the renderer only reads it.
/// </summary>
/// <param name="From">First production day asked for (inclusive); null when open.</param>
/// <param name="To">Last production day asked for (inclusive); null when open.</param>
/// <param name="Trends">One trend per recipe step, in recipe order.</param>
/// <param name="Comparison">Null when the period has fewer than two recipe versions.</param>
public sealed record ReportData(
    string SiteName,
    string Recipe,
    DateOnly? From,
    DateOnly? To,
    DateTimeOffset GeneratedAt,
    IReadOnlyList<StepTrend> Trends,
    LossSummary Losses,
    VersionComparison? Comparison)
{
    /// <summary>The plain sentence of each run rule code ("rule-1" ...), for the legends.</summary>
    public IReadOnlyDictionary<string, string> RuleDescriptions { get; init; } = new Dictionary<string, string>(StringComparer.Ordinal);

    /// <summary>The recipe versions of the batches in the period, in order (empty: taken from the trend points).</summary>
    public IReadOnlyList<int> Versions { get; init; } = [];

    /// <summary>When the period holds several versions: the one whose batches the trends chart (the newest), with
    /// limits from its own baseline. Null when the trends chart every batch of the period.</summary>
    public int? ChartedVersion { get; init; }
}

/// <summary>One step's measure batch by batch in production order, with its individuals (I-MR) chart.</summary>
/// <param name="Measure">"yield", "closure", ... as <c>trend --measure</c> names it.</param>
/// <param name="Unit">"%" or "" (PMI and E-factors have none).</param>
/// <param name="Points">Batches with a value, in production order.</param>
/// <param name="Limits">Null when there are too few points for a baseline; <paramref name="NotCharted"/> says why.</param>
/// <param name="Omitted">Batches of the period whose value could not be computed (left out of the chart).</param>
public sealed record StepTrend(
    string Step,
    string StepName,
    string Measure,
    string Unit,
    IReadOnlyList<TrendPoint> Points,
    TrendLimits? Limits,
    string? NotCharted,
    int Omitted = 0)
{
    /// <summary>The master-record (specification) limits of the step for this measure, as stored with the latest batch; null when none or unknown.</summary>
    public double? SpecMin { get; init; }

    public double? SpecMax { get; init; }

    /// <summary>A one-line context of the latest batch in its recent run ("3rd of the last 5 batches below the centre line").</summary>
    public string? Context { get; init; }
}

/// <summary>The control limits of an individuals chart and of its moving-range chart, from the baseline points.</summary>
/// <param name="BaselineStart">Index of the first baseline point in <see cref="StepTrend.Points"/>.</param>
public sealed record TrendLimits(
    double Mean,
    double Sigma,
    double Ucl,
    double Lcl,
    double MeanMovingRange,
    double MovingRangeUcl,
    int BaselineStart,
    int BaselineCount);

/// <param name="MovingRange">|x_i − x_(i−1)|; null for the first point.</param>
/// <param name="Signals">Run rules the point breaks ("rule-1" ...), empty when none.</param>
public sealed record TrendPoint(string BatchId, DateOnly Day, int RecipeVersion, double Value, double? MovingRange, IReadOnlyList<string> Signals);

/// <summary>The loss ladder summed over the period's batches, as a Pareto (largest first).</summary>
/// <param name="TotalChargedKg">All mass charged at every step of the batches summed.</param>
/// <param name="Rows">Step and rung totals sorted by kg, largest first; negative rows last (not counted in the shares).</param>
public sealed record LossSummary(int Batches, double TotalChargedKg, IReadOnlyList<LossRow> Rows)
{
    /// <summary>
    /// Per-material parts of the rungs tied to materials (auxiliaries per auxiliary, excess per reactant), for the batches
    /// stored with them; listed under their rung, never counted in the shares a second time.
    /// </summary>
    public IReadOnlyList<LossPart> Parts { get; init; } = [];
}

/// <param name="Material">Null for a step and rung total (the Pareto's rows).</param>
public sealed record LossRow(string Step, string RungKey, string Label, string? Material, double Kg, double PctOfCharged, double SharePct, double CumulativeSharePct);

/// <summary>One material's part of a rung, summed over the batches.</summary>
/// <param name="PctOfRung">Kg as % of the rung's total at that step.</param>
public sealed record LossPart(string Step, string RungKey, string Material, double Kg, double PctOfCharged, double PctOfRung);

/// <summary>Two recipe versions side by side, per step and for the route.</summary>
/// <param name="Scopes">The steps in recipe order, then the route ("route").</param>
public sealed record VersionComparison(int VersionA, int VersionB, IReadOnlyList<ComparisonScope> Scopes);

/// <param name="Scope">The step code, or "route".</param>
/// <param name="Difference">Welch's test of the mean yields (B − A); null when it cannot be computed.</param>
/// <param name="Conclusion">One plain sentence: too few batches, or what the test says.</param>
public sealed record ComparisonScope(string Scope, string Name, VersionFigures A, VersionFigures B, YieldDifference? Difference, string Conclusion);

/// <summary>The means over one version's batches; null where no batch had the figure.</summary>
/// <param name="YieldLowPct">95 % Student t interval of the mean yield; null when fewer than 2 batches.</param>
/// <param name="SolventSharePct">Solvent mass as % of all mass charged; null when not stored for these batches ("unknown").</param>
/// <param name="OpenFlagRatePct">Batches with at least one open flag at this scope, % of batches.</param>
public sealed record VersionFigures(
    int Version,
    int Batches,
    double? MeanYieldPct,
    double? YieldLowPct,
    double? YieldHighPct,
    double? AtomEconomyPct,
    double? RmePct,
    double? Pmi,
    double? CompleteEFactor,
    double? SimpleEFactor,
    double? SolventSharePct,
    double? OpenFlagRatePct);

/// <summary>Welch's unequal-variance t test: difference of the means B − A, its 95 % interval and the two-sided p-value.</summary>
public sealed record YieldDifference(double Difference, double Low, double High, double T, double DegreesOfFreedom, double PValue);
