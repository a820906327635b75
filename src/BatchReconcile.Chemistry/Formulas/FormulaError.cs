namespace BatchReconcile.Chemistry.Formulas;

/// <summary>Why a formula could not be read.</summary>
/// <param name="Position">1-based index of the offending character in the text as given (before trimming).</param>
/// <param name="Message">Human-readable message that names the position and what was expected.</param>
public sealed record FormulaError(int Position, string Message);
