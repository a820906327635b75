using System.Text.RegularExpressions;
using BatchReconcile.Browser.Tests.Support;
using Microsoft.Playwright;

namespace BatchReconcile.Browser.Tests.Digest;

/// <summary>
/// Batch data and settings with markup, quotes, formulas and path pieces come out inert: as text in the page
/// Chromium shows, neutralised in the CSV, absent from the file names (docs/digest.md, "Safety of the outputs").
/// </summary>
[Collection(ChromiumCollection.Name)]
public sealed partial class InjectionTests(ChromiumFixture chromium, HostileDigest hostile) : IClassFixture<HostileDigest>
{
    [Fact]
    public void The_hostile_batch_id_is_stored_as_given_and_flagged()
    {
        Assert.Contains(HostileDigest.BatchId, hostile.IngestedBatches);
        Assert.NotEmpty(hostile.BatchFlags);
        // The sample batch is on the scenario's last day (sample-data/README.md): the id changes nothing else.
        Assert.Equal("2026-11-27", hostile.Day);
    }

    [Fact]
    public async Task The_page_opens_no_dialog_and_holds_no_script()
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, hostile.HtmlPath);
        await page.Page.WaitForLoadStateAsync(LoadState.NetworkIdle);

        Assert.Empty(page.Dialogs);
        Assert.Equal(0, await page.Page.Locator("script").CountAsync());
        Assert.Empty(page.Refused);
        Assert.Equal([page.Url], page.Requests);
    }

    [Fact]
    public async Task The_hostile_batch_id_and_site_name_are_visible_as_text()
    {
        await using var page = await OfflinePage.OpenAsync(chromium.Browser, hostile.HtmlPath);

        var exceptions = await page.Page.Locator("#exceptions").InnerTextAsync();
        var summary = await page.Page.Locator("#summary").InnerTextAsync();

        Assert.Contains(HostileDigest.BatchId, exceptions, StringComparison.Ordinal);
        Assert.Contains(HostileDigest.SiteName, summary, StringComparison.Ordinal);
        Assert.Contains(HostileDigest.SiteName, await page.Page.TitleAsync(), StringComparison.Ordinal);
        foreach (var flag in hostile.BatchFlags)
        {
            var row = await page.Page.Locator($"#exceptions tr[data-flag-id=\"{flag.Id}\"]").InnerTextAsync();
            Assert.Contains(HostileDigest.BatchId, row, StringComparison.Ordinal);
        }
    }

    [Fact]
    public async Task The_csv_batch_cell_starts_with_an_apostrophe()
    {
        var records = CsvRecords.Parse(await File.ReadAllTextAsync(hostile.CsvPath));
        var batch = records[0].ToList().IndexOf("batch");
        var rows = records.Skip(1).ToList();

        Assert.True(batch >= 0, "the CSV has no batch column");
        Assert.Equal(hostile.BatchFlags.Count, rows.Count);
        // docs/digest.md: a text cell starting with =, +, - or @ is written with an apostrophe in front.
        Assert.All(rows, row => Assert.Equal("'" + HostileDigest.BatchId, row[batch]));
    }

    [Fact]
    public async Task The_markdown_holds_no_tag()
    {
        var markdown = await File.ReadAllTextAsync(hostile.MarkdownPath);

        Assert.DoesNotContain("<script", markdown, StringComparison.OrdinalIgnoreCase);
        Assert.Contains("&lt;script&gt;", markdown, StringComparison.Ordinal);
    }

    [Fact]
    public void The_file_names_are_plain_whatever_the_site_name()
    {
        var written = Directory.GetFiles(hostile.DigestsFolder, "*", SearchOption.AllDirectories);

        Assert.Equal(3, hostile.Files.Count);
        Assert.Equal(hostile.Files.Order(StringComparer.Ordinal), written.Order(StringComparer.Ordinal));
        Assert.All(written, file =>
        {
            var name = Path.GetFileName(file);
            Assert.Equal(hostile.DigestsFolder, Path.GetDirectoryName(file));
            Assert.DoesNotContain("..", name, StringComparison.Ordinal);
            Assert.DoesNotContain('/', name);
            Assert.DoesNotContain('\\', name);
            Assert.Matches(PlainName(), name);
        });
    }

    // docs/digest.md: digest-YYYY-MM-DD-SITE.ext, SITE lower-case ASCII letters and digits joined by hyphens.
    [GeneratedRegex(@"^digest-\d{4}-\d{2}-\d{2}(-[a-z0-9]+(-[a-z0-9]+)*)?\.(html|md|csv)$")]
    private static partial Regex PlainName();
}
