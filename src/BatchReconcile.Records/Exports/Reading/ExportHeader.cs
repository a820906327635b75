using static System.FormattableString;

namespace BatchReconcile.Records.Exports.Reading;

/// <summary>The header row of an export: where each contract column is, and what else is there.</summary>
internal sealed class ExportHeader
{
    private readonly Dictionary<string, int> _indexOf;

    private ExportHeader(string[] names, Dictionary<string, int> indexOf, IReadOnlyList<string> warnings)
    {
        Names = names;
        _indexOf = indexOf;
        Warnings = warnings;
    }

    /// <summary>The header names, trimmed, in file order (the keys of <see cref="RecordRow.Raw"/>).</summary>
    public string[] Names { get; }

    public int FieldCount => Names.Length;

    /// <summary>One per unknown column, to be carried by every batch of the file.</summary>
    public IReadOnlyList<string> Warnings { get; }

    /// <summary>Index of a contract column, or -1 when the file does not have it.</summary>
    public int IndexOf(string column) => _indexOf.GetValueOrDefault(column, -1);

    /// <summary>Checks the header; null when it is unusable (the errors say why).</summary>
    /// <param name="semicolon">Whether the verdict is "semicolon-delimited file" (then the only error).</param>
    public static ExportHeader? Analyze(IReadOnlyList<string> headers, ExportErrorList errors, out bool semicolon)
    {
        semicolon = false;
        if (headers.Count == 0 || (headers.Count == 1 && string.IsNullOrWhiteSpace(headers[0])))
        {
            errors.Add(1, "", "", "the file is empty: no header and no data rows");
            return null;
        }

        var names = headers.Select(h => h.Trim()).ToArray();
        var known = new Dictionary<string, int>(StringComparer.Ordinal);
        var firstSeen = new Dictionary<string, int>(StringComparer.OrdinalIgnoreCase);
        var warnings = new List<string>();
        var duplicates = new List<(string Column, string Value, string Reason)>();
        var refused = new List<(string Value, string Reason)>();

        for (var i = 0; i < names.Length; i++)
        {
            var name = names[i];
            if (name.Length == 0)
            {
                // Spreadsheets often leave a trailing separator on the header; an unnamed column holds nothing we read.
                warnings.Add(Invariant($"unnamed column {i + 1} ignored"));
                continue;
            }

            if (name.Length > ExportLimits.MaxFieldChars || SafeText.IndexOfRefused(name) >= 0)
            {
                // Never carried into warnings (which every batch of the file stores).
                refused.Add((headers[i], name.Length > ExportLimits.MaxFieldChars
                    ? Invariant($"header name {i + 1} is {name.Length:N0} characters long; a field may have at most {ExportLimits.MaxFieldChars:N0}")
                    : Invariant($"header name {i + 1} contains the control character {SafeText.Name(name[SafeText.IndexOfRefused(name)])}; column names must not contain control or bidirectional-control characters")));
                continue;
            }

            if (firstSeen.TryGetValue(name, out var first))
            {
                duplicates.Add((ContractName(name), headers[i],
                    Invariant($"column '{name}' appears twice (columns {first + 1} and {i + 1}); each column may appear once")));
                continue;
            }

            firstSeen[name] = i;
            var contractName = ExportColumns.All.FirstOrDefault(c => string.Equals(c, name, StringComparison.OrdinalIgnoreCase));
            if (contractName is null)
            {
                warnings.Add($"unknown column '{name}' ignored");
            }
            else
            {
                known[contractName] = i;
            }
        }

        var missing = ExportColumns.Required.Where(c => !known.ContainsKey(c)).ToList();
        if (missing.Count > 0 && headers.Any(h => h.Contains(';', StringComparison.Ordinal)))
        {
            // Replaces every other header finding: with the wrong delimiter they would only be noise.
            errors.Add(1, "", Shorten(string.Join(",", headers)),
                "the delimiter is a semicolon (;), but the export format uses commas: re-export the file with ',' as the delimiter (and '.' as the decimal separator)");
            semicolon = true;
            return null;
        }

        foreach (var (column, value, reason) in duplicates)
        {
            errors.Add(1, column, value, reason);
        }

        foreach (var (value, reason) in refused)
        {
            errors.Add(1, "", value, reason);
        }

        foreach (var column in missing)
        {
            errors.Add(1, column, "", $"required column '{column}' is missing from the header (required: {string.Join(", ", ExportColumns.Required)})");
        }

        return duplicates.Count == 0 && missing.Count == 0 && refused.Count == 0 ? new ExportHeader(names, known, warnings) : null;
    }

    /// <summary>The contract's spelling of a column name, or the name as given when it is not a contract column.</summary>
    internal static string ContractName(string name) =>
        ExportColumns.All.FirstOrDefault(c => string.Equals(c, name, StringComparison.OrdinalIgnoreCase)) ?? name;

    /// <summary>A value cut to 200 characters for an error message.</summary>
    internal static string Shorten(string text) => text.Length <= 200 ? text : string.Concat(text.AsSpan(0, 200), "...");
}
