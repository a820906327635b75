namespace BatchReconcile.Records.Exports;

/// <summary>Text forms of <see cref="RecipeVersionSource"/>: a contract (JSON <c>recipeVersionSource</c>, the database).</summary>
public static class RecipeVersionSources
{
    public static string ToText(this RecipeVersionSource source) => source switch
    {
        RecipeVersionSource.Export => "export",
        RecipeVersionSource.EffectiveDate => "effective-date",
        RecipeVersionSource.Newest => "newest",
        _ => throw new ArgumentOutOfRangeException(nameof(source), source, null),
    };

    public static bool TryParse(string? text, out RecipeVersionSource source)
    {
        foreach (var candidate in Enum.GetValues<RecipeVersionSource>())
        {
            if (string.Equals(candidate.ToText(), text, StringComparison.Ordinal))
            {
                source = candidate;
                return true;
            }
        }

        source = default;
        return false;
    }
}
