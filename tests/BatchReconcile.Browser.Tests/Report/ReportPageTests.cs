using System.Text;
using System.Text.Json;
using BatchReconcile.Browser.Tests.Support;
using BatchReconcile.Cli.Tests.Support;
using BatchReconcile.Digest.Rendering.Report;
using BatchReconcile.Digest.Tests.Support;
using Microsoft.Playwright;
using Xunit.Abstractions;

namespace BatchReconcile.Browser.Tests.Report;

/// <summary>One Chromium for the report page tests, not run beside the digest's collection (two cores).</summary>
[CollectionDefinition(Name, DisableParallelization = true)]
public sealed class ReportCollection : ICollectionFixture<ChromiumFixture>
{
    public const string Name = "Chromium report";
}

/// <summary>
/// The analysis report as Chromium lays it out: charts drawn at a size, signals labelled, printable, and nothing fetched.
/// The page is the renderer's output for an invented recipe (ReportSample), written to a file and opened from it.
/// </summary>
[Collection(ReportCollection.Name)]
public sealed class ReportPageTests : IDisposable
{
    private static readonly JsonSerializerOptions Json = new(JsonSerializerDefaults.Web);
    private readonly ChromiumFixture chromium;
    private readonly ITestOutputHelper output;
    private readonly TempFolder scratch = new();
    private readonly string file;

    public ReportPageTests(ChromiumFixture chromium, ITestOutputHelper output)
    {
        this.chromium = chromium;
        this.output = output;
        file = scratch.Sub("report-TST-300.html");
        File.WriteAllText(file, HtmlReportRenderer.Render(ReportSample.Create()), new UTF8Encoding(false));
    }

    [Fact]
    public async Task The_page_makes_no_request_but_for_itself_and_opens_no_dialog()
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, file);
        await page.Page.EmulateMediaAsync(new PageEmulateMediaOptions { Media = Media.Print });
        await page.Page.PdfAsync(new PagePdfOptions { Format = "A4" });

        Assert.Empty(page.Refused);
        Assert.Equal([page.Url], page.Requests.Distinct());
        Assert.Empty(page.Dialogs);
    }

    [Theory]
    [InlineData("screen", 1280)]
    [InlineData("screen", 800)]
    // Printable width in CSS px inside the 12 mm side margins of the @page rule: A4 (210 - 24) mm = 703 px, Letter 725 px
    // (1in = 96px, CSS Values and Units Level 3).
    [InlineData("print", 703)]
    [InlineData("print", 725)]
    public async Task Every_chart_is_drawn_at_a_size_and_fits_the_page(string media, int width)
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, file, width);
        await page.Page.EmulateMediaAsync(new PageEmulateMediaOptions { Media = media == "print" ? Media.Print : Media.Screen });

        var measured = await page.Page.EvaluateAsync<JsonElement>(
            """
            () => ({
              pageWidth: document.documentElement.clientWidth,
              scrollWidth: document.documentElement.scrollWidth,
              charts: [...document.querySelectorAll('svg.chart')].map(s => {
                const r = s.getBoundingClientRect();
                return { kind: s.getAttribute('data-chart') ?? '', width: r.width, height: r.height, right: r.right };
              }),
            })
            """);
        var layout = measured.Deserialize<Layout>(Json) ?? throw new InvalidOperationException("nothing measured");

        Assert.Equal(["control", "control", "pareto"], layout.Charts.Select(c => c.Kind));
        Assert.All(layout.Charts, c =>
        {
            Assert.True(c.Width > 300 && c.Height > 100, $"{c.Kind} chart drawn {c.Width} x {c.Height} px at {width}px ({media})");
            Assert.True(c.Right <= layout.PageWidth + 0.5, $"{c.Kind} chart ends at {c.Right}px on a {layout.PageWidth}px page");
        });
        Assert.True(layout.ScrollWidth <= layout.PageWidth, $"the {media} page scrolls sideways: {layout.ScrollWidth}px in {layout.PageWidth}px");
    }

    [Fact]
    public async Task Every_point_that_breaks_a_rule_is_marked_and_its_label_is_visible()
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, file);
        var expected = ReportSample.Create().Trends.SelectMany(t => t.Points).Where(p => p.Signals.Count > 0).ToList();

        var marks = page.Page.Locator("svg.chart rect[data-signals]");
        var labels = page.Page.Locator("svg.chart text[data-signal-label]");
        Assert.Equal(expected.Count, await marks.CountAsync());
        Assert.Equal(expected.Count, await labels.CountAsync());
        for (var i = 0; i < expected.Count; i++)
        {
            Assert.True(await labels.Nth(i).IsVisibleAsync(), $"label {i} is not visible");
            var box = await labels.Nth(i).BoundingBoxAsync();
            Assert.True(box is { Width: > 0, Height: > 0 }, $"label {i} has no size");
        }

        Assert.Equal(["R1", "R2", "R2,5"], await labels.AllTextContentsAsync());
        var legend = await page.Page.Locator("#trend-S2 ul.rules").InnerTextAsync();
        Assert.Contains("rule-2", legend, StringComparison.Ordinal);
        Assert.Contains("nine points in a row", legend, StringComparison.Ordinal);
    }

    [Fact]
    public async Task The_sections_and_the_cautions_are_visible()
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, file);
        foreach (var id in new[] { "summary", "trends", "losses", "comparison", "cautions" })
        {
            Assert.True(await page.Page.Locator($"#{id}").IsVisibleAsync(), $"#{id} is not visible");
        }

        var cautions = await page.Page.Locator("#cautions").InnerTextAsync();
        Assert.All(HtmlReportRenderer.Cautions, c => Assert.Contains(c, cautions, StringComparison.Ordinal));
    }

    // A4 is 210 x 297 mm (ISO 216); the PDF is kept as a test artifact with a screenshot.
    [Fact]
    public async Task The_page_prints_on_A4_with_every_chart_whole_on_a_page()
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, file, 703);
        await page.Page.EmulateMediaAsync(new PageEmulateMediaOptions { Media = Media.Print });
        var pdf = Artifacts.PathFor("report-TST-300-A4.pdf");
        var png = Artifacts.PathFor("report-TST-300.png");
        await page.Page.PdfAsync(new PagePdfOptions { Path = pdf, Format = "A4", PrintBackground = true });
        await page.Page.EmulateMediaAsync(new PageEmulateMediaOptions { Media = Media.Screen });
        await page.Page.ScreenshotAsync(new PageScreenshotOptions { Path = png, FullPage = true });
        output.WriteLine($"PDF: {pdf}; screenshot: {png}");

        var bytes = await File.ReadAllBytesAsync(pdf);
        Assert.Equal("%PDF", Encoding.ASCII.GetString(bytes, 0, 4));
        // Print styles: figures are never split across pages.
        await page.Page.EmulateMediaAsync(new PageEmulateMediaOptions { Media = Media.Print });
        var breakInside = await page.Page.EvaluateAsync<string[]>("() => [...document.querySelectorAll('figure')].map(f => getComputedStyle(f).breakInside)");
        Assert.NotEmpty(breakInside);
        Assert.All(breakInside, b => Assert.Equal("avoid", b));
    }

    public void Dispose() => scratch.Dispose();

    private sealed record Layout(double PageWidth, double ScrollWidth, IReadOnlyList<ChartBox> Charts);

    private sealed record ChartBox(string Kind, double Width, double Height, double Right);
}
