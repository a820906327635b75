using System.Globalization;
using System.Text.Json;

namespace BatchReconcile.Records.Definitions.Loading;

/// <summary>
/// Reads typed values out of a JSON object and records a located error for each missing or
/// mistyped one, so a file's problems are all collected in one pass.
/// </summary>
internal sealed class JsonFields(List<DefinitionError> errors)
{
    /// <summary>The value of <paramref name="key"/>; null when absent (reported when required).</summary>
    /// <remarks>
    /// Keys are matched exactly (camelCase, as the file shape prescribes). A key that differs only in
    /// case is reported rather than ignored, because "Code" silently ignored would surface as a
    /// baffling "code is required".
    /// </remarks>
    public JsonElement? Get(JsonElement obj, string key, bool required, DefinitionLocation at, string owner)
    {
        if (obj.TryGetProperty(key, out var value))
        {
            return value;
        }

        foreach (var property in obj.EnumerateObject())
        {
            if (string.Equals(property.Name, key, StringComparison.OrdinalIgnoreCase))
            {
                errors.Add(at.Error($"{owner}: key '{property.Name}' must be written '{key}' (keys are camelCase and case-sensitive)"));
                return null;
            }
        }

        if (required)
        {
            errors.Add(at.Error($"{owner}: '{key}' is required"));
        }

        return null;
    }

    /// <summary>A non-blank string, trimmed.</summary>
    public string? String(JsonElement obj, string key, bool required, DefinitionLocation at, string owner)
    {
        if (Get(obj, key, required, at, owner) is not { } value)
        {
            return null;
        }

        if (value.ValueKind != JsonValueKind.String)
        {
            errors.Add(at.Error($"{owner}: '{key}' must be a string, found {Describe(value)}"));
            return null;
        }

        var text = value.GetString()!.Trim();
        if (text.Length == 0)
        {
            errors.Add(at.Error($"{owner}: '{key}' must not be empty"));
            return null;
        }

        return text;
    }

    public double? Number(JsonElement obj, string key, bool required, DefinitionLocation at, string owner)
    {
        if (Get(obj, key, required, at, owner) is not { } value)
        {
            return null;
        }

        return Number(value, at, $"{owner}: '{key}'");
    }

    public double? Number(JsonElement value, DefinitionLocation at, string what)
    {
        // JSON numbers only: "2.5" in quotes is refused rather than parsed, so no locale ever enters.
        if (value.ValueKind != JsonValueKind.Number || !value.TryGetDouble(out var number) || !double.IsFinite(number))
        {
            errors.Add(at.Error($"{what} must be a number, found {Describe(value)}"));
            return null;
        }

        return number;
    }

    public int? Integer(JsonElement obj, string key, bool required, DefinitionLocation at, string owner)
    {
        if (Get(obj, key, required, at, owner) is not { } value)
        {
            return null;
        }

        if (value.ValueKind != JsonValueKind.Number || !value.TryGetInt32(out var number))
        {
            errors.Add(at.Error($"{owner}: '{key}' must be a whole number, found {Describe(value)}"));
            return null;
        }

        return number;
    }

    public bool? Boolean(JsonElement obj, string key, DefinitionLocation at, string owner)
    {
        if (Get(obj, key, required: false, at, owner) is not { } value)
        {
            return null;
        }

        if (value.ValueKind is not (JsonValueKind.True or JsonValueKind.False))
        {
            errors.Add(at.Error($"{owner}: '{key}' must be true or false, found {Describe(value)}"));
            return null;
        }

        return value.GetBoolean();
    }

    public bool IsKind(JsonElement value, JsonValueKind kind, DefinitionLocation at, string what)
    {
        if (value.ValueKind == kind)
        {
            return true;
        }

        var expected = kind switch
        {
            JsonValueKind.Object => "an object { ... }",
            JsonValueKind.Array => "an array [ ... ]",
            _ => kind.ToString().ToLowerInvariant(),
        };
        errors.Add(at.Error($"{what} must be {expected}, found {Describe(value)}"));
        return false;
    }

    /// <summary>A short rendering of a JSON value for messages.</summary>
    public static string Describe(JsonElement value) => value.ValueKind switch
    {
        JsonValueKind.Object => "an object",
        JsonValueKind.Array => "an array",
        JsonValueKind.String => $"the string \"{Shorten(value.GetString()!)}\"",
        JsonValueKind.Number => $"the number {value.GetRawText()}",
        JsonValueKind.True => "true",
        JsonValueKind.False => "false",
        JsonValueKind.Null => "null",
        _ => value.ValueKind.ToString().ToLower(CultureInfo.InvariantCulture),
    };

    private static string Shorten(string text) => text.Length <= 40 ? text : text[..40] + "...";
}
