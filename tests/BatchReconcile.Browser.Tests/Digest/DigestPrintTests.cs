using System.Globalization;
using System.Text;
using System.Text.Json;
using System.Text.RegularExpressions;
using BatchReconcile.Browser.Tests.Support;
using Microsoft.Playwright;
using Xunit.Abstractions;

namespace BatchReconcile.Browser.Tests.Digest;

/// <summary>
/// The demo's digest as a screenshot and as a print on A4 and US Letter (kept as test artifacts), and the
/// exception table laid out at screen widths and at the printable width of each paper.
/// </summary>
[Collection(ChromiumCollection.Name)]
public sealed partial class DigestPrintTests(ChromiumFixture chromium, DemoDigest digest, ITestOutputHelper output)
{
    private static readonly JsonSerializerOptions Json = new(JsonSerializerDefaults.Web);

    [Fact]
    public async Task A_full_page_screenshot_is_saved()
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, digest.HtmlPath);
        var path = Artifacts.PathFor($"digest-{digest.Day}.png");

        await page.Page.ScreenshotAsync(new PageScreenshotOptions { Path = path, FullPage = true });

        output.WriteLine($"screenshot: {path}");
        var bytes = await File.ReadAllBytesAsync(path);
        Assert.True(bytes.Length > 1024, $"{path} has {bytes.Length} bytes");
        Assert.Equal([0x89, (byte)'P', (byte)'N', (byte)'G'], bytes[..4]);
    }

    // Paper sizes in PostScript points: A4 is 210 x 297 mm (ISO 216), US Letter 8.5 x 11 in (ANSI/ASME Y14.1);
    // 1 pt = 1/72 in = 25.4/72 mm.
    [Theory]
    [InlineData("A4", 595.28, 841.89)]
    [InlineData("Letter", 612.0, 792.0)]
    public async Task A_pdf_print_is_saved_on_the_paper_asked_for(string paper, double widthPt, double heightPt)
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, digest.HtmlPath);
        var path = Artifacts.PathFor($"digest-{digest.Day}-{paper}.pdf");

        await page.Page.PdfAsync(new PagePdfOptions { Path = path, Format = paper, PrintBackground = true });

        output.WriteLine($"PDF ({paper}): {path}");
        var bytes = await File.ReadAllBytesAsync(path);
        Assert.True(bytes.Length > 1024, $"{path} has {bytes.Length} bytes");
        Assert.Equal("%PDF", Encoding.ASCII.GetString(bytes, 0, 4));
        var boxes = MediaBox().Matches(Encoding.Latin1.GetString(bytes));
        Assert.NotEmpty(boxes);
        foreach (Match box in boxes)
        {
            var w = double.Parse(box.Groups["w"].Value, CultureInfo.InvariantCulture);
            var h = double.Parse(box.Groups["h"].Value, CultureInfo.InvariantCulture);
            // Chromium rounds the page to whole CSS pixels (0.75 pt each): within 2 pt.
            Assert.InRange(w, widthPt - 2, widthPt + 2);
            Assert.InRange(h, heightPt - 2, heightPt + 2);
        }
    }

    // Printable width in CSS pixels (1in = 96px, CSS Values and Units Level 3) inside the digest's 12 mm side
    // margins (its @page rule): A4 (210 - 24) mm = 703 px, Letter (215.9 - 24) mm = 725 px.
    [Theory]
    [InlineData("screen", 1280)]
    [InlineData("screen", 1024)]
    [InlineData("print", 703)]
    [InlineData("print", 725)]
    public async Task The_exception_table_fits_and_batch_ids_and_flag_codes_stay_on_one_line(string media, int width)
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, digest.HtmlPath, width);
        await page.Page.EmulateMediaAsync(new PageEmulateMediaOptions { Media = media == "print" ? Media.Print : Media.Screen });

        var measured = await page.Page.EvaluateAsync<JsonElement>(
            """
            () => {
              const table = document.querySelector('#exceptions table');
              const heads = [...table.tHead.rows[0].cells].map(c => c.textContent.trim());
              const columns = [heads.indexOf('Batch'), heads.indexOf('Flag')];
              const lines = node => {
                const range = document.createRange();
                range.selectNodeContents(node);
                return new Set([...range.getClientRects()].map(r => Math.round(r.top))).size;
              };
              const cells = [...table.tBodies[0].rows].flatMap(row => columns.map(i => {
                const text = row.cells[i].firstChild;
                return { text: text.textContent.trim(), lines: lines(text) };
              }));
              return {
                tableRight: table.getBoundingClientRect().right,
                pageWidth: document.documentElement.clientWidth,
                scrollWidth: document.documentElement.scrollWidth,
                columnsFound: columns.every(i => i >= 0),
                cells,
              };
            }
            """);
        var layout = measured.Deserialize<TableLayout>(Json) ?? throw new InvalidOperationException("no layout measured");

        Assert.True(layout.ColumnsFound, "the exception table has no Batch or Flag column");
        Assert.NotEmpty(layout.Cells);
        Assert.True(layout.TableRight <= layout.PageWidth + 0.5, $"the table ends at {layout.TableRight}px on a {layout.PageWidth}px {media} page");
        Assert.True(layout.ScrollWidth <= layout.PageWidth, $"the {media} page scrolls sideways: {layout.ScrollWidth}px content in {layout.PageWidth}px");
        Assert.All(layout.Cells, cell => Assert.True(cell.Lines == 1, $"'{cell.Text}' breaks over {cell.Lines} lines at {width}px ({media})"));
    }

    [GeneratedRegex(@"/MediaBox\s*\[\s*0\s+0\s+(?<w>[0-9.]+)\s+(?<h>[0-9.]+)\s*\]")]
    private static partial Regex MediaBox();

    private sealed record TableLayout(double TableRight, double PageWidth, double ScrollWidth, bool ColumnsFound, IReadOnlyList<CellLines> Cells);

    private sealed record CellLines(string Text, int Lines);
}
