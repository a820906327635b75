using System.Globalization;
using System.Text;
using System.Text.Json;
using BatchReconcile.Chemistry.Formulas;

namespace BatchReconcile.Records.Definitions.Loading;

/// <summary>
/// First pass: reads one process-definition file into drafts and checks everything that can be
/// checked within the file (types, required keys, formulas, roles, ranges, flag codes). Whatever
/// needs the other files (material lookups, reactions, uniqueness across files) is left to the loader.
/// </summary>
internal static class DefinitionFileReader
{
    private static readonly JsonDocumentOptions Options = new()
    {
        // Accept more than the contract asks, never less: comments and trailing commas are harmless
        // in hand-edited config. Duplicate keys are not: which one would win is a guess.
        CommentHandling = JsonCommentHandling.Skip,
        AllowTrailingCommas = true,
        AllowDuplicateProperties = false,
    };

    private static readonly (string Text, MaterialRole Role)[] Roles =
    [
        ("reactant", MaterialRole.Reactant),
        ("solvent", MaterialRole.Solvent),
        ("catalyst", MaterialRole.Catalyst),
        ("reagent", MaterialRole.Reagent),
        ("water", MaterialRole.Water),
        ("workup", MaterialRole.Workup),
    ];

    public static FileDraft? Read(string file, byte[] bytes, List<DefinitionError> errors)
    {
        var at = new DefinitionLocation(file);
        var content = StripBom(bytes);
        JsonDocument document;
        try
        {
            document = JsonDocument.Parse(content, Options);
        }
        catch (JsonException e)
        {
            errors.Add(at.Error(DescribeSyntaxError(e, content.Span)));
            return null;
        }

        using (document)
        {
            var fields = new JsonFields(errors);
            var root = document.RootElement;
            if (!fields.IsKind(root, JsonValueKind.Object, at, "the file"))
            {
                return null;
            }

            var materialsValue = fields.Get(root, "materials", required: false, at, "the file");
            var recipesValue = fields.Get(root, "recipes", required: false, at, "the file");
            if (materialsValue is null && recipesValue is null)
            {
                errors.Add(at.Error("the file has neither 'materials' nor 'recipes'; is it a process-definition file?"));
                return null;
            }

            var materials = new List<MaterialDraft>();
            if (materialsValue is { } m && fields.IsKind(m, JsonValueKind.Array, at, "'materials'"))
            {
                var index = 0;
                foreach (var item in m.EnumerateArray())
                {
                    if (ReadMaterial(item, $"materials[{index}]", at, fields, errors) is { } material)
                    {
                        materials.Add(material);
                    }

                    index++;
                }
            }

            var recipes = new List<RecipeDraft>();
            if (recipesValue is { } r && fields.IsKind(r, JsonValueKind.Array, at, "'recipes'"))
            {
                var index = 0;
                foreach (var item in r.EnumerateArray())
                {
                    if (ReadRecipe(item, $"recipes[{index}]", at, fields, errors) is { } recipe)
                    {
                        recipes.Add(recipe);
                    }

                    index++;
                }
            }

            return new FileDraft(materials, recipes);
        }
    }

    /// <summary>Material codes are written into reactions, so they must read as one species there.</summary>
    public static bool IsValidMaterialCode(string code) =>
        code.Length > 0
        && char.IsAsciiLetter(code[0])
        && code.All(c => char.IsAsciiLetterOrDigit(c) || c is '_' or '-' or '.');

    private static MaterialDraft? ReadMaterial(JsonElement item, string path, DefinitionLocation at, JsonFields fields, List<DefinitionError> errors)
    {
        if (!fields.IsKind(item, JsonValueKind.Object, at, path))
        {
            return null;
        }

        var errorsBefore = errors.Count;
        var code = fields.String(item, "code", required: true, at, path);
        var owner = code is null ? path : $"material '{code}'";
        var name = fields.String(item, "name", required: true, at, owner);
        var hasComposition = item.TryGetProperty("composition", out _);
        var formulaText = fields.String(item, "formula", required: !hasComposition, at, owner);
        var roleText = fields.String(item, "role", required: false, at, owner);
        var vented = fields.Boolean(item, "vented", at, owner) ?? false;

        if (code is not null && !IsValidMaterialCode(code))
        {
            errors.Add(at.Error(
                $"{owner}: a material code starts with a letter and holds only letters, digits, '_', '-' and '.' "
                + "(it is written into reactions, where spaces, '+' and arrows have a meaning)"));
        }

        Formula? formula = null;
        if (formulaText is not null)
        {
            if (Formula.TryParse(formulaText, out var parsed, out var formulaError))
            {
                formula = parsed;
            }
            else
            {
                // The formula reader's messages name the position ("unknown element 'Q' at 7"); add it where one does not.
                var position = formulaError.Position.ToString(CultureInfo.InvariantCulture);
                var located = formulaError.Message.Contains($"at {position}", StringComparison.Ordinal)
                    ? formulaError.Message
                    : $"{formulaError.Message} (at {position})";
                errors.Add(at.Error($"{owner}: formula '{formulaText}' is not valid: {located}"));
            }
        }

        IReadOnlyList<(string Code, double Pct)>? composition = null;
        if (hasComposition)
        {
            composition = ReadComposition(item, code, owner, formulaText is not null, roleText is not null, vented, at, fields, errors);
        }

        MaterialRole? role = MaterialRole.Reactant;
        if (roleText is not null)
        {
            role = ParseRole(roleText);
            if (role is null)
            {
                errors.Add(at.Error(
                    $"{owner}: role '{roleText}' is not known; expected one of {string.Join(", ", Roles.Select(x => x.Text))}"));
            }
        }

        // A refused material is still kept by code, so reactions naming it are not also told it is unknown.
        return code is null ? null : new MaterialDraft(code, name, formula, role, vented, errors.Count == errorsBefore, at.File, path) { Composition = composition };
    }

    /// <summary>Mass fractions a solution may be off 100 % in all, for rounded label values (33.3 + 66.7).</summary>
    internal const double CompositionTolerancePct = 0.01;

    /// <summary>
    /// "composition": { "HCL": 36, "WATER": 64 }: component codes with their mass %, the main component first.
    /// Checked here: the shape, each share in (0, 100], the sum 100 ± 0.01, no repeats, and that the material has no
    /// formula, role or vented of its own. The components themselves are checked by the loader (they may be in other files).
    /// </summary>
    private static List<(string Code, double Pct)>? ReadComposition(
        JsonElement item,
        string? code,
        string owner,
        bool hasFormula,
        bool hasRole,
        bool vented,
        DefinitionLocation at,
        JsonFields fields,
        List<DefinitionError> errors)
    {
        var value = item.GetProperty("composition");
        if (hasFormula)
        {
            errors.Add(at.Error($"{owner}: give either 'formula' (a substance) or 'composition' (a solution of other materials), not both"));
        }

        if (hasRole)
        {
            errors.Add(at.Error($"{owner}: a solution has no 'role' of its own; each component counts with the role of its own material"));
        }

        if (vented)
        {
            errors.Add(at.Error($"{owner}: a solution is charged and weighed as a liquid, so it cannot be 'vented'"));
        }

        if (!fields.IsKind(value, JsonValueKind.Object, at, $"{owner}: 'composition' (expected {{ \"CODE\": mass %, ... }})"))
        {
            return null;
        }

        var result = new List<(string Code, double Pct)>();
        var ok = true;
        foreach (var property in value.EnumerateObject())
        {
            var component = property.Name.Trim();
            var pct = fields.Number(property.Value, at, $"{owner}: composition of '{component}'");
            if (pct is null)
            {
                ok = false;
                continue;
            }

            if (pct.Value <= 0 || pct.Value > 100)
            {
                errors.Add(at.Error($"{owner}: composition of '{component}' must be more than 0 and at most 100 (mass %), found {Format(pct.Value)}"));
                ok = false;
            }

            if (code is not null && string.Equals(component, code, StringComparison.OrdinalIgnoreCase))
            {
                errors.Add(at.Error($"{owner}: its composition names the solution itself"));
                ok = false;
            }
            else if (result.Any(c => string.Equals(c.Code, component, StringComparison.OrdinalIgnoreCase)))
            {
                errors.Add(at.Error($"{owner}: composition names '{component}' twice"));
                ok = false;
            }

            result.Add((component, pct.Value));
        }

        if (result.Count < 2)
        {
            errors.Add(at.Error($"{owner}: a composition needs at least two components (a material of one component is that material; give it a formula)"));
            return null;
        }

        var sum = result.Sum(c => c.Pct);
        if (ok && Math.Abs(sum - 100) > CompositionTolerancePct + 1e-9)
        {
            errors.Add(at.Error(
                $"{owner}: composition adds up to {Format(Math.Round(sum, 6))} %, not 100 % (within {Format(CompositionTolerancePct)}); give every component, the solvent too"));
            ok = false;
        }

        return ok ? result : null;
    }

    private static MaterialRole? ParseRole(string text)
    {
        foreach (var (t, role) in Roles)
        {
            if (string.Equals(t, text, StringComparison.OrdinalIgnoreCase))
            {
                return role;
            }
        }

        return null;
    }

    private static RecipeDraft? ReadRecipe(JsonElement item, string path, DefinitionLocation file, JsonFields fields, List<DefinitionError> errors)
    {
        if (!fields.IsKind(item, JsonValueKind.Object, file, path))
        {
            return null;
        }

        var code = fields.String(item, "code", required: true, file, path);
        var at = file.InRecipe(code);
        var owner = code is null ? path : "recipe";
        var version = fields.Integer(item, "version", required: true, at, owner);
        if (version is < 1)
        {
            errors.Add(at.Error($"{owner}: 'version' must be 1 or more, found {version.Value.ToString(CultureInfo.InvariantCulture)}"));
            version = null;
        }

        // From here on every message names the version too: recipes are kept in several versions side by side.
        at = file.InRecipe(code, version);

        var name = fields.String(item, "name", required: true, at, owner);
        var effectiveFrom = ReadEffectiveFrom(item, owner, at, fields, errors);
        var steps = new List<StepDraft>();
        if (fields.Get(item, "steps", required: true, at, owner) is { } stepsValue
            && fields.IsKind(stepsValue, JsonValueKind.Array, at, $"{owner}: 'steps'"))
        {
            if (stepsValue.GetArrayLength() == 0)
            {
                errors.Add(at.Error($"{owner}: 'steps' is empty; a recipe needs at least one step"));
            }

            var index = 0;
            var seen = new Dictionary<string, int>(StringComparer.OrdinalIgnoreCase);
            foreach (var stepItem in stepsValue.EnumerateArray())
            {
                if (ReadStep(stepItem, $"steps[{index}]", at, fields, errors) is { } step)
                {
                    if (step.Code is not null)
                    {
                        if (seen.TryGetValue(step.Code, out var earlier))
                        {
                            errors.Add(at.InStep(step.Code).Error(
                                $"step code '{step.Code}' is used twice in this recipe (steps[{earlier.ToString(CultureInfo.InvariantCulture)}] and steps[{index.ToString(CultureInfo.InvariantCulture)}])"));
                        }
                        else
                        {
                            seen.Add(step.Code, index);
                        }
                    }

                    steps.Add(step);
                }

                index++;
            }
        }

        return new RecipeDraft(code, version, name, steps, file.File, path, effectiveFrom);
    }

    /// <summary>'effectiveFrom': a calendar date "YYYY-MM-DD" (the site's time zone), optional.</summary>
    private static DateOnly? ReadEffectiveFrom(JsonElement item, string owner, DefinitionLocation at, JsonFields fields, List<DefinitionError> errors)
    {
        if (fields.Get(item, "effectiveFrom", required: false, at, owner) is not { } value)
        {
            return null;
        }

        if (value.ValueKind == JsonValueKind.String
            && DateOnly.TryParseExact(value.GetString()!.Trim(), "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out var date))
        {
            return date;
        }

        errors.Add(at.Error(
            $"{owner}: 'effectiveFrom' must be a calendar date written YYYY-MM-DD, e.g. \"2026-03-01\" (a date in the site's time zone), found {JsonFields.Describe(value)}"));
        return null;
    }

    private static StepDraft? ReadStep(JsonElement item, string path, DefinitionLocation recipe, JsonFields fields, List<DefinitionError> errors)
    {
        if (!fields.IsKind(item, JsonValueKind.Object, recipe, path))
        {
            return null;
        }

        var code = fields.String(item, "code", required: true, recipe, path);
        var at = recipe.InStep(code);
        var owner = code is null ? path : "step";
        var name = fields.String(item, "name", required: true, at, owner);
        var reaction = fields.String(item, "reaction", required: true, at, owner);
        var product = fields.String(item, "product", required: true, at, owner);

        ValueRange? yieldPct = null;
        if (fields.Get(item, "yieldPct", required: true, at, owner) is { } yieldValue)
        {
            // A master-record yield range above 100 % would accept product that cannot exist;
            // over-100 % results are the yield-over-theory flag's business, not the range's.
            yieldPct = ReadRange(yieldValue, $"{owner}: 'yieldPct'", at, fields, errors, minAllowed: 0, minInclusive: true, maxAllowed: 100);
        }

        var tolerance = fields.Number(item, "balanceTolerancePct", required: true, at, owner);
        if (tolerance is { } t && (t <= 0 || t > 100))
        {
            errors.Add(at.Error($"{owner}: 'balanceTolerancePct' must be more than 0 and at most 100, found {Format(t)}"));
            tolerance = null;
        }

        var equivalents = new List<(string, ValueRange?)>();
        if (fields.Get(item, "equivalents", required: false, at, owner) is { } equivalentsValue
            && fields.IsKind(equivalentsValue, JsonValueKind.Object, at, $"{owner}: 'equivalents'"))
        {
            foreach (var property in equivalentsValue.EnumerateObject())
            {
                var range = ReadRange(property.Value, $"{owner}: equivalents of '{property.Name}'", at, fields, errors, minAllowed: 0, minInclusive: false, maxAllowed: null);
                equivalents.Add((property.Name.Trim(), range));
            }
        }

        var severities = new Dictionary<FlagCode, FlagSeverity>();
        if (fields.Get(item, "severities", required: false, at, owner) is { } severitiesValue
            && fields.IsKind(severitiesValue, JsonValueKind.Object, at, $"{owner}: 'severities'"))
        {
            foreach (var property in severitiesValue.EnumerateObject())
            {
                ReadSeverity(property, owner, at, errors, severities);
            }
        }

        var inWaste = fields.Number(item, "productInWasteMaxPct", required: false, at, owner);
        if (inWaste is { } w && (w < 0 || w > 100))
        {
            errors.Add(at.Error($"{owner}: 'productInWasteMaxPct' must be from 0 to 100, found {Format(w)}"));
            inWaste = null;
        }

        return new StepDraft(code, name, reaction, product, yieldPct, tolerance, equivalents, severities, inWaste);
    }

    private static void ReadSeverity(
        JsonProperty property,
        string owner,
        DefinitionLocation at,
        List<DefinitionError> errors,
        Dictionary<FlagCode, FlagSeverity> severities)
    {
        var ok = true;
        if (!FlagCodes.TryParse(property.Name, out var flag))
        {
            errors.Add(at.Error(
                $"{owner}: severities: '{property.Name}' is not a flag code; expected one of {string.Join(", ", FlagCodes.All.Select(c => c.ToText()))}"));
            ok = false;
        }

        var text = property.Value.ValueKind == JsonValueKind.String ? property.Value.GetString() : null;
        if (!FlagCodes.TryParseSeverity(text, out var severity))
        {
            errors.Add(at.Error(
                $"{owner}: severities: '{property.Name}' has severity {JsonFields.Describe(property.Value)}; expected \"critical\", \"major\" or \"minor\""));
            ok = false;
        }

        if (!ok)
        {
            return;
        }

        if (!severities.TryAdd(flag, severity!.Value))
        {
            errors.Add(at.Error($"{owner}: severities: '{flag.ToText()}' is given twice"));
        }
    }

    private static ValueRange? ReadRange(
        JsonElement value,
        string what,
        DefinitionLocation at,
        JsonFields fields,
        List<DefinitionError> errors,
        double minAllowed,
        bool minInclusive,
        double? maxAllowed)
    {
        if (!fields.IsKind(value, JsonValueKind.Object, at, what + " (expected { \"min\": ..., \"max\": ... })"))
        {
            return null;
        }

        var min = fields.Number(value, "min", required: true, at, what);
        var max = fields.Number(value, "max", required: true, at, what);
        if (min is null || max is null)
        {
            return null;
        }

        var problems = new List<string>();
        var lowOk = minInclusive ? min.Value >= minAllowed : min.Value > minAllowed;
        if (!lowOk)
        {
            problems.Add($"min {Format(min.Value)} must be {(minInclusive ? "at least" : "more than")} {Format(minAllowed)}");
        }

        if (maxAllowed is { } top && max.Value > top)
        {
            problems.Add($"max {Format(max.Value)} must be at most {Format(top)}");
        }

        if (min.Value > max.Value)
        {
            problems.Add($"min {Format(min.Value)} is above max {Format(max.Value)}");
        }

        if (problems.Count > 0)
        {
            errors.Add(at.Error($"{what}: {string.Join("; ", problems)}"));
            return null;
        }

        return new ValueRange(min.Value, max.Value);
    }

    private static string Format(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    private static ReadOnlyMemory<byte> StripBom(byte[] bytes) =>
        bytes.AsSpan().StartsWith(Encoding.UTF8.Preamble) ? bytes.AsMemory(Encoding.UTF8.Preamble.Length) : bytes;

    /// <summary>"not valid JSON at line 4, character 17: ..." (1-based; characters, not bytes).</summary>
    private static string DescribeSyntaxError(JsonException e, ReadOnlySpan<byte> content)
    {
        var reason = e.Message;
        var cut = reason.IndexOf(" LineNumber:", StringComparison.Ordinal);
        if (cut >= 0)
        {
            reason = reason[..cut];
        }

        reason = reason.Trim().TrimEnd('.');
        long line;
        long column;
        if (e.LineNumber is { } l)
        {
            line = l;
            column = CharacterColumn(content, line, e.BytePositionInLine ?? 0);
        }
        else if (FindDuplicateKey(content) is { } offset)
        {
            // The document builder reports a repeated key without a position; find it ourselves.
            (line, column) = LineAndColumn(content, offset);
        }
        else
        {
            return $"not valid JSON: {reason}";
        }

        return $"not valid JSON at line {(line + 1).ToString(CultureInfo.InvariantCulture)}, character {column.ToString(CultureInfo.InvariantCulture)}: {reason}";
    }

    /// <summary>Byte offset of the first key repeated within one object, if any.</summary>
    private static long? FindDuplicateKey(ReadOnlySpan<byte> content)
    {
        var reader = new Utf8JsonReader(content, new JsonReaderOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true });
        var open = new Stack<HashSet<string>>();
        try
        {
            while (reader.Read())
            {
                switch (reader.TokenType)
                {
                    case JsonTokenType.StartObject:
                        open.Push(new HashSet<string>(StringComparer.Ordinal));
                        break;
                    case JsonTokenType.EndObject:
                        open.Pop();
                        break;
                    case JsonTokenType.PropertyName when !open.Peek().Add(reader.GetString()!):
                        return reader.TokenStartIndex;
                }
            }
        }
        catch (JsonException)
        {
            // Only called after the document parsed as far as the repeated key; nothing more to find.
        }

        return null;
    }

    private static (long Line, long Column) LineAndColumn(ReadOnlySpan<byte> content, long offset)
    {
        var before = content[..(int)offset];
        var line = before.Count((byte)'\n');
        var lineStart = before.LastIndexOf((byte)'\n') + 1;
        return (line, Encoding.UTF8.GetCharCount(before[lineStart..]) + 1);
    }

    // The reader counts bytes in the line; people count characters (an 'é' before the error is one, not two).
    private static long CharacterColumn(ReadOnlySpan<byte> content, long line, long bytePosition)
    {
        var start = 0;
        for (long l = 0; l < line; l++)
        {
            var next = content[start..].IndexOf((byte)'\n');
            if (next < 0)
            {
                return bytePosition + 1;
            }

            start += next + 1;
        }

        var length = (int)Math.Min(bytePosition, content.Length - start);
        return Encoding.UTF8.GetCharCount(content.Slice(start, length)) + 1;
    }
}
