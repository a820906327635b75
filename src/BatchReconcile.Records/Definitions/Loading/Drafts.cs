using BatchReconcile.Chemistry.Formulas;

namespace BatchReconcile.Records.Definitions.Loading;

// What one file says, read and checked on its own. Cross-file checks (unique codes, reactions
// naming materials of other files) need every file's drafts first, so the loader works in two passes.
// Fields are null where the file's value was missing or refused (an error is already recorded then).

/// <summary>A material as read; <see cref="IsValid"/> is false when any of its fields was refused.</summary>
internal sealed record MaterialDraft(
    string Code,
    string? Name,
    Formula? Formula,
    MaterialRole? Role,
    bool Vented,
    bool IsValid,
    string File,
    string Path)
{
    /// <summary>A solution's components (code as written, mass %), the main one first; null for a substance.</summary>
    public IReadOnlyList<(string Code, double Pct)>? Composition { get; init; }
}

internal sealed record RecipeDraft(
    string? Code,
    int? Version,
    string? Name,
    IReadOnlyList<StepDraft> Steps,
    string File,
    string Path,
    DateOnly? EffectiveFrom = null);

internal sealed record StepDraft(
    string? Code,
    string? Name,
    string? ReactionText,
    string? ProductCode,
    ValueRange? YieldPct,
    double? BalanceTolerancePct,
    IReadOnlyList<(string Code, ValueRange? Range)> Equivalents,
    IReadOnlyDictionary<FlagCode, FlagSeverity> Severities,
    double? ProductInWasteMaxPct);

internal sealed record FileDraft(IReadOnlyList<MaterialDraft> Materials, IReadOnlyList<RecipeDraft> Recipes);
