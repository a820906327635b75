using System.Globalization;
using System.Text;

namespace BatchReconcile.Records;

/// <summary>
/// Characters that must not reach a terminal or a log line raw: the C0 controls (U+0000 to U+001F,
/// tab, CR and LF included), DEL (U+007F), the C1 controls (U+0080 to U+009F), and the bidirectional
/// controls U+200E, U+200F, U+202A to U+202E and U+2066 to U+2069 (Unicode UAX #9, "Explicit
/// Directional Formatting Characters"). Identifiers in an export are refused when they contain one
/// (<see cref="IndexOfRefused"/>); free text that is printed or logged is passed through
/// <see cref="Escape"/>, which writes each of them as a visible escape.
/// </summary>
public static class SafeText
{
    /// <summary>Whether <paramref name="c"/> is a control or bidirectional-control character (see the class).</summary>
    public static bool IsRefused(char c) =>
        c < '\u0020'
        || (c >= '\u007F' && c <= '\u009F')
        || c is '\u200E' or '\u200F'
        || (c >= '\u202A' && c <= '\u202E')
        || (c >= '\u2066' && c <= '\u2069');

    /// <summary>The index of the first refused character, or -1.</summary>
    public static int IndexOfRefused(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        for (var i = 0; i < text.Length; i++)
        {
            if (IsRefused(text[i]))
            {
                return i;
            }
        }

        return -1;
    }

    /// <summary>The character as it is named in messages: <c>U+001B</c>.</summary>
    public static string Name(char c) => "U+" + ((int)c).ToString("X4", CultureInfo.InvariantCulture);

    /// <summary>
    /// The text with every refused character written as <c>\x1B</c> (controls) or <c>\u202E</c>
    /// (bidirectional controls), so that printing it cannot move the cursor, end a log line, ring the
    /// bell or reverse what follows. Text without such characters comes back as it is (same instance).
    /// The escape is for display only: a backslash in the text is not escaped, so it is not reversible.
    /// </summary>
    public static string Escape(string? text)
    {
        if (string.IsNullOrEmpty(text) || IndexOfRefused(text) < 0)
        {
            return text ?? "";
        }

        var escaped = new StringBuilder(text.Length + 8);
        foreach (var c in text)
        {
            if (!IsRefused(c))
            {
                escaped.Append(c);
            }
            else if (c <= '\u00FF')
            {
                escaped.Append("\\x").Append(((int)c).ToString("X2", CultureInfo.InvariantCulture));
            }
            else
            {
                escaped.Append("\\u").Append(((int)c).ToString("X4", CultureInfo.InvariantCulture));
            }
        }

        return escaped.ToString();
    }

    /// <summary>At most <paramref name="max"/> characters of the text, then "..." when cut.</summary>
    public static string Prefix(string text, int max)
    {
        ArgumentNullException.ThrowIfNull(text);
        if (text.Length <= max)
        {
            return text;
        }

        // Do not cut a surrogate pair in two.
        var cut = char.IsHighSurrogate(text[max - 1]) ? max - 1 : max;
        return string.Concat(text.AsSpan(0, cut), "...");
    }
}
