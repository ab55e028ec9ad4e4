using VoxProf.Tests.Browser;
using VoxProf.Tests.Cli.Commands;

namespace VoxProf.Sweeps.Reports;

/// <summary>The run level's report.html of a run of several views, in a real headless Chromium (kept here: a browser start costs seconds).</summary>
public sealed class RunPageTests : IAsyncLifetime
{
    private readonly CliScratch _scratch = new(
        "{'kind': 'box', 'material': 1, 'min': [0, 0, 0], 'max': [64, 6, 64]},{'kind': 'sphere', 'material': 2, 'center': [30, 12, 34], 'radius': 9}",
        "{'name': 'yard', 'eye': [2, 20, 2], 'target': [40, 8, 40]}," +
        "{'name': 'walk', 'path': {'frames': 4, 'keys': [{'eye': [4, 12, 60], 'target': [30, 10, 30]}, {'eye': [60, 14, 40], 'target': [30, 10, 30]}]}}");

    private readonly BrowserFixture _browser = new();

    public Task InitializeAsync() => BrowserSetup.SkipReason is null ? _browser.InitializeAsync() : Task.CompletedTask;

    public async Task DisposeAsync()
    {
        await _browser.DisposeAsync();
        _scratch.Dispose();
    }

    [BrowserFact]
    public async Task The_run_page_shows_the_worst_views_and_sorts_its_views_without_errors_or_requests()
    {
        string run = _scratch.Out("run");
        CliScratch.Run("trace", _scratch.Scene.Path, "--camera", "all", "--size", "32x18", "-q", "--strategy", "dda,dda-mask", "-o", run).Code.Should().Be(0);

        await using PageSession session = await _browser.OpenAsync(Path.Combine(run, "report.html"));
        var page = session.Page;

        (await page.Locator("#view-table tbody tr").CountAsync()).Should().Be(5);
        (await page.Locator("#worst-views img").GetAttributeAsync("src")).Should().StartWith("data:image/png;base64,");
        (await page.Locator("#view-table a").First.GetAttributeAsync("href")).Should().Be("views/yard/report.html");
        await page.Locator("#view-table thead th").Nth(1).Locator("button").ClickAsync();
        (await page.Locator("#view-table thead th").Nth(1).GetAttributeAsync("aria-sort")).Should().Be("ascending");
        session.Errors.Should().BeEmpty();
        session.Requests.Should().BeEmpty();
    }
}
