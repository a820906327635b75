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
        output.WriteLine(JsonSerializer.Serialize(value, Options));
    }
}
