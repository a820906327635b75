namespace BatchReconcile.Analysis.Trends;

/// <summary>One value on an I-MR chart, its moving range and the run rules it completes.</summary>
/// <param name="Index">Position in production order (0-based).</param>
/// <param name="Value">The value plotted.</param>
/// <param name="MovingRange">|value - previous value|; null for the first point.</param>
/// <param name="Signals">Codes from <see cref="RunRules.Codes"/> ("rule-1" .. "rule-8") whose pattern this point completes.</param>
public sealed record ChartPoint(int Index, double Value, double? MovingRange, IReadOnlyList<string> Signals);
