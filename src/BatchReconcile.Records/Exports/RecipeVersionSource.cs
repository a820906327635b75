namespace BatchReconcile.Records.Exports;

/// <summary>How the recipe version of a batch was chosen (<c>recipeVersionSource</c>; docs/export-format.md).</summary>
public enum RecipeVersionSource
{
    /// <summary>The export's <c>recipe_version</c> column names it (text <c>export</c>).</summary>
    Export,

    /// <summary>The export gives none; the version in effect on the local date of the batch's first recorded time (text <c>effective-date</c>).</summary>
    EffectiveDate,

    /// <summary>Neither decides it; the newest version was used and the batch carries the <c>recipe-version-unstated</c> flag (text <c>newest</c>).</summary>
    Newest,
}
