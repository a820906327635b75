namespace BatchReconcile.Records.Definitions;

/// <summary>All loaded materials and recipes: what an export is checked against.</summary>
public sealed class ProcessCatalog
{
    private readonly Dictionary<string, Material> _materials;
    private readonly Dictionary<string, List<Recipe>> _recipes;

    public ProcessCatalog(IEnumerable<Material> materials, IEnumerable<Recipe> recipes)
    {
        _materials = materials.ToDictionary(m => m.Code, StringComparer.OrdinalIgnoreCase);
        _recipes = recipes
            .GroupBy(r => r.Code, StringComparer.OrdinalIgnoreCase)
            .ToDictionary(g => g.Key, g => g.OrderBy(r => r.Version).ToList(), StringComparer.OrdinalIgnoreCase);
    }

    public IReadOnlyCollection<Material> Materials => _materials.Values;

    public IEnumerable<Recipe> Recipes => _recipes.Values.SelectMany(v => v);

    public Material? FindMaterial(string code) => _materials.GetValueOrDefault(code.Trim());

    /// <summary>Whether any version of the recipe is defined.</summary>
    public bool HasRecipe(string code) => _recipes.ContainsKey(code.Trim());

    /// <summary>The recipe of that code and version; null when not defined.</summary>
    public Recipe? FindRecipe(string code, int version) =>
        _recipes.TryGetValue(code.Trim(), out var versions) ? versions.FirstOrDefault(r => r.Version == version) : null;

    /// <summary>
    /// The version of a recipe in effect on a local calendar date: the one with the latest
    /// <see cref="Recipe.EffectiveFrom"/> on or before <paramref name="date"/>. Null when the recipe is not
    /// defined, when <paramref name="date"/> is null, or when no version's date is on or before it.
    /// </summary>
    public Recipe? RecipeInEffect(string code, DateOnly? date)
    {
        if (date is not { } d || !_recipes.TryGetValue(code.Trim(), out var versions))
        {
            return null;
        }

        return versions.Where(r => r.EffectiveFrom <= d).MaxBy(r => r.EffectiveFrom);
    }

    /// <summary>The newest (highest) version of a recipe; null when not defined. Only a stated fallback (<see cref="Exports.RecipeVersionSource.Newest"/>) uses it.</summary>
    public Recipe? NewestRecipe(string code) =>
        _recipes.TryGetValue(code.Trim(), out var versions) ? versions[^1] : null;
}
