using BatchReconcile.Cli.Tests.Support;
using BatchReconcile.Browser.Tests.Support;

namespace BatchReconcile.Browser.Tests;

/// <summary>
/// The request guard and the dialog watch that the digest tests rely on, shown to catch what they are meant
/// to catch: a page that does fetch something or does run a script.
/// </summary>
[Collection(ChromiumCollection.Name)]
public sealed class OfflinePageTests(ChromiumFixture chromium) : IDisposable
{
    private readonly TempFolder scratch = new();

    // Names under .invalid never resolve (RFC 2606); the guard refuses them before any lookup anyway.
    [Theory]
    [InlineData("<img src=\"https://example.invalid/logo.png\" alt=\"\">", "https://example.invalid/logo.png")]
    [InlineData("<link rel=\"stylesheet\" href=\"https://example.invalid/site.css\">", "https://example.invalid/site.css")]
    [InlineData("<script src=\"http://example.invalid/app.js\"></script>", "http://example.invalid/app.js")]
    [InlineData("<style>@font-face { font-family: X; src: url(https://example.invalid/x.woff2); } p { font-family: X; }</style><p>text</p>", "https://example.invalid/x.woff2")]
    [InlineData("<img src=\"other.png\" alt=\"\">", "other.png")]
    public async Task A_request_other_than_the_page_is_refused_and_recorded(string body, string fetched)
    {
        var file = scratch.Sub("page.html");
        await File.WriteAllTextAsync(file, $"<!DOCTYPE html><html><head><meta charset=\"utf-8\"></head><body>{body}</body></html>");

        await using var page = await OfflinePage.OpenAsync(chromium.Browser, file);

        var expected = new Uri(new Uri(page.Url), fetched).AbsoluteUri;
        Assert.Contains(expected, page.Refused);
        Assert.Contains(page.Url, page.Requests);
    }

    [Fact]
    public async Task A_dialog_is_recorded()
    {
        var file = scratch.Sub("alert.html");
        await File.WriteAllTextAsync(file, "<!DOCTYPE html><html><body><script>alert('hello')</script></body></html>");

        await using var page = await OfflinePage.OpenAsync(chromium.Browser, file);

        Assert.Equal(["alert: hello"], page.Dialogs);
    }

    public void Dispose() => scratch.Dispose();
}
