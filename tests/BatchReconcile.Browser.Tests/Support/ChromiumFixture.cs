using Microsoft.Playwright;

namespace BatchReconcile.Browser.Tests.Support;

/// <summary>
/// One headless Debian Chromium for the tests of a collection. The browser is the system package, never one that
/// Playwright downloads: the machines that run these tests fetch nothing but packages.
/// </summary>
public sealed class ChromiumFixture : IAsyncLifetime
{
    public const string ExecutablePath = "/usr/bin/chromium";

    // No GPU, no sandbox (the tests run as root in CI), and none of the browser's own traffic, so that every
    // request the tests see comes from the page.
    private static readonly string[] Arguments =
    [
        "--no-sandbox",
        "--disable-gpu",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
        "--no-first-run",
    ];

    private IPlaywright? playwright;
    private IBrowser? browser;

    public IBrowser Browser => browser ?? throw new InvalidOperationException("Chromium was not started");

    public async Task InitializeAsync()
    {
        if (!File.Exists(ExecutablePath))
        {
            throw new InvalidOperationException(
                $"{ExecutablePath} not found: install Debian's chromium (apt-get install chromium). "
                + "These tests never download a browser (no `playwright install`).");
        }

        playwright = await Playwright.CreateAsync();
        browser = await playwright.Chromium.LaunchAsync(new BrowserTypeLaunchOptions
        {
            ExecutablePath = ExecutablePath,
            Headless = true,
            Args = Arguments,
            Timeout = 60_000,
        });
    }

    public async Task DisposeAsync()
    {
        if (browser is not null)
        {
            await browser.CloseAsync();
        }

        playwright?.Dispose();
    }
}
