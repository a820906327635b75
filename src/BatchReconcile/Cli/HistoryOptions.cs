using System.CommandLine;
using System.Globalization;
using BatchReconcile.Storage;

namespace BatchReconcile.Cli;

/// <summary>
/// The options the commands across batches share: <c>--from D</c> and <c>--to D</c> (production days, inclusive) and
/// <c>--recipe CODE</c> (a recipe with stored batches). Bad values are usage errors naming the option and the value.
/// </summary>
public sealed class HistoryOptions
{
    public Option<string?> From { get; } = new("--from") { Description = "First production day, YYYY-MM-DD (inclusive)" };

    public Option<string?> To { get; } = new("--to") { Description = "Last production day, YYYY-MM-DD (inclusive)" };

    public Option<string?> Recipe { get; } = new("--recipe") { Description = "Only this recipe (its code, e.g. BZC-410)" };

    /// <summary>The days as given; --from after --to is refused.</summary>
    public (DateOnly? From, DateOnly? To) Days(ParseResult parse)
    {
        var from = Day(From.Name, parse.GetValue(From));
        var to = Day(To.Name, parse.GetValue(To));
        if (from is { } f && to is { } t && f > t)
        {
            throw new UsageException(string.Create(CultureInfo.InvariantCulture, $"--from {f:yyyy-MM-dd} is after --to {t:yyyy-MM-dd}"));
        }

        return (from, to);
    }

    /// <summary>The recipe as given (trimmed), refused when no stored batch has it; null when not given.</summary>
    public string? KnownRecipe(ParseResult parse, BatchStore store)
    {
        var recipe = parse.GetValue(Recipe)?.Trim();
        if (recipe is null)
        {
            return null;
        }

        return store.RecipeSteps(recipe).Count > 0
            ? recipe
            : throw new UsageException($"--recipe '{Records.SafeText.Escape(Records.SafeText.Prefix(recipe, 80))}' is not the recipe of any stored batch");
    }

    /// <summary>What the filters were, for a "no batches ..." line: e.g. " of BZC-410 from 2026-11-01 to 2026-11-30".</summary>
    public static string Describe(string? recipe, DateOnly? from, DateOnly? to) =>
        (recipe is null ? string.Empty : $" of {Records.SafeText.Escape(recipe)}")
        + (from is { } f ? string.Create(CultureInfo.InvariantCulture, $" from {f:yyyy-MM-dd}") : string.Empty)
        + (to is { } t ? string.Create(CultureInfo.InvariantCulture, $" to {t:yyyy-MM-dd}") : string.Empty);

    private static DateOnly? Day(string option, string? text) =>
        text is null ? null
        : DateOnly.TryParseExact(text, "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out var day) ? day
        : throw new UsageException($"{option} '{Records.SafeText.Escape(Records.SafeText.Prefix(text, 80))}' is not a date as YYYY-MM-DD");

    public void AddTo(Command command, bool recipe = true)
    {
        command.Options.Add(From);
        command.Options.Add(To);
        if (recipe)
        {
            command.Options.Add(Recipe);
        }
    }
}
