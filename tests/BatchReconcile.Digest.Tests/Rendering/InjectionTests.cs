using System.Globalization;
using BatchReconcile.Digest.Files;
using BatchReconcile.Digest.Model;
using BatchReconcile.Digest.Rendering;
using BatchReconcile.Digest.Tests.Support;
using CsvHelper;

namespace BatchReconcile.Digest.Tests.Rendering;

/// <summary>Text from batch data must come out inert: as text in HTML and Markdown, as text in a spreadsheet, safe in file names.</summary>
public class InjectionTests
{
    // Common practice (OWASP "CSV Injection" and "XSS Prevention" cheat sheets): script tags, quotes breaking out of
    // attributes, spreadsheet formulas and DDE calls, path traversal.
    public static TheoryData<string> Nasty => new()
    {
        "<script>alert(1)</script>",
        "\"><img src=x onerror=alert(1)>",
        "' onmouseover='alert(1)",
        "=cmd|' /C calc'!A0",
        "+1",
        "-2+3",
        "@SUM(1)",
        "\t=1+1",
        "\r=1+1",
        "../../etc/passwd",
        "..\\..\\windows\\win.ini",
        "</svg><script>alert(1)</script>",
        "| col | `code` <b>bold</b>",
    };

    private static DigestData WithNasty(string nasty) => SeededDigest.Create(batchPrefix: nasty, siteName: nasty, nastyText: nasty);

    [Theory]
    [MemberData(nameof(Nasty))]
    public void Html_shows_batch_data_as_text_only(string nasty)
    {
        var html = HtmlDigestRenderer.Render(WithNasty(nasty));

        Assert.DoesNotContain("<script", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("<img", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("<b>", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("' onmouseover='", html, StringComparison.Ordinal);
        Assert.Contains(System.Net.WebUtility.HtmlEncode(nasty), html, StringComparison.Ordinal);
    }

    [Theory]
    [MemberData(nameof(Nasty))]
    public void Every_chart_stays_well_formed_with_a_size_a_title_and_axis_labels(string nasty)
    {
        var html = HtmlDigestRenderer.Render(WithNasty(nasty));
        var charts = Html.SvgFragments(html);

        // 3 flagged steps with a ladder and a closure each, 2 yield charts, and for each of the 3 steps (solvent and
        // recovered streams above half the charge) the ladder without them.
        Assert.Equal(11, charts.Count);
        Assert.Equal(Html.Count(html, "<svg"), Html.Count(html, "</svg>"));
        foreach (var fragment in charts)
        {
            var svg = Html.ParseSvg(fragment);
            XNamespaceCheck(svg);
            Assert.Equal("chart", (string?)svg.Attribute("class"));
            Assert.True(double.Parse((string)svg.Attribute("width")!, CultureInfo.InvariantCulture) > 0);
            Assert.True(double.Parse((string)svg.Attribute("height")!, CultureInfo.InvariantCulture) > 0);
            var title = svg.Elements().First();
            Assert.Equal("title", title.Name.LocalName);
            Assert.False(string.IsNullOrWhiteSpace(title.Value));
            var texts = svg.Descendants().Where(e => e.Name.LocalName == "text").Select(e => e.Value).ToList();
            Assert.Contains(texts, t => t is "mass (kg)" or "closure, % of charged mass" or "yield %");
        }
    }

    [Theory]
    [MemberData(nameof(Nasty))]
    public void Markdown_escapes_table_breaking_and_markup_characters(string nasty)
    {
        var md = MarkdownDigestRenderer.Render(WithNasty(nasty));

        Assert.DoesNotContain("<script", md, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("<b>", md, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("<img", md, StringComparison.OrdinalIgnoreCase);
        Assert.Contains(MarkdownDigestRenderer.E(nasty), md, StringComparison.Ordinal);

        // Every row of the exception table still has its 8 cells: no unescaped | got in.
        var rows = md.Split('\n').SkipWhile(l => !l.StartsWith("## Exceptions", StringComparison.Ordinal)).Skip(2)
            .TakeWhile(l => l.StartsWith('|')).ToList();
        Assert.Equal(9, rows.Count);
        Assert.All(rows, row => Assert.Equal(9, UnescapedPipes(row)));
    }

    [Theory]
    [MemberData(nameof(Nasty))]
    public void Csv_text_cells_that_a_spreadsheet_would_run_start_with_an_apostrophe(string nasty)
    {
        var csv = CsvExceptionList.Render(WithNasty(nasty));
        using var reader = CsvReader.Create(new StringReader(csv), CsvReaderOptions.Default with { Separator = ',' });
        var expected = "=+-@\t\r".Contains(nasty[0], StringComparison.Ordinal) ? "'" + nasty : nasty;

        var rows = 0;
        while (reader.Read())
        {
            rows++;
            Assert.StartsWith(expected, reader.GetString("batch"), StringComparison.Ordinal);
            if (reader.GetString("flag_id") == "101")
            {
                Assert.Equal(expected, reader.GetString("message"));
            }
        }

        Assert.Equal(7, rows);
    }

    [Theory]
    [MemberData(nameof(Nasty))]
    public void File_names_keep_only_safe_characters(string nasty)
    {
        var names = DigestFileNames.For(SeededDigest.Day, nasty);

        foreach (var name in new[] { names.Html, names.Markdown, names.Csv })
        {
            Assert.StartsWith("digest-2026-11-25", name, StringComparison.Ordinal);
            Assert.DoesNotContain("..", name, StringComparison.Ordinal);
            Assert.DoesNotContain('/', name);
            Assert.DoesNotContain('\\', name);
            Assert.All(name, c => Assert.True(char.IsAsciiLetterOrDigit(c) || c is '-' or '.', $"'{c}' in {name}"));
            Assert.Equal(name, Path.GetFileName(name));
        }
    }

    private static void XNamespaceCheck(System.Xml.Linq.XElement svg) =>
        Assert.Equal("http://www.w3.org/2000/svg", svg.Name.NamespaceName);

    private static int UnescapedPipes(string row)
    {
        var count = 0;
        for (var i = 0; i < row.Length; i++)
        {
            if (row[i] == '\\')
            {
                i++;
            }
            else if (row[i] == '|')
            {
                count++;
            }
        }

        return count;
    }
}
