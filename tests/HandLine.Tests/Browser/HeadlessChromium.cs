using Microsoft.Playwright;

namespace HandLine.Tests.Browser;

/// <summary>
/// Debian's chromium (installed by .ci/run) driven headless by Playwright for .NET, to check generated HTML in a
/// real browser. Playwright's own browser download cannot work on these machines, so the executable is given
/// explicitly. A missing browser is a failure, not a skip: CI installs it, so its absence is a broken set-up.
/// Reusable: open any local file and inspect the page, its console and page errors.
/// </summary>
internal sealed class HeadlessChromium : IAsyncDisposable
{
    /// <summary>Where Debian's package puts the browser; HANDLINE_CHROMIUM overrides it.</summary>
    public const string DefaultPath = "/usr/bin/chromium";

    private readonly IPlaywright _playwright;
    private readonly IBrowser _browser;

    private HeadlessChromium(IPlaywright playwright, IBrowser browser)
    {
        _playwright = playwright;
        _browser = browser;
    }

    public static string ExecutablePath => Environment.GetEnvironmentVariable("HANDLINE_CHROMIUM") is { Length: > 0 } path ? path : DefaultPath;

    /// <exception cref="InvalidOperationException">No browser at <see cref="ExecutablePath"/>.</exception>
    public static async Task<HeadlessChromium> StartAsync()
    {
        if (!File.Exists(ExecutablePath))
            throw new InvalidOperationException(
                $"No chromium at {ExecutablePath}: install it with 'apt-get install -y chromium' (.ci/run does), or set HANDLINE_CHROMIUM.");
        var playwright = await Playwright.CreateAsync();
        try
        {
            var browser = await playwright.Chromium.LaunchAsync(new BrowserTypeLaunchOptions
            {
                ExecutablePath = ExecutablePath,
                Headless = true,
                // CI runs as root, where chromium refuses to start with its sandbox; /dev/shm may be small in containers.
                Args = ["--no-sandbox", "--disable-dev-shm-usage", "--disable-gpu"],
                Timeout = 60_000,
            });
            return new HeadlessChromium(playwright, browser);
        }
        catch
        {
            playwright.Dispose();
            throw;
        }
    }

    /// <summary>
    /// Opens a local file with the network cut off (so a page that fetched anything would show it as an error) and
    /// returns the loaded page with every console error and uncaught page error seen while it loaded.
    /// </summary>
    public async Task<LoadedPage> OpenAsync(string file)
    {
        var context = await _browser.NewContextAsync(new BrowserNewContextOptions { Offline = true, JavaScriptEnabled = true });
        var page = await context.NewPageAsync();
        var errors = new List<string>();
        var requests = new List<string>();
        page.Console += (_, message) =>
        {
            if (message.Type is "error" or "warning")
                lock (errors) errors.Add($"console {message.Type}: {message.Text}");
        };
        page.PageError += (_, error) => { lock (errors) errors.Add($"page error: {error}"); };
        page.Request += (_, request) =>
        {
            if (!request.Url.StartsWith("data:", StringComparison.Ordinal) && request.Url != new Uri(Path.GetFullPath(file)).AbsoluteUri)
                lock (requests) requests.Add(request.Url);
        };
        await page.GotoAsync(new Uri(Path.GetFullPath(file)).AbsoluteUri, new PageGotoOptions { WaitUntil = WaitUntilState.Load, Timeout = 30_000 });
        return new LoadedPage(context, page, errors, requests);
    }

    public async ValueTask DisposeAsync()
    {
        await _browser.DisposeAsync();
        _playwright.Dispose();
    }
}

/// <summary>A page opened by <see cref="HeadlessChromium"/>, with what went wrong while it loaded.</summary>
internal sealed record LoadedPage(IBrowserContext Context, IPage Page, IReadOnlyList<string> Errors, IReadOnlyList<string> Requests) : IAsyncDisposable
{
    public async ValueTask DisposeAsync() => await Context.DisposeAsync();
}
