using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Records.Exports.Reading;

/// <summary>A batch being read: its rows while the file is still clean, and always the little it
/// takes to check the batch as a whole (its recipe, its streams, the analyses that name them).</summary>
internal sealed class OpenBatch(string id, int firstLine)
{
    private readonly HashSet<string> _streams = new(StringComparer.Ordinal);
    private readonly List<(int Line, string Step, string Stream)> _analyses = [];

    public string Id { get; } = id;

    public int FirstLine { get; } = firstLine;

    /// <summary>The recipe of the first row that named a known one with its version, and that row's line.</summary>
    public Recipe? Recipe { get; private set; }

    public int RecipeLine { get; private set; }

    /// <summary>The recipe code of the first row that named a known recipe (with or without a version), and that row's line.</summary>
    public string? RecipeCode { get; private set; }

    public int RecipeCodeLine { get; private set; }

    /// <summary>The earliest recorded_at of the batch's rows (by instant); null while none has one.</summary>
    public DateTimeOffset? FirstRecordedAt { get; private set; }

    /// <summary>Rows that gave no recipe_version, with the step as written: their step is checked once the batch's version is chosen.</summary>
    public List<(int Line, string Step)> UnversionedSteps { get; } = [];

    /// <summary>Null once the file has an error: rows of a rejected file are not kept.</summary>
    public List<RecordRow>? Rows { get; private set; } = [];

    public void SetRecipe(Recipe recipe, int line)
    {
        Recipe = recipe;
        RecipeLine = line;
    }

    public void SetRecipeCode(string code, int line)
    {
        RecipeCode = code;
        RecipeCodeLine = line;
    }

    public void Recorded(DateTimeOffset at)
    {
        if (FirstRecordedAt is null || at < FirstRecordedAt)
        {
            FirstRecordedAt = at;
        }
    }

    public void DropRows() => Rows = null;

    public void AddStream(string step, string stream) => _streams.Add(StreamKey(step, stream));

    public void AddAnalysis(int line, string step, string stream) => _analyses.Add((line, step, stream));

    /// <summary>Analyses that name a stream no other row of their step has.</summary>
    public IEnumerable<(int Line, string Step, string Stream)> UnmatchedAnalyses() =>
        _analyses.Where(a => !_streams.Contains(StreamKey(a.Step, a.Stream)));

    // Labels are typed by people on the plant floor: compare them trimmed and without case.
    private static string StreamKey(string step, string stream) =>
        string.Concat(step.Trim().ToUpperInvariant(), "\u001F", stream.Trim().ToUpperInvariant());
}
