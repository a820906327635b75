namespace BatchReconcile.Records.Definitions;

/// <summary>A versioned recipe: its steps in order.</summary>
/// <param name="EffectiveFrom">
/// The calendar date, in the site's time zone, from which this version is in effect; null when the
/// definitions do not say. Decides the version of a batch whose export gives none (docs/process-definitions.md).
/// </param>
public sealed record Recipe(string Code, int Version, string Name, IReadOnlyList<RecipeStep> Steps, string SourceFile, DateOnly? EffectiveFrom = null)
{
    public RecipeStep? FindStep(string stepCode) =>
        Steps.FirstOrDefault(s => string.Equals(s.Code, stepCode, StringComparison.OrdinalIgnoreCase));
}
