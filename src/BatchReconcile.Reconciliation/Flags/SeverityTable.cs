using System.Diagnostics.CodeAnalysis;
using BatchReconcile.Reconciliation.Settings;
using BatchReconcile.Records.Definitions;

namespace BatchReconcile.Reconciliation.Flags;

/// <summary>Which severity a flag gets: the recipe step's override, else the site's setting, else the default.</summary>
public sealed class SeverityTable
{
    private readonly Dictionary<FlagCode, FlagSeverity> _site;

    private SeverityTable(Dictionary<FlagCode, FlagSeverity> site) => _site = site;

    /// <summary>
    /// Reads the site's text map (flag code text to severity text, e.g. "yield-low": "major"). Every unknown code
    /// and every unknown severity is reported, not only the first.
    /// </summary>
    public static bool TryCreate(
        IReadOnlyDictionary<string, string>? siteSeverities,
        [NotNullWhen(true)] out SeverityTable? table,
        out IReadOnlyList<string> errors)
    {
        var site = new Dictionary<FlagCode, FlagSeverity>();
        var problems = new List<string>();
        foreach (var (codeText, severityText) in siteSeverities ?? new Dictionary<string, string>())
        {
            if (!FlagCodes.TryParse(codeText, out var code))
            {
                problems.Add($"Reconciliation:Severities: '{codeText}' is not a flag code; expected one of {string.Join(", ", FlagCodes.All.Select(c => c.ToText()))}.");
                continue;
            }

            if (!FlagCodes.TryParseSeverity(severityText, out var severity))
            {
                problems.Add($"Reconciliation:Severities:{codeText}: '{severityText}' is not a severity; expected critical, major or minor.");
                continue;
            }

            site[code] = severity.Value;
        }

        errors = problems;
        table = problems.Count == 0 ? new SeverityTable(site) : null;
        return table is not null;
    }

    /// <summary>The table of validated site settings.</summary>
    /// <exception cref="ArgumentException">
    /// The settings name an unknown code or severity. Settings are validated at start-up with
    /// <see cref="TryCreate"/>; reaching here with bad text is a bug in the caller.
    /// </exception>
    public static SeverityTable FromSettings(ReconciliationSettings settings)
    {
        ArgumentNullException.ThrowIfNull(settings);
        if (!TryCreate(settings.Severities, out var table, out var errors))
        {
            throw new ArgumentException(string.Join(" ", errors), nameof(settings));
        }

        return table;
    }

    /// <summary>The site's severity of a code (its setting, else the default).</summary>
    public FlagSeverity SiteSeverity(FlagCode code) =>
        _site.TryGetValue(code, out var severity) ? severity : ReconciliationSettings.DefaultSeverity(code);

    /// <summary>The severity of a code on one recipe step: the step's override wins over the site.</summary>
    public FlagSeverity For(FlagCode code, RecipeStep step)
    {
        ArgumentNullException.ThrowIfNull(step);
        return step.Severities.TryGetValue(code, out var severity) ? severity : SiteSeverity(code);
    }
}
