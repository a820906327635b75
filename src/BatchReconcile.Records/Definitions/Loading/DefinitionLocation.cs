namespace BatchReconcile.Records.Definitions.Loading;

/// <summary>Where in the definitions the loader is, so each message is located the same way.</summary>
internal readonly record struct DefinitionLocation(string File, string? Recipe = null, string? Step = null, int? Version = null)
{
    public DefinitionError Error(string message) => new(File, Recipe, Step, message, Version);

    public DefinitionNote Note(string message) => new(File, Recipe, Step, message, Version);

    public DefinitionLocation InRecipe(string? recipe, int? version = null) => this with { Recipe = recipe, Version = version, Step = null };

    public DefinitionLocation InStep(string? step) => this with { Step = step };
}
