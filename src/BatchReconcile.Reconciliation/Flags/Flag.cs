using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Reconciliation.Flags;

/// <summary>One finding on one step of one batch.</summary>
/// <param name="Step">The recipe step code.</param>
/// <param name="Measured">The measured value that broke the limit (yield %, gap kg, equivalents ...).</param>
/// <param name="Limit">The limit it broke, in the same unit.</param>
/// <param name="Unit">Unit of <paramref name="Measured"/> and <paramref name="Limit"/>: "%", "kg", "equiv" or empty.</param>
/// <param name="Message">One plain sentence a QA reviewer can act on.</param>
/// <param name="Subject">What the flag is about within the step, e.g. the reagent or reactant code; null when the step itself.</param>
public sealed record Flag(
    FlagCode Code,
    FlagSeverity Severity,
    string Step,
    double? Measured,
    double? Limit,
    string Unit,
    string Message,
    string? Subject = null);
