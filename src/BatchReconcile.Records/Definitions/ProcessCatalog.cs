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

    /// <summary>The recipe of that code and version; without a version, the newest.</summary>
    public Recipe? FindRecipe(string code, int? version = null)
    {
        if (!_recipes.TryGetValue(code.Trim(), out var versions))
        {
            return null;
        }

        return version is null ? versions[^1] : versions.FirstOrDefault(r => r.Version == version);
    }
}
