namespace BatchReconcile.Records.Definitions.Loading;

/// <summary>Where in the definitions the loader is, so each message is located the same way.</summary>
internal readonly record struct DefinitionLocation(string File, string? Recipe = null, string? Step = null)
{
    public DefinitionError Error(string message) => new(File, Recipe, Step, message);

    public DefinitionNote Note(string message) => new(File, Recipe, Step, message);

    public DefinitionLocation InRecipe(string? recipe) => this with { Recipe = recipe, Step = null };

    public DefinitionLocation InStep(string? step) => this with { Step = step };
}
