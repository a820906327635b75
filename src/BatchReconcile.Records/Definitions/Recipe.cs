namespace BatchReconcile.Records.Definitions;

/// <summary>A versioned recipe: its steps in order.</summary>
public sealed record Recipe(string Code, int Version, string Name, IReadOnlyList<RecipeStep> Steps, string SourceFile)
{
    public RecipeStep? FindStep(string stepCode) =>
        Steps.FirstOrDefault(s => string.Equals(s.Code, stepCode, StringComparison.OrdinalIgnoreCase));
}
