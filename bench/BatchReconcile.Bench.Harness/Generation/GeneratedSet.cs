namespace BatchReconcile.Bench.Harness.Generation;

/// <summary>What a generator run wrote: the counts the measurements divide by.</summary>
internal sealed record GeneratedSet(
    string Folder,
    int Files,
    int Batches,
    long Rows,
    long Bytes,
    int LowYield,
    int Gap,
    int Malformed,
    IReadOnlyList<string> FileNames);
