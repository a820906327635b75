namespace BatchReconcile.Bench.Harness.Measuring;

/// <summary>Sizes and repeats of one harness run; <see cref="Quick"/> is the CI smoke size.</summary>
internal sealed record SuiteOptions
{
    public required string Repo { get; init; }
    public required string Work { get; init; }
    public bool Quick { get; init; }
    public int Runs { get; init; } = 5;
    public int SmallBacklog { get; init; } = 1_000;
    public int LargeBacklog { get; init; } = 10_000;
    public int LatencyFiles { get; init; } = 20;

    /// <summary>One-batch files of about 10 rows (issue 12): ingest, run, the Python peer and the floor side by side.</summary>
    public int SmallFileBacklog { get; init; } = 10_000;

    /// <summary>Only publish and the small-file comparison (<c>bench/run peer</c>).</summary>
    public bool SmallFilesOnly { get; init; }
    public double LatencyRatePerSecond { get; init; } = 1.0;
    public double ContrastSettleSeconds { get; init; } = 0.25;

    /// <summary>Batches added to the large backlog's store, in one file, to make the large history (also the big-file case).</summary>
    public int BigFileBatches { get; init; } = 106_000;
    public int BigFileRuns { get; init; } = 3;
    public int BatchesPerDay { get; init; } = 50;
    public bool Kernels { get; init; } = true;
    public int Seed { get; init; } = 20261123;

    public static SuiteOptions ForQuick(string repo, string work) => new()
    {
        Repo = repo,
        Work = work,
        Quick = true,
        Runs = 1,
        SmallBacklog = 30,
        LargeBacklog = 100,
        SmallFileBacklog = 60,
        LatencyFiles = 3,
        LatencyRatePerSecond = 2.0,
        BigFileBatches = 900,
        BigFileRuns = 1,
    };
}
