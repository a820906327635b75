using System.Globalization;

namespace BatchReconcile.Records.Definitions;

/// <summary>A problem in a process-definition file, located as precisely as it can be.</summary>
/// <param name="Version">The recipe version, when the problem is in a recipe whose version was read.</param>
public sealed record DefinitionError(string File, string? Recipe, string? Step, string Message, int? Version = null)
{
    /// <summary>"file, recipe R version V, step S".</summary>
    public string Where => Place(File, Recipe, Version, Step);

    public override string ToString() => $"{Where}: {Message}";

    /// <summary>"file, recipe R version V, step S": how definition problems and notes name their place.</summary>
    public static string Place(string file, string? recipe, int? version, string? step)
    {
        var where = file;
        if (recipe is not null)
        {
            where += $", recipe {recipe}";
            if (version is { } v)
            {
                where += " version " + v.ToString(CultureInfo.InvariantCulture);
            }
        }

        if (step is not null)
        {
            where += $", step {step}";
        }

        return where;
    }
}
