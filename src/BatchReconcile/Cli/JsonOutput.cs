using System.Text.Encodings.Web;
using System.Text.Json;
using System.Text.Json.Serialization;

namespace BatchReconcile.Cli;

/// <summary>Writes the one JSON document a <c>--json</c> command prints on stdout.</summary>
public static class JsonOutput
{
    public static readonly JsonSerializerOptions Options = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
        WriteIndented = true,
        // Formulas carry '·', '^' and '+'; keep them readable rather than \u-escaped.
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
        DefaultIgnoreCondition = JsonIgnoreCondition.Never,
    };

    public static void Write<T>(TextWriter output, T value)
    {
        output.WriteLine(EscapeBidi(JsonSerializer.Serialize(value, Options)));
    }

    /// <summary>The same document from source-generated metadata (whose options are a copy of <see cref="Options"/>).</summary>
    public static void Write<T>(TextWriter output, T value, System.Text.Json.Serialization.Metadata.JsonTypeInfo<T> info)
    {
        output.WriteLine(EscapeBidi(JsonSerializer.Serialize(value, info)));
    }

    /// <summary>
    /// The relaxed encoder escapes control characters but writes bidirectional controls (U+202E ...) raw,
    /// which a terminal shows as reversed text. Outside strings JSON is ASCII, so writing each of them as
    /// a \u escape wherever it occurs gives the same document.
    /// </summary>
    private static string EscapeBidi(string json)
    {
        if (!json.Any(c => c > '\u00FF' && BatchReconcile.Records.SafeText.IsRefused(c)))
        {
            return json;
        }

        var escaped = new System.Text.StringBuilder(json.Length + 16);
        foreach (var c in json)
        {
            if (c > '\u00FF' && BatchReconcile.Records.SafeText.IsRefused(c))
            {
                escaped.Append("\\u").Append(((int)c).ToString("X4", System.Globalization.CultureInfo.InvariantCulture));
            }
            else
            {
                escaped.Append(c);
            }
        }

        return escaped.ToString();
    }
}
