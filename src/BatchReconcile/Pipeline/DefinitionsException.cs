using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Pipeline;

/// <summary>The process definitions cannot be used: start-up stops with every problem named, one per line.</summary>
public sealed class DefinitionsException(string folder, IReadOnlyList<DefinitionError> errors)
    : Exception($"process definitions in {folder} refused ({errors.Count} problem{(errors.Count == 1 ? "" : "s")}):{string.Concat(errors.Select(e => Environment.NewLine + "  " + e))}")
{
    public IReadOnlyList<DefinitionError> Errors { get; } = errors;
}
