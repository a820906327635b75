namespace BatchReconcile.Chemistry.Formulas;

/// <summary>
/// A located problem. <see cref="Index"/> and <see cref="OtherIndex"/> are 0-based indexes into the text
/// as given; <see cref="IsMultiplier"/> tells a leading multiplier from a count for the wording.
/// </summary>
internal readonly record struct ReadFailure(FormulaProblem Problem, int Index, int OtherIndex = -1, bool IsMultiplier = false);
