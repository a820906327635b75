using System.Collections.Concurrent;
using Microsoft.Playwright;

namespace BatchReconcile.Browser.Tests.Support;

/// <summary>
/// A local HTML file opened in its own browser context in which every request is routed: only the file itself
/// is let through, anything else is refused and recorded, and so is every dialog the page opens.
/// </summary>
public sealed class OfflinePage : IAsyncDisposable
{
    private const float Timeout = 30_000;

    private readonly IBrowserContext context;
    private readonly ConcurrentQueue<string> requests;
    private readonly ConcurrentQueue<string> refused;
    private readonly ConcurrentQueue<string> dialogs;

    private OfflinePage(IBrowserContext context, IPage page, string url, ConcurrentQueue<string> requests, ConcurrentQueue<string> refused, ConcurrentQueue<string> dialogs)
    {
        this.context = context;
        Page = page;
        Url = url;
        this.requests = requests;
        this.refused = refused;
        this.dialogs = dialogs;
    }

    public IPage Page { get; }

    /// <summary>The file:// address of the page.</summary>
    public string Url { get; }

    /// <summary>Every request the page made, the page itself included, as the browser saw it.</summary>
    public IReadOnlyList<string> Requests => [.. requests];

    /// <summary>Requests the route refused: anything but the page itself.</summary>
    public IReadOnlyList<string> Refused => [.. refused];

    /// <summary>Dialogs (alert, confirm, prompt) the page opened: type and message.</summary>
    public IReadOnlyList<string> Dialogs => [.. dialogs];

    public static async Task<OfflinePage> OpenAsync(IBrowser browser, string file, int width = 1280, int height = 900)
    {
        var url = new Uri(Path.GetFullPath(file)).AbsoluteUri;
        var requests = new ConcurrentQueue<string>();
        var refused = new ConcurrentQueue<string>();
        var dialogs = new ConcurrentQueue<string>();
        var context = await browser.NewContextAsync(new BrowserNewContextOptions
        {
            ViewportSize = new ViewportSize { Width = width, Height = height },
            // Scripts stay enabled on purpose: an injected script must be inert because of the page, not the test.
            JavaScriptEnabled = true,
        });
        context.SetDefaultTimeout(Timeout);
        await context.RouteAsync("**/*", async route =>
        {
            if (SameAddress(route.Request.Url, url))
            {
                await route.ContinueAsync();
            }
            else
            {
                refused.Enqueue(route.Request.Url);
                await route.AbortAsync("blockedbyclient");
            }
        });

        var page = await context.NewPageAsync();
        page.Request += (_, request) => requests.Enqueue(request.Url);
        page.Dialog += (_, dialog) =>
        {
            dialogs.Enqueue($"{dialog.Type}: {dialog.Message}");
            _ = dialog.DismissAsync();
        };
        await page.GotoAsync(url, new PageGotoOptions { WaitUntil = WaitUntilState.Load, Timeout = Timeout });
        return new OfflinePage(context, page, url, requests, refused, dialogs);
    }

    public async ValueTask DisposeAsync() => await context.CloseAsync();

    private static bool SameAddress(string a, string b) =>
        Uri.TryCreate(a, UriKind.Absolute, out var ua) && Uri.TryCreate(b, UriKind.Absolute, out var ub) && ua == ub;
}
