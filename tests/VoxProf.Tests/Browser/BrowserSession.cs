using Microsoft.Playwright;

namespace VoxProf.Tests.Browser;

/// <summary>
/// Where the page tests find a browser: Debian's chromium (or <see cref="PathVariable"/>), driven by Playwright with
/// no browser download of its own. Without one the tests are skipped, unless <see cref="RequireVariable"/> is 1 (as
/// .ci/run sets it): then a missing browser fails them.
/// </summary>
public static class BrowserSetup
{
    public const string RequireVariable = "VOXPROF_REQUIRE_BROWSER";
    public const string PathVariable = "VOXPROF_CHROMIUM";

    public static string ExecutablePath => Environment.GetEnvironmentVariable(PathVariable) is { Length: > 0 } p ? p : "/usr/bin/chromium";

    public static bool Required => Environment.GetEnvironmentVariable(RequireVariable) == "1";

    /// <summary>Why the page tests are skipped, or null when they run.</summary>
    public static string? SkipReason => File.Exists(ExecutablePath) || Required
        ? null
        : $"no browser at {ExecutablePath}: install Debian's chromium (apt-get install chromium) or set {PathVariable}; " +
          $"{RequireVariable}=1 turns this skip into a failure";

    /// <summary>Flags that let Chromium run as root in a container on a closed network, quietly.</summary>
    public static readonly string[] Flags =
    [
        "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking",
        "--disable-component-update", "--disable-sync",
    ];
}

/// <summary>A test that needs a real browser: skipped with the reason when there is none and none is required.</summary>
public sealed class BrowserFactAttribute : FactAttribute
{
    public BrowserFactAttribute()
    {
        if (BrowserSetup.SkipReason is { } reason)
            Skip = reason;
    }
}

/// <summary>One headless Chromium with a new, empty profile, shared by the tests of a class.</summary>
public sealed class BrowserFixture(int viewportWidth = 1400, int viewportHeight = 1000) : IAsyncLifetime
{
    private readonly string _profile = Path.Combine(Path.GetTempPath(), $"voxprof-chromium-{Guid.NewGuid():N}");
    private IPlaywright? _playwright;
    private IBrowserContext? _context;

    public async Task InitializeAsync()
    {
        if (BrowserSetup.SkipReason is not null)
            return;
        if (!File.Exists(BrowserSetup.ExecutablePath))
            throw new InvalidOperationException($"{BrowserSetup.RequireVariable}=1 but there is no browser at {BrowserSetup.ExecutablePath}");
        Directory.CreateDirectory(_profile);
        _playwright = await Playwright.CreateAsync();
        _context = await _playwright.Chromium.LaunchPersistentContextAsync(_profile, new BrowserTypeLaunchPersistentContextOptions
        {
            ExecutablePath = BrowserSetup.ExecutablePath,
            Headless = true,
            Args = BrowserSetup.Flags,
            ViewportSize = new ViewportSize { Width = viewportWidth, Height = viewportHeight },
        });
    }

    public async Task DisposeAsync()
    {
        if (_context is not null)
            await _context.DisposeAsync();
        _playwright?.Dispose();
        try
        {
            Directory.Delete(_profile, recursive: true);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // A profile left in the temp folder is harmless.
        }
    }

    /// <summary>Opens <paramref name="file"/>; every request other than the file itself or a data: URI is refused and recorded.</summary>
    public async Task<PageSession> OpenAsync(string file)
    {
        IBrowserContext context = _context ?? throw new InvalidOperationException("no browser: the test should have been skipped");
        IPage page = await context.NewPageAsync();
        // What these tests check is what the page shows, not how fast: a 7.6 MB full-size page once took more than
        // Playwright's default 30 s to load while the sweeps kept both cores busy; clicks and waits get the same slack.
        page.SetDefaultTimeout(120000);
        page.SetDefaultNavigationTimeout(180000);
        var session = new PageSession(page, new Uri(Path.GetFullPath(file)).AbsoluteUri);
        await page.RouteAsync("**/*", async route =>
        {
            string url = route.Request.Url;
            if (session.Allowed(url))
            {
                await route.ContinueAsync();
                return;
            }
            lock (session.Requests)
                session.Requests.Add(url);
            await route.AbortAsync();
        });
        page.Request += (_, request) =>
        {
            if (!session.Allowed(request.Url))
            {
                lock (session.Requests)
                    session.Requests.Add(request.Url);
            }
        };
        page.Console += (_, message) =>
        {
            if (message.Type is "error" or "warning")
                session.Errors.Add($"console {message.Type}: {message.Text}");
        };
        page.PageError += (_, error) => session.Errors.Add($"page error: {error}");
        await page.GotoAsync(session.Url);
        return session;
    }
}

/// <summary>An open page and what it tried that it should not have.</summary>
public sealed class PageSession(IPage page, string url) : IAsyncDisposable
{
    public IPage Page { get; } = page;

    public string Url { get; } = url;

    /// <summary>Requests for anything but the page itself and data: URIs (each was refused).</summary>
    public List<string> Requests { get; } = [];

    /// <summary>Console errors and warnings, and uncaught script errors.</summary>
    public List<string> Errors { get; } = [];

    public bool Allowed(string requestUrl) =>
        requestUrl == Url || requestUrl.StartsWith("data:", StringComparison.Ordinal);

    public ValueTask DisposeAsync() => new(Page.CloseAsync());
}
