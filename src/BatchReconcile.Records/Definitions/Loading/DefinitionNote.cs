namespace BatchReconcile.Records.Definitions.Loading;

/// <summary>
/// Something the loader did on the user's behalf that is worth a log line, such as balancing a
/// reaction written without coefficients. Not a problem: the definitions were accepted.
/// </summary>
public sealed record DefinitionNote(string File, string? Recipe, string? Step, string Message, int? Version = null)
{
    /// <summary>"file, recipe R version V, step S".</summary>
    public string Where => DefinitionError.Place(File, Recipe, Version, Step);

    public override string ToString() => $"{Where}: {Message}";
}
