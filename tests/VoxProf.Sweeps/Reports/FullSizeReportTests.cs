using System.Globalization;
using Microsoft.Playwright;
using VoxProf.Cli;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Pixels;
using VoxProf.Tests.Browser;
using Xunit.Abstractions;

namespace VoxProf.Sweeps.Reports;

/// <summary>
/// report.html at the default size with every strategy: under the size budget (15 MB at 1280×720 with five
/// strategies), and its readout right at a far corner of the image in a real browser. Slow: a full trace.
/// </summary>
public sealed class FullSizeReportTests(ITestOutputHelper output) : IAsyncLifetime
{
    private const long Budget = 15_000_000;

    private readonly string _dir = Path.Combine(Path.GetTempPath(), $"voxprof-sweep-{Guid.NewGuid():N}");
    // Wide enough that the 1280-pixel image is drawn one screen pixel per image pixel beside the readout.
    private readonly BrowserFixture _browser = new(viewportWidth: 1800, viewportHeight: 1100);

    public Task InitializeAsync() => _browser.InitializeAsync();

    public async Task DisposeAsync()
    {
        await _browser.DisposeAsync();
        if (Directory.Exists(_dir))
            Directory.Delete(_dir, recursive: true);
    }

    [BrowserFact]
    public async Task The_demo_report_at_1280x720_with_five_strategies_stays_under_budget_and_reads_its_last_pixel()
    {
        string scene = Path.Combine(AppContext.BaseDirectory, "samples", "stonebrook-quarry.vpscene.json");
        var log = new StringWriter();
        VoxProf.Cli.Cli.Run(["trace", scene, "-o", _dir, "-q"], log, log).Should().Be(ExitCodes.Ok, log.ToString());
        string file = Path.Combine(_dir, "report.html");
        long size = new FileInfo(file).Length;
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"report.html: {size} bytes ({size / 1e6:0.00} MB)"));
        size.Should().BeLessThan(Budget);

        await using PageSession session = await _browser.OpenAsync(file);
        IPage page = session.Page;
        await page.ClickAsync("label:has(input[name=strategy][value=hdda])");
        await page.WaitForSelectorAsync("#readout[data-ready=\"hdda\"]", new() { State = WaitForSelectorState.Attached, Timeout = 120000 });
        ILocator image = page.Locator("figure.viewer img:not([hidden])");
        await image.ScrollIntoViewIfNeededAsync();
        (await image.BoundingBoxAsync())!.Width.Should().BeGreaterThanOrEqualTo(1280, "every image pixel can be pointed at");
        const int x = 1279, y = 719;
        await ReportPageTests.Hover(page, x, y);

        PixelData data = PixelDataFile.Read(Path.Combine(_dir, "pixels-hdda.bin.gz"));
        int i = y * data.Width + x;
        (await page.Locator("#ro-pixel").TextContentAsync()).Should().Be($"{x}, {y}");
        (await page.Locator("#ro-t").TextContentAsync()).Should().Be(data.Hits[i].Hit ? ((float)data.Hits[i].T).ToString("0.000", CultureInfo.InvariantCulture) : "–");
        (await page.Locator("#ro-counters dd[data-counter=iterations]").TextContentAsync()).Should()
            .Be(data.Get(Counter.Iterations)[i].ToString(CultureInfo.InvariantCulture));
        session.Errors.Should().BeEmpty();
        session.Requests.Should().BeEmpty();
    }
}
