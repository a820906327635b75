using System.Text.Json;
using System.Text.Json.Serialization;

namespace BatchReconcile.Cli;

/// <summary>
/// Source-generated JSON metadata for the analysis commands' documents, with the options of <see cref="JsonOutput.Options"/>.
/// Building the metadata by reflection at run time cost a quarter of <c>compare --json</c>'s time on a year of batches.
/// </summary>
[JsonSerializable(typeof(TrendCommand.TrendJson))]
[JsonSerializable(typeof(LossesCommand.LossesJson))]
[JsonSerializable(typeof(CompareCommand.CompareJson))]
internal sealed partial class AnalysisJson : JsonSerializerContext
{
    /// <summary>The context with the same naming, indentation, encoder and null handling as every other --json document.</summary>
    public static AnalysisJson Shared { get; } = new(new JsonSerializerOptions(JsonOutput.Options));
}
