using System.Text.RegularExpressions;
using System.Xml.Linq;

namespace BatchReconcile.Digest.Tests.Support;

/// <summary>Small checks on rendered HTML without a browser.</summary>
internal static partial class Html
{
    public static IReadOnlyList<string> SvgFragments(string html) =>
        [.. SvgRegex().Matches(html).Select(m => m.Value)];

    /// <summary>Each chart is well-formed XML on its own (so every tag is closed and every text escaped).</summary>
    public static XElement ParseSvg(string fragment) => XElement.Parse(fragment);

    public static IReadOnlyList<long> FlagIdsInOrder(string html) =>
        [.. FlagIdRegex().Matches(html).Select(m => long.Parse(m.Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture))];

    public static int Count(string text, string part)
    {
        var n = 0;
        for (var i = text.IndexOf(part, StringComparison.Ordinal); i >= 0; i = text.IndexOf(part, i + part.Length, StringComparison.Ordinal))
        {
            n++;
        }

        return n;
    }

    [GeneratedRegex("<svg\\b.*?</svg>", RegexOptions.Singleline)]
    private static partial Regex SvgRegex();

    [GeneratedRegex("data-flag-id=\"(\\d+)\"")]
    private static partial Regex FlagIdRegex();
}
