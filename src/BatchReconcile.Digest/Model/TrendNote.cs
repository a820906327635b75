namespace BatchReconcile.Digest.Model;

/// <summary>
/// A step's yield against its recent trend (docs/analysis.md, "In the daily digest"): information for the reader, never a flag.
/// The host computes it from the step's history (the last batches up to the day, the first of them as the baseline).
/// </summary>
/// <param name="Context">One line about the batch in its recent run ("3rd of the last 5 batches below the centre line"); null when there is too little history.</param>
/// <param name="Signals">The run rules the batch's yield breaks, each with its plain sentence; empty when none.</param>
/// <param name="Centre">The centre line of the trend, % (mean of the baseline batches).</param>
/// <param name="HistoryCount">Batches of the history the trend was drawn from.</param>
/// <param name="BaselineCount">The first of them that set the centre line and the limits.</param>
public sealed record TrendNote(string? Context, IReadOnlyList<RuleSignal> Signals, double Centre, int HistoryCount, int BaselineCount);

/// <summary>A run rule a value breaks: its code ("rule-2") and plain sentence.</summary>
public sealed record RuleSignal(string Code, string Description);
