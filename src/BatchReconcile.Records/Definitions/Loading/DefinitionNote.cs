namespace BatchReconcile.Records.Definitions.Loading;

/// <summary>
/// Something the loader did on the user's behalf that is worth a log line, such as balancing a
/// reaction written without coefficients. Not a problem: the definitions were accepted.
/// </summary>
public sealed record DefinitionNote(string File, string? Recipe, string? Step, string Message)
{
    public override string ToString() => DefinitionError.Describe(File, Recipe, Step, Message);
}
