namespace BatchReconcile.Storage.Queries;

/// <summary>A step of a recipe by its codes, e.g. (BZC-410, S2).</summary>
public sealed record RecipeStepKey(string Recipe, string Step);
