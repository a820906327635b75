namespace BatchReconcile.Records.Definitions;

/// <summary>A problem in a process-definition file, located as precisely as it can be.</summary>
public sealed record DefinitionError(string File, string? Recipe, string? Step, string Message)
{
    public override string ToString() => Describe(File, Recipe, Step, Message);

    /// <summary>"file, recipe R, step S: message": how definition problems and notes name their place.</summary>
    public static string Describe(string file, string? recipe, string? step, string message)
    {
        var where = file;
        if (recipe is not null)
        {
            where += $", recipe {recipe}";
        }

        if (step is not null)
        {
            where += $", step {step}";
        }

        return $"{where}: {message}";
    }
}
