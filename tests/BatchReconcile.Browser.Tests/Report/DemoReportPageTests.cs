using System.Text.Json;
using BatchReconcile.Browser.Tests.Support;
using Microsoft.Playwright;

namespace BatchReconcile.Browser.Tests.Report;

/// <summary>The analysis report that <c>demo</c> ends with (the real program's output for BZC-410), as Chromium shows and prints it.</summary>
[Collection(ChromiumCollection.Name)]
public sealed class DemoReportPageTests(ChromiumFixture chromium, DemoDigest demo)
{
    private static readonly JsonSerializerOptions Json = new(JsonSerializerDefaults.Web);

    [Fact]
    public void The_demo_writes_the_report_of_its_busiest_recipe_under_reports()
    {
        Assert.Equal(Path.Combine(demo.Data, "reports", "report-bzc-410.html"), demo.ReportPath);
        Assert.Contains("Analysis report of recipe BZC-410", demo.DemoOutput, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("screen", 1280)]
    [InlineData("print", 703)]
    public async Task The_report_fetches_nothing_and_every_chart_and_signal_label_is_drawn(string media, int width)
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, demo.ReportPath, width);
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
              marked: document.querySelectorAll('svg.chart rect[data-signals]').length,
              labels: [...document.querySelectorAll('svg.chart text[data-signal-label]')].map(t => {
                const r = t.getBoundingClientRect();
                return r.width > 0 && r.height > 0;
              }),
            })
            """);
        var layout = measured.Deserialize<Layout>(Json) ?? throw new InvalidOperationException("nothing measured");

        Assert.Empty(page.Refused);
        Assert.Equal([page.Url], page.Requests.Distinct());
        // BZC-410 has two steps: two control charts, then the loss Pareto.
        Assert.Equal(["control", "control", "pareto"], layout.Charts.Select(c => c.Kind));
        Assert.All(layout.Charts, c => Assert.True(c.Width > 300 && c.Height > 100 && c.Right <= layout.PageWidth + 0.5, $"{c.Kind}: {c.Width} x {c.Height}, right {c.Right} of {layout.PageWidth}"));
        Assert.True(layout.ScrollWidth <= layout.PageWidth, $"{layout.ScrollWidth}px in {layout.PageWidth}px");
        // The demo's version 2 lifted the acylation yield above the version 1 baseline: signals are expected, each labelled.
        Assert.True(layout.Marked > 0, "no point marked");
        Assert.Equal(layout.Marked, layout.Labels.Count);
        Assert.All(layout.Labels, Assert.True);
        var comparison = await page.Page.Locator("#comparison").InnerTextAsync();
        Assert.Contains("Route (whole batch)", comparison, StringComparison.Ordinal);
    }

    private sealed record Layout(double PageWidth, double ScrollWidth, IReadOnlyList<ChartBox> Charts, int Marked, IReadOnlyList<bool> Labels);

    private sealed record ChartBox(string Kind, double Width, double Height, double Right);
}
