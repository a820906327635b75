using System.Globalization;

namespace BatchReconcile.Records.Definitions.Loading;

/// <summary>
/// Loads process-definition files (materials and recipes, JSON) into a <see cref="ProcessCatalog"/>,
/// or reports every problem found in them. Reads files only: no logging, no watching. A host that
/// reloads on change calls <see cref="LoadFolder"/> again and swaps catalogues only on success.
/// </summary>
/// <remarks>
/// Each call reads the whole set afresh, because a change in one file can break another (a recipe
/// naming a material that another file just dropped, a code that now clashes).
/// </remarks>
public static class ProcessDefinitionLoader
{
    /// <summary>Whether a file is read by <see cref="LoadFolder"/>: "*.json", not hidden (editors' lock and backup files start with '.').</summary>
    public static bool IsDefinitionFile(string path)
    {
        ArgumentNullException.ThrowIfNull(path);
        var name = Path.GetFileName(path);
        return name.Length > ".json".Length
            && !name.StartsWith('.')
            && name.EndsWith(".json", StringComparison.OrdinalIgnoreCase);
    }

    /// <summary>
    /// Loads every definition file directly in <paramref name="folder"/> (not sub-folders). Files are
    /// named in messages as "folder-name/file.json", e.g. "processes/benzocaine.json".
    /// </summary>
    public static ProcessDefinitionLoadResult LoadFolder(string folder)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(folder);
        if (!Directory.Exists(folder))
        {
            return ProcessDefinitionLoadResult.Failure(
                [new DefinitionError(folder, null, null, "the process-definition folder does not exist")], [], []);
        }

        string[] paths;
        try
        {
            paths = Directory.EnumerateFiles(folder).Where(IsDefinitionFile).ToArray();
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            return ProcessDefinitionLoadResult.Failure(
                [new DefinitionError(folder, null, null, $"the folder cannot be listed: {e.Message}")], [], []);
        }

        var folderName = Path.GetFileName(Path.TrimEndingDirectorySeparator(Path.GetFullPath(folder)));
        var result = Load(paths.Select(p => (Name: $"{folderName}/{Path.GetFileName(p)}", Path: p)));
        if (result.IsSuccess && result.Files.Count == 0)
        {
            return ProcessDefinitionLoadResult.Success(
                result.Catalog,
                [new DefinitionNote(folder, null, null, "no process-definition files (*.json) found; the catalogue is empty")],
                []);
        }

        return result;
    }

    /// <summary>Loads the given files as one set; they are named in messages by the paths as given.</summary>
    public static ProcessDefinitionLoadResult LoadFiles(IEnumerable<string> paths)
    {
        ArgumentNullException.ThrowIfNull(paths);
        return Load(paths.Select(p => (Name: p, Path: p)));
    }

    private static ProcessDefinitionLoadResult Load(IEnumerable<(string Name, string Path)> sources)
    {
        var errors = new List<DefinitionError>();
        var notes = new List<DefinitionNote>();

        // Ordinal order: which of two clashing files is "first" must not depend on the file system.
        var ordered = sources.OrderBy(s => s.Name, StringComparer.Ordinal).ToArray();
        var drafts = new List<FileDraft>();
        foreach (var (name, path) in ordered)
        {
            byte[] bytes;
            try
            {
                bytes = File.ReadAllBytes(path);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                errors.Add(new DefinitionError(name, null, null, $"the file cannot be read: {e.Message}"));
                continue;
            }

            if (DefinitionFileReader.Read(name, bytes, errors) is { } draft)
            {
                drafts.Add(draft);
            }
        }

        var materials = CollectMaterials(drafts, errors);
        MaterialDraft? Find(string code) => materials.GetValueOrDefault(code.Trim());
        CheckSolutions(materials.Values, Find, errors);
        var hints = new MaterialHints(materials);

        var recipes = new List<Recipe>();
        foreach (var recipe in CollectRecipes(drafts, errors))
        {
            if (BuildRecipe(recipe, Find, errors, notes, hints) is { } built)
            {
                recipes.Add(built);
            }
        }

        CheckEffectiveDates(recipes, errors);
        var files = ordered.Select(s => s.Name).ToArray();
        if (errors.Count > 0)
        {
            return ProcessDefinitionLoadResult.Failure(errors, notes, files);
        }

        var catalog = new ProcessCatalog(
            materials.Values.Select(m => new Material(m.Code, m.Name!, m.Formula, m.Role!.Value, m.Vented, m.File)
            {
                Composition = m.Composition?.Select(c => new SolutionComponent(Find(c.Code)!.Code, c.Pct)).ToArray() ?? [],
            }),
            recipes);
        return ProcessDefinitionLoadResult.Success(catalog, notes, files);
    }

    private static Dictionary<string, MaterialDraft> CollectMaterials(List<FileDraft> drafts, List<DefinitionError> errors)
    {
        var byCode = new Dictionary<string, MaterialDraft>(StringComparer.OrdinalIgnoreCase);
        foreach (var material in drafts.SelectMany(d => d.Materials))
        {
            if (!byCode.TryGetValue(material.Code, out var earlier))
            {
                byCode.Add(material.Code, material);
                continue;
            }

            var at = new DefinitionLocation(material.File);
            errors.Add(at.Error(earlier.File == material.File
                ? $"material code '{material.Code}' is defined twice in this file ({earlier.Path} and {material.Path})"
                : $"material code '{material.Code}' is also defined in {earlier.File}; material codes must be unique across all files"));
        }

        return byCode;
    }

    /// <summary>Each component of a solution is a substance of some loaded file: known, with a formula, not a solution itself.</summary>
    private static void CheckSolutions(IEnumerable<MaterialDraft> materials, Func<string, MaterialDraft?> find, List<DefinitionError> errors)
    {
        foreach (var solution in materials.Where(m => m.Composition is not null))
        {
            var at = new DefinitionLocation(solution.File);
            foreach (var (code, _) in solution.Composition!)
            {
                var component = find(code);
                if (component is null)
                {
                    errors.Add(at.Error($"material '{solution.Code}': composition names '{code}', which is not a material in any loaded file"));
                }
                else if (component.Composition is not null)
                {
                    errors.Add(at.Error(
                        $"material '{solution.Code}': composition names '{component.Code}', which is itself a solution; give the components of both directly"));
                }
                else if (component.Formula is null)
                {
                    errors.Add(at.Error($"material '{solution.Code}': composition names '{component.Code}', which was refused ({component.File}, see its own error)"));
                }
            }
        }
    }

    private static List<RecipeDraft> CollectRecipes(List<FileDraft> drafts, List<DefinitionError> errors)
    {
        var seen = new Dictionary<(string, int), RecipeDraft>();
        var result = new List<RecipeDraft>();
        foreach (var recipe in drafts.SelectMany(d => d.Recipes))
        {
            result.Add(recipe);
            if (recipe.Code is null || recipe.Version is not { } version)
            {
                continue;
            }

            var key = (recipe.Code.ToUpperInvariant(), version);
            if (!seen.TryGetValue(key, out var earlier))
            {
                seen.Add(key, recipe);
                continue;
            }

            var v = version.ToString(CultureInfo.InvariantCulture);
            var at = new DefinitionLocation(recipe.File, recipe.Code);
            errors.Add(at.Error(earlier.File == recipe.File
                ? $"version {v} is defined twice in this file ({earlier.Path} and {recipe.Path}); give the newer one the next version"
                : $"version {v} is also defined in {earlier.File}; each recipe version must be defined once"));
        }

        return result;
    }

    private static Recipe? BuildRecipe(
        RecipeDraft draft,
        Func<string, MaterialDraft?> materials,
        List<DefinitionError> errors,
        List<DefinitionNote> notes,
        MaterialHints hints)
    {
        var recipeAt = new DefinitionLocation(draft.File, draft.Code, Version: draft.Version);
        var steps = new List<RecipeStep>();
        foreach (var step in draft.Steps)
        {
            var at = recipeAt.InStep(step.Code);
            var errorsBefore = errors.Count;
            var reaction = RecipeReactionBuilder.Build(step.ReactionText, step.ProductCode, materials, at, errors, notes, hints);
            var equivalents = BuildEquivalents(step, materials, at, errors, hints);
            if (errors.Count == errorsBefore
                && reaction is not null
                && step is { Code: { } code, Name: { } name, ProductCode: { } product, YieldPct: { } yieldPct, BalanceTolerancePct: { } tolerance })
            {
                steps.Add(new RecipeStep(
                    code,
                    name,
                    reaction,
                    materials(product)!.Code,
                    yieldPct,
                    tolerance,
                    equivalents,
                    step.Severities,
                    step.ProductInWasteMaxPct));
            }
        }

        // Any error anywhere fails the whole load, so a partial recipe is never handed out; the
        // fields are only complete when the first pass found nothing wrong with them either.
        return steps.Count == draft.Steps.Count && draft is { Code: not null, Version: not null, Name: not null } && steps.Count > 0
            ? new Recipe(draft.Code, draft.Version.Value, draft.Name, steps, draft.File, draft.EffectiveFrom)
            : null;
    }

    /// <summary>
    /// The effective dates of one recipe's versions must name one version per date, and a later version
    /// must not take effect before an earlier one: either would leave the version of an export without
    /// one to a guess (docs/process-definitions.md).
    /// </summary>
    private static void CheckEffectiveDates(List<Recipe> recipes, List<DefinitionError> errors)
    {
        foreach (var versions in recipes.GroupBy(r => r.Code, StringComparer.OrdinalIgnoreCase))
        {
            Recipe? previous = null;
            foreach (var recipe in versions.Where(r => r.EffectiveFrom is not null).OrderBy(r => r.Version))
            {
                if (previous is not null && recipe.EffectiveFrom <= previous.EffectiveFrom)
                {
                    var at = new DefinitionLocation(recipe.SourceFile, recipe.Code);
                    errors.Add(at.Error(string.Create(
                        CultureInfo.InvariantCulture,
                        $"version {recipe.Version}: 'effectiveFrom' {recipe.EffectiveFrom:yyyy-MM-dd} is not after {previous.EffectiveFrom:yyyy-MM-dd} of version {previous.Version}; each later version takes effect on a later date")));
                }

                previous = recipe;
            }
        }
    }

    private static Dictionary<string, ValueRange> BuildEquivalents(
        StepDraft step,
        Func<string, MaterialDraft?> materials,
        DefinitionLocation at,
        List<DefinitionError> errors,
        MaterialHints hints)
    {
        var result = new Dictionary<string, ValueRange>(StringComparer.OrdinalIgnoreCase);
        foreach (var (code, range) in step.Equivalents)
        {
            var material = materials(code);
            if (material is null)
            {
                errors.Add(at.Error($"equivalents name '{code}', which is not a material in any loaded file{hints.Near(code)}"));
                continue;
            }

            if (material.Composition is not null)
            {
                errors.Add(at.Error(
                    $"equivalents name '{material.Code}', a solution; name the component whose equivalents are meant ({ComponentList(material)})"));
                continue;
            }

            if (step.ProductCode is not null && string.Equals(material.Code, materials(step.ProductCode)?.Code, StringComparison.Ordinal))
            {
                errors.Add(at.Error($"equivalents name the step's product '{material.Code}'; equivalents are for charged materials"));
                continue;
            }

            if (range is not null && !result.TryAdd(material.Code, range))
            {
                errors.Add(at.Error($"equivalents give '{material.Code}' twice"));
            }
        }

        return result;
    }

    /// <summary>"HCL 36 %, WATER 64 %" for messages about a solution.</summary>
    internal static string ComponentList(MaterialDraft solution) =>
        string.Join(", ", solution.Composition!.Select(c => $"{c.Code} {c.Pct.ToString("0.###", CultureInfo.InvariantCulture)} %"));
}
