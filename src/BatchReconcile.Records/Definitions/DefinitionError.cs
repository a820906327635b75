namespace BatchReconcile.Records.Definitions;

/// <summary>A problem in a process-definition file, located as precisely as it can be.</summary>
public sealed record DefinitionError(string File, string? Recipe, string? Step, string Message)
{
    public override string ToString()
    {
        var where = File;
        if (Recipe is not null)
        {
            where += $", recipe {Recipe}";
        }

        if (Step is not null)
        {
            where += $", step {Step}";
        }

        return $"{where}: {Message}";
    }
}
