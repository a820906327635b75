using BatchReconcile.Browser.Tests.Support;
using BatchReconcile.Digest.Rendering;
using Microsoft.Playwright;

namespace BatchReconcile.Browser.Tests.Digest;

/// <summary>The digest that <c>demo</c> ends with, as Chromium shows it on screen.</summary>
[Collection(ChromiumCollection.Name)]
public sealed class DemoDigestPageTests(ChromiumFixture chromium, DemoDigest digest)
{
    [Fact]
    public void The_demo_writes_the_digest_of_the_last_sample_day_under_digests()
    {
        // sample-data/README.md: the production week of the scenario is 2026-11-23 to 2026-11-27.
        Assert.Equal("2026-11-27", digest.Day);
        Assert.Equal(Path.Combine(digest.Data, "digests"), Path.GetDirectoryName(digest.HtmlPath));
        Assert.True(File.Exists(digest.HtmlPath), digest.HtmlPath);
    }

    [Fact]
    public async Task The_summary_shows_the_day_and_the_site()
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, digest.HtmlPath);
        var summary = await page.Page.Locator("#summary").InnerTextAsync();

        Assert.Contains(digest.Day, summary, StringComparison.Ordinal);
        Assert.Contains(digest.SiteName, summary, StringComparison.Ordinal);
        Assert.Contains(digest.Day, await page.Page.TitleAsync(), StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("summary", "h1", "Daily exception digest")]
    [InlineData("exceptions", "h2", "Exceptions of the day")]
    [InlineData("flagged-steps", "h2", "Flagged steps: where the charged mass went")]
    [InlineData("yields", "h2", "Yields against limits")]
    [InlineData("cautions", "h2", "Cautions")]
    public async Task Each_section_is_visible_with_its_heading(string id, string level, string heading)
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, digest.HtmlPath);
        var section = page.Page.Locator($"#{id}");
        var title = section.Locator(level).First;

        Assert.True(await section.IsVisibleAsync(), $"#{id} is not visible");
        Assert.True(await title.IsVisibleAsync(), $"#{id} {level} is not visible");
        Assert.Equal(heading, (await title.InnerTextAsync()).Trim());
    }

    [Fact]
    public async Task Every_flag_of_the_day_is_a_visible_row_with_its_batch_and_code()
    {
        // The scenario's last day is meant to carry flags (sample-data/README.md, expected results).
        Assert.NotEmpty(digest.Flags);
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, digest.HtmlPath);
        var rows = page.Page.Locator("#exceptions table tbody tr");

        Assert.Equal(digest.Flags.Count, await rows.CountAsync());
        foreach (var flag in digest.Flags)
        {
            Assert.Equal(digest.Day, flag.Day);
            var row = page.Page.Locator($"#exceptions tr[data-flag-id=\"{flag.Id}\"]");
            Assert.True(await row.IsVisibleAsync(), $"flag {flag.Id} ({flag.Batch} {flag.Code}) has no visible row");
            var text = await row.InnerTextAsync();
            Assert.Contains(flag.Batch, text, StringComparison.Ordinal);
            Assert.Contains(flag.Step, text, StringComparison.Ordinal);
            Assert.Contains(flag.Code, text, StringComparison.Ordinal);
            Assert.Contains(flag.Severity, text, StringComparison.Ordinal);
        }
    }

    [Fact]
    public async Task The_cautions_are_shown()
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, digest.HtmlPath);
        var cautions = await page.Page.Locator("#cautions").InnerTextAsync();

        Assert.NotEmpty(DigestText.Cautions);
        foreach (var caution in DigestText.Cautions)
        {
            Assert.Contains(caution, cautions, StringComparison.Ordinal);
        }
    }

    [Theory]
    [InlineData(1280)]
    [InlineData(1024)]
    [InlineData(800)]
    public async Task Every_chart_is_laid_out_with_a_size_inside_the_page(int width)
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, digest.HtmlPath, width);
        var charts = await page.Page.Locator("svg.chart").AllAsync();

        Assert.NotEmpty(charts);
        foreach (var chart in charts)
        {
            var box = await chart.BoundingBoxAsync();
            var label = await chart.Locator("title").First.TextContentAsync();
            Assert.True(box is { Width: > 0, Height: > 0 }, $"chart '{label}' has no size: {Describe(box)}");
            Assert.True(box!.X >= 0 && box.X + box.Width <= width, $"chart '{label}' leaves the {width}px page: {Describe(box)}");
        }
    }

    // sample-data/README.md: on the 27th KB3-NB-0167 S1 has yield-high, a toluene-heavy step (the solvent is most
    // of the charge), so its yield rungs are slivers on the full ladder's scale. The rung a flag is about must still
    // be a visible bar: in the ladder without solvents, dark, at least 4 px wide in the SVG's units (LadderChart),
    // 3 px left after the page scales the 700 px chart down to the narrowest width tried here.
    [Theory]
    [InlineData("screen", 1280)]
    [InlineData("screen", 800)]
    [InlineData("print", 703)]
    public async Task The_rung_that_raised_a_flag_is_a_visible_bar_when_the_solvent_dominates_the_step(string media, int width)
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, digest.HtmlPath, width);
        await page.Page.EmulateMediaAsync(new PageEmulateMediaOptions { Media = media == "print" ? Media.Print : Media.Screen });
        var panel = page.Page.Locator("svg.chart[data-panel=\"reaction\"]").Filter(new LocatorFilterOptions { HasText = "KB3-NB-0167" });

        Assert.Equal(1, await panel.CountAsync());
        var flagged = await panel.Locator("rect[data-flagged=\"true\"]").AllAsync();
        Assert.NotEmpty(flagged);
        foreach (var rect in flagged)
        {
            var box = await rect.BoundingBoxAsync();
            var rung = await rect.GetAttributeAsync("data-rung");
            Assert.True(await rect.IsVisibleAsync(), $"flagged rung {rung} is not visible");
            Assert.True(box is { Width: >= 3, Height: >= 8 }, $"flagged rung {rung} is drawn {Describe(box)}");
            Assert.Equal("#222222", await rect.GetAttributeAsync("fill"));
        }

        var labels = await panel.Locator("text").AllTextContentsAsync();
        Assert.Contains(labels, l => l.StartsWith("flag: yield loss", StringComparison.Ordinal));
        // The solvent rung is left out of that panel, which is what lets the others take the width.
        Assert.Equal(0, await panel.Locator("rect[data-rung=\"auxiliaries-not-recovered\"]").CountAsync());
    }

    [Fact]
    public async Task The_page_fetches_nothing_but_itself()
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, digest.HtmlPath);
        await page.Page.WaitForLoadStateAsync(LoadState.NetworkIdle);

        Assert.Empty(page.Refused);
        Assert.Equal([page.Url], page.Requests);
        Assert.Equal(0, await page.Page.Locator("script, link, img, iframe, object, embed").CountAsync());
    }

    private static string Describe(LocatorBoundingBoxResult? box) =>
        box is null ? "no box" : FormattableString.Invariant($"x {box.X}, y {box.Y}, {box.Width} x {box.Height}");
}
