using System.Globalization;
using System.Text;

namespace BatchReconcile.Digest.Files;

/// <summary>The names of one day's digest files, e.g. digest-2026-11-25-north-plant.html / .md / .csv.</summary>
/// <remarks>
/// The plain names always hold the newest issue of the day. When a day's digest is written again, the issue it
/// replaces is kept under its number (<see cref="Numbered"/>: digest-2026-11-25-north-plant.1.html for the first
/// issue, .2. for the second, ...). A provisional digest (asked for before the day ended) has names of its own
/// (<see cref="ProvisionalFor"/>: digest-2026-11-25-north-plant.provisional.html), so it never stands in for the day's digest.
/// </remarks>
/// <remarks>
/// The site name comes from configuration and may hold anything, so only ASCII letters and digits of it
/// survive, lower-cased, joined by single hyphens: no path separators, no dots (so no ".."), no control or
/// shell characters, at most <see cref="MaxSiteLength"/> characters. A site name with nothing left adds nothing.
/// </remarks>
public sealed record DigestFileNames(string Html, string Markdown, string Csv)
{
    public const int MaxSiteLength = 40;

    public static DigestFileNames For(DateOnly day, string siteName)
    {
        ArgumentNullException.ThrowIfNull(siteName);
        var slug = SiteSlug(siteName);
        var stem = "digest-" + day.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture) + (slug.Length == 0 ? string.Empty : "-" + slug);
        return new DigestFileNames(stem + ".html", stem + ".md", stem + ".csv");
    }

    /// <summary>The names a day's digest is written under before the day has ended.</summary>
    public static DigestFileNames ProvisionalFor(DateOnly day, string siteName) => For(day, siteName).WithInfix("provisional");

    /// <summary>These names with the issue number before the extension: where an earlier issue of the day is kept.</summary>
    public DigestFileNames Numbered(int issue)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(issue, 1);
        return WithInfix(issue.ToString(CultureInfo.InvariantCulture));
    }

    /// <summary>The three names in the order HTML, Markdown, CSV.</summary>
    public IReadOnlyList<string> All => [Html, Markdown, Csv];

    /// <summary>The site name reduced to lower-case ASCII letters and digits separated by single hyphens.</summary>
    public static string SiteSlug(string siteName)
    {
        ArgumentNullException.ThrowIfNull(siteName);
        var builder = new StringBuilder(Math.Min(siteName.Length, MaxSiteLength));
        foreach (var c in siteName)
        {
            if (builder.Length >= MaxSiteLength)
            {
                break;
            }

            if (char.IsAsciiLetterOrDigit(c))
            {
                builder.Append(char.ToLowerInvariant(c));
            }
            else if (builder.Length > 0 && builder[^1] != '-')
            {
                builder.Append('-');
            }
        }

        return builder.ToString().TrimEnd('-');
    }

    private DigestFileNames WithInfix(string infix)
    {
        static string Insert(string name, string infix) =>
            Path.GetFileNameWithoutExtension(name) + "." + infix + Path.GetExtension(name);

        return new DigestFileNames(Insert(Html, infix), Insert(Markdown, infix), Insert(Csv, infix));
    }
}
