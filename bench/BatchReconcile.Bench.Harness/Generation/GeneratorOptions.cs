namespace BatchReconcile.Bench.Harness.Generation;

/// <summary>What to generate. Everything follows from these values; the same options give the same bytes.</summary>
internal sealed record GeneratorOptions
{
    public required string OutputFolder { get; init; }
    public int Batches { get; init; } = 100;
    public int FirstIndex { get; init; }
    public int Seed { get; init; } = 1;

    /// <summary>Share of batches with a fault (split evenly between low yield, gap and, in one-batch files, malformed).</summary>
    public double FaultShare { get; init; } = 0.05;

    /// <summary>Minimum rows per step; steps with fewer rows get their product rows split into more drums. 0: as the templates.</summary>
    public int RowsPerStep { get; init; }

    /// <summary>
    /// Maximum rows per step (0: as the templates): steps with more rows are compacted, rung by rung, until they
    /// fit or nothing is left to compact (BatchGenerator.Compact). Masses, yields and the balance stay those of the batch.
    /// </summary>
    public int MaxRowsPerStep { get; init; }

    /// <summary>Batches per production day, counted over the batch index (index / BatchesPerDay is the day number).</summary>
    public int BatchesPerDay { get; init; } = 50;

    public DateOnly FirstDay { get; init; } = new(2024, 1, 1);

    /// <summary>Batches per file; 1 is the plant's usual export. Files of several batches never carry malformed batches.</summary>
    public int BatchesPerFile { get; init; } = 1;

    /// <summary>When above 0: one file of at least this many bytes (batches keep coming until it is reached); Batches is ignored.</summary>
    public long OneFileBytes { get; init; }

    public string BatchPrefix { get; init; } = "SYN";

    /// <summary>
    /// When true, every second batch made from a template of recipe version N &gt; 1 states version N - 1, so
    /// that any period of the history holds batches of two versions of that recipe (for <c>compare</c>).
    /// </summary>
    public bool AlternateVersions { get; init; } = true;
}
