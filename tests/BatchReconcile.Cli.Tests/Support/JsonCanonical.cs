using System.Text.Json;
using System.Text.Json.Nodes;

namespace BatchReconcile.Cli.Tests.Support;

/// <summary>
/// JSON in a canonical text form (object keys sorted, no indentation), so that two documents can be
/// compared for meaning: the order of an object's keys carries none.
/// </summary>
public static class JsonCanonical
{
    public static string Text(JsonElement element) => Sorted(JsonNode.Parse(element.GetRawText()))?.ToJsonString() ?? "null";

    private static JsonNode? Sorted(JsonNode? node) => node switch
    {
        JsonObject o => new JsonObject(o.OrderBy(p => p.Key, StringComparer.Ordinal).Select(p => KeyValuePair.Create(p.Key, Sorted(p.Value)))),
        JsonArray a => new JsonArray(a.Select(Sorted).ToArray()),
        _ => node?.DeepClone(),
    };
}
