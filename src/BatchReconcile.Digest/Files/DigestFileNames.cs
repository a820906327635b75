using System.Globalization;
using System.Text;

namespace BatchReconcile.Digest.Files;

/// <summary>The names of one day's digest files, e.g. digest-2026-11-25-north-plant.html / .md / .csv.</summary>
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
}
