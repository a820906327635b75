using System.CommandLine;
using System.Globalization;
using BatchReconcile.Records;

namespace BatchReconcile.Cli;

/// <summary>The options the analysis commands share: <c>--recipe CODE [--from D] [--to D] [--json]</c>, and their checks.</summary>
public sealed class AnalysisOptions
{
    public Option<string> Recipe { get; } = new("--recipe") { Description = "Recipe code, e.g. BZC-410", Required = true };

    public Option<string?> From { get; } = new("--from") { Description = "First production day, YYYY-MM-DD (inclusive)" };

    public Option<string?> To { get; } = new("--to") { Description = "Last production day, YYYY-MM-DD (inclusive)" };

    public Option<bool> Json { get; } = new("--json") { Description = "Print one JSON document on stdout" };

    public void AddTo(Command command, bool json = true)
    {
        command.Options.Add(Recipe);
        command.Options.Add(From);
        command.Options.Add(To);
        if (json)
        {
            command.Options.Add(Json);
        }
    }

    /// <summary>The period asked for; a date that is not YYYY-MM-DD, or --from after --to, is bad input naming the option and value.</summary>
    public (DateOnly? From, DateOnly? To) Period(ParseResult parse)
    {
        var from = Day("--from", parse.GetValue(From));
        var to = Day("--to", parse.GetValue(To));
        if (from is { } f && to is { } t && f > t)
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--from {f:yyyy-MM-dd} is after --to {t:yyyy-MM-dd}"));
        }

        return (from, to);
    }

    /// <summary>The recipe code as given, trimmed; empty is bad input.</summary>
    public string RecipeCode(ParseResult parse)
    {
        var code = parse.GetRequiredValue(Recipe).Trim();
        return code.Length > 0 ? code : throw new UsageException("--recipe '' is empty: give a recipe code, e.g. --recipe BZC-410");
    }

    /// <summary>A production day as YYYY-MM-DD for the option named; anything else is bad input naming option and value.</summary>
    public static DateOnly? Day(string option, string? text)
    {
        if (text is null)
        {
            return null;
        }

        return DateOnly.TryParseExact(text.Trim(), "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out var day)
            ? day
            : throw new UsageException($"{option} '{SafeText.Escape(SafeText.Prefix(text, 40))}' is not a date as YYYY-MM-DD");
    }

    /// <summary>"2026-11-01" or null, for JSON.</summary>
    public static string? Text(DateOnly? day) => day?.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture);
}
