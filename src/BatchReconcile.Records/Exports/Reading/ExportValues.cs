using System.Globalization;
using System.Text.RegularExpressions;

namespace BatchReconcile.Records.Exports.Reading;

/// <summary>Parsing of the contract's numbers and times: one fixed notation, never the culture's, never guessed.</summary>
internal static partial class ExportValues
{
    private const string NumberHint = "use '.' as the decimal separator and no thousands separator";

    private static readonly string[] TimeFormats =
    [
        "yyyy-MM-dd'T'HH:mmzzz",
        "yyyy-MM-dd'T'HH:mm:sszzz",
        "yyyy-MM-dd'T'HH:mm:ss.FFFFFFFzzz",
    ];

    /// <summary>A finite decimal number in plain notation (sign allowed, so negatives are seen and named).</summary>
    /// <returns>Null when the text is a number; otherwise why it is not.</returns>
    public static string? TryParseNumber(string text, out double value)
    {
        value = 0;
        if (text.Contains(',', StringComparison.Ordinal))
        {
            // 1,234.5 and 1234,5 cannot be told apart in general (1,234 is both), so neither is guessed.
            return $"a comma is not allowed in a number (decimal comma or thousands separator); {NumberHint}";
        }

        if (double.TryParse(text, NumberStyles.AllowDecimalPoint | NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out var parsed))
        {
            if (!double.IsFinite(parsed))
            {
                // NaN and Infinity parse with any style; a very long digit string overflows to infinity.
                return "not a finite number";
            }

            value = parsed + 0.0; // -0 reads as 0
            return null;
        }

        if (ExponentNotation().IsMatch(text))
        {
            var huge = double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out var e) && !double.IsFinite(e);
            return huge
                ? "not a finite number (and exponent notation is not allowed: write the number out in full)"
                : "exponent notation is not allowed: write the number out in full, e.g. 0.0015";
        }

        return $"not a number; write digits only, e.g. 1234.5 ({NumberHint})";
    }

    /// <summary>An ISO 8601 date and time that carries its UTC offset (Z or ±hh:mm).</summary>
    /// <returns>Null when the text is such a time; otherwise why it is not.</returns>
    public static string? TryParseTime(string text, out DateTimeOffset value)
    {
        value = default;
        var offset = TimeOffset().Match(text);
        if (!offset.Success)
        {
            // A local time without its offset is ambiguous across daylight-saving changes and plant sites.
            return DateTimeOffset.TryParseExact(text + "+00:00", TimeFormats, CultureInfo.InvariantCulture, DateTimeStyles.None, out _)
                ? "needs a UTC offset, e.g. +01:00 (2026-11-24T14:05:00+01:00)"
                : "not an ISO 8601 date and time with a UTC offset, e.g. 2026-11-24T14:05:00+01:00";
        }

        var normalized = offset.Groups["z"].Success ? string.Concat(text.AsSpan(0, offset.Index), "+00:00") : text;
        return DateTimeOffset.TryParseExact(normalized, TimeFormats, CultureInfo.InvariantCulture, DateTimeStyles.None, out value)
            ? null
            : "not an ISO 8601 date and time with a UTC offset, e.g. 2026-11-24T14:05:00+01:00";
    }

    /// <summary>A recipe version: a positive whole number in plain digits.</summary>
    public static bool TryParseVersion(string text, out int version) =>
        int.TryParse(text, NumberStyles.None, CultureInfo.InvariantCulture, out version) && version > 0;

    [GeneratedRegex(@"^[+-]?(\d+\.?\d*|\.\d+)[eE][+-]?\d+$", RegexOptions.CultureInvariant)]
    private static partial Regex ExponentNotation();

    [GeneratedRegex(@"((?<z>[Zz])|[+-]\d{2}:\d{2})$", RegexOptions.CultureInvariant)]
    private static partial Regex TimeOffset();
}
