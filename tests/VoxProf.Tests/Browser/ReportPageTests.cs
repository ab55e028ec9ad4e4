using System.Globalization;
using System.Text.Json;
using Microsoft.Playwright;
using StbImageSharp;
using VoxProf.Cli;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Pixels;
using VoxProf.Tests.Compare;

namespace VoxProf.Tests.Browser;

/// <summary>Two small traces of a sample scene (the second with the prepass) and their comparison, made once.</summary>
public sealed class ReportPagesFixture : IAsyncLifetime
{
    public const int Width = 160, Height = 96;

    private readonly TempDir _tmp = new();

    public BrowserFixture Browser { get; } = new();

    public string Base => Path.Combine(_tmp.Path, "base");

    public string Candidate => Path.Combine(_tmp.Path, "candidate");

    public string Comparison => Path.Combine(_tmp.Path, "compare");

    public async Task InitializeAsync()
    {
        if (BrowserSetup.SkipReason is not null)
            return;
        string scene = Path.Combine(AppContext.BaseDirectory, "samples", "ring-post.vpscene.json");
        string size = $"{Width}x{Height}";
        Run(["trace", scene, "--size", size, "-o", Base, "-q"]);
        Run(["trace", scene, "--size", size, "--prepass", "4", "-o", Candidate, "-q"]);
        var output = new StringWriter();
        VoxProf.Cli.Cli.Run(["compare", Base, Candidate, "-o", Comparison, "-q"], output, output).Should().BeOneOf(ExitCodes.Ok, ExitCodes.RuleBroken);
        await Browser.InitializeAsync();
    }

    public async Task DisposeAsync()
    {
        await Browser.DisposeAsync();
        _tmp.Dispose();
    }

    private static void Run(string[] args)
    {
        var output = new StringWriter();
        VoxProf.Cli.Cli.Run(args, output, output).Should().Be(ExitCodes.Ok, output.ToString());
    }
}

/// <summary>report.html and compare.html in a real headless Chromium (see DEVELOPERS.md, "Page tests").</summary>
public sealed class ReportPageTests(ReportPagesFixture pages) : IClassFixture<ReportPagesFixture>
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    private async Task<PageSession> OpenReport()
    {
        PageSession session = await pages.Browser.OpenAsync(Path.Combine(pages.Base, "report.html"));
        await WaitReady(session.Page, "slab");
        return session;
    }

    /// <summary>The readout has decoded <paramref name="strategy"/>'s pixel data.</summary>
    private static Task WaitReady(IPage page, string strategy) =>
        page.WaitForSelectorAsync($"#readout[data-ready=\"{strategy}\"]", new() { State = WaitForSelectorState.Attached, Timeout = 120000 });

    /// <summary>Moves the mouse onto traced pixel (x, y) of the image on show.</summary>
    public static async Task Hover(IPage page, int x, int y)
    {
        ILocator image = page.Locator("figure.viewer img:not([hidden])");
        await image.ScrollIntoViewIfNeededAsync();
        LocatorBoundingBoxResult box = (await image.BoundingBoxAsync())!;
        int naturalWidth = int.Parse((await image.GetAttributeAsync("width"))!, Inv);
        int naturalHeight = int.Parse((await image.GetAttributeAsync("height"))!, Inv);
        int x0 = int.Parse((await image.GetAttributeAsync("data-x0"))!, Inv), y0 = int.Parse((await image.GetAttributeAsync("data-y0"))!, Inv);
        await page.Mouse.MoveAsync(OnScreen(box.X, x0 + x, box.Width / naturalWidth), OnScreen(box.Y, y0 + y, box.Height / naturalHeight));
    }

    /// <summary>
    /// A point the browser reports inside image pixel <paramref name="pixel"/>: mouse events carry whole CSS pixels
    /// (truncated), and the image may start at a fraction, so aim half a pixel past the first whole pixel inside it.
    /// Needs at least one screen pixel per image pixel.
    /// </summary>
    public static float OnScreen(float start, int pixel, float scale) => MathF.Ceiling(start + pixel * scale) + 0.5f;

    private static async Task<Dictionary<string, string>> Readout(IPage page)
    {
        var values = new Dictionary<string, string>();
        foreach (string id in new[] { "ro-pixel", "ro-strategy", "ro-voxel", "ro-face", "ro-t", "ro-material" })
            values[id] = (await page.Locator("#" + id).TextContentAsync())!.Trim();
        foreach (ILocator cell in await page.Locator("#ro-counters dd").AllAsync())
            values[(await cell.GetAttributeAsync("data-counter"))!] = (await cell.TextContentAsync())!.Trim();
        return values;
    }

    /// <summary>What the readout must show for pixel (x, y), from the per-pixel file the same trace wrote.</summary>
    private Dictionary<string, string> Expected(string strategy, int x, int y)
    {
        PixelData data = PixelDataFile.Read(Path.Combine(pages.Base, $"pixels-{strategy}.bin.gz"));
        int i = y * data.Width + x;
        PixelHit hit = data.Hits[i];
        var values = new Dictionary<string, string>
        {
            ["ro-pixel"] = $"{x}, {y}",
            ["ro-strategy"] = strategy,
            ["ro-voxel"] = hit.Hit ? $"{hit.X}, {hit.Y}, {hit.Z}" : "miss",
            ["ro-face"] = hit.Hit ? PixelHit.FaceName(hit.Face) : "–",
            ["ro-t"] = hit.Hit ? ((float)hit.T).ToString("0.000", Inv) : "–",
            ["ro-material"] = hit.Hit ? hit.Material.ToString(Inv) : "–",
        };
        for (int c = 0; c < data.CounterNames.Count; c++)
            values[data.CounterNames[c]] = data.Counters[c][i].ToString(Inv);
        return values;
    }

    [BrowserFact]
    public async Task The_report_opens_with_no_console_errors_and_asks_the_network_for_nothing()
    {
        await using PageSession session = await OpenReport();
        await session.Page.ClickAsync("label:has(input[name=map][value=preview])");
        await Hover(session.Page, 3, 3);

        session.Errors.Should().BeEmpty();
        session.Requests.Should().BeEmpty();
    }

    [BrowserFact]
    public async Task Hovering_a_pixel_shows_its_hit_and_every_counter_as_the_trace_wrote_them()
    {
        await using PageSession session = await OpenReport();
        PixelData data = PixelDataFile.Read(Path.Combine(pages.Base, "pixels-slab.bin.gz"));
        int hitPixel = Array.FindIndex(data.Hits, h => h.Hit && h.Face != HitFace.None);
        int missPixel = Array.FindIndex(data.Hits, h => !h.Hit);
        hitPixel.Should().BeGreaterThanOrEqualTo(0);
        missPixel.Should().BeGreaterThanOrEqualTo(0);
        // The middle of the image, where the post stands, and the first hit and miss in reading order.
        foreach (int i in new[] { (ReportPagesFixture.Height / 2) * ReportPagesFixture.Width + ReportPagesFixture.Width / 2, hitPixel, missPixel })
        {
            int x = i % ReportPagesFixture.Width, y = i / ReportPagesFixture.Width;
            await Hover(session.Page, x, y);
            (await Readout(session.Page)).Should().Equal(Expected("slab", x, y), $"pixel {x}, {y}");
        }
        session.Errors.Should().BeEmpty();
    }

    [BrowserFact]
    public async Task Switching_the_strategy_and_map_changes_the_image_and_the_readout()
    {
        await using PageSession session = await OpenReport();
        IPage page = session.Page;

        await page.ClickAsync("label:has(input[name=strategy][value=dda-mask])");
        await page.ClickAsync("label:has(input[name=map][value=subgroup32])");
        await WaitReady(page, "dda-mask");

        ILocator shown = page.Locator("figure.viewer img:not([hidden])");
        (await shown.CountAsync()).Should().Be(1);
        (await shown.GetAttributeAsync("data-strategy")).Should().Be("dda-mask");
        (await shown.GetAttributeAsync("data-map")).Should().Be("subgroup32");
        int x = ReportPagesFixture.Width / 2 + 7, y = ReportPagesFixture.Height / 2 - 5;
        await Hover(page, x, y);
        (await Readout(page)).Should().Equal(Expected("dda-mask", x, y));

        // One screen pixel per image pixel: the small trace is then drawn at its own size.
        await page.ClickAsync("#actual-size");
        float pngWidth = float.Parse((await shown.GetAttributeAsync("width"))!, Inv);
        (await shown.BoundingBoxAsync())!.Width.Should().BeApproximately(pngWidth, 0.5f);
        await Hover(page, 2, 3);
        (await Readout(page)).Should().Equal(Expected("dda-mask", 2, 3));
        session.Errors.Should().BeEmpty();
    }

    [BrowserFact]
    public async Task Clicking_a_column_name_sorts_the_strategy_table_both_ways()
    {
        await using PageSession session = await OpenReport();
        IPage page = session.Page;
        using JsonDocument report = JsonDocument.Parse(File.ReadAllText(Path.Combine(pages.Base, "report.json")));
        var costs = report.RootElement.GetProperty("strategies").EnumerateArray()
            .Select(s => (Name: s.GetProperty("name").GetString()!, Cost: s.GetProperty("values").GetProperty("total-iterations.mean").GetDouble()))
            .ToList();
        costs.Should().HaveCount(5);
        // Both sorts are stable: equal costs keep the trace order either way.
        var ascending = costs.OrderBy(s => s.Cost).Select(s => s.Name).ToList();
        var descending = costs.OrderByDescending(s => s.Cost).Select(s => s.Name).ToList();

        async Task<List<string>> Order()
        {
            var names = new List<string>();
            foreach (ILocator row in await page.Locator("#strategy-table tbody tr").AllAsync())
                names.Add((await row.GetAttributeAsync("data-strategy"))!);
            return names;
        }

        await page.ClickAsync("#strategy-table th button:text-is('total-iterations.mean')");
        (await Order()).Should().Equal(ascending);
        await page.ClickAsync("#strategy-table th button:text-is('total-iterations.mean')");
        (await Order()).Should().Equal(descending);
        (await page.GetAttributeAsync("#strategy-table th:nth-child(2)", "aria-sort")).Should().Be("descending");
    }

    [BrowserFact]
    public async Task A_screenshot_of_the_report_shows_the_page_laid_out()
    {
        await using PageSession session = await OpenReport();
        await Hover(session.Page, ReportPagesFixture.Width / 2, ReportPagesFixture.Height / 2);
        string file = Path.Combine(Screenshots(), "report.png");

        await session.Page.ScreenshotAsync(new() { Path = file, FullPage = true });

        ImageResult png = ImageResult.FromMemory(File.ReadAllBytes(file), ColorComponents.RedGreenBlue);
        png.Width.Should().Be(1400);
        png.Height.Should().BeGreaterThan(1000, "the table, the maps, the histograms and the facts run past one screen");
        // The page is not blank: its pixels take many colours (heatmaps, histograms, text).
        png.Data.Chunk(3).Select(p => (p[0] << 16) | (p[1] << 8) | p[2]).Distinct().Count().Should().BeGreaterThan(200);
    }

    [BrowserFact]
    public async Task The_comparison_page_opens_cleanly_states_the_gate_sorts_and_switches_difference_maps()
    {
        await using PageSession session = await pages.Browser.OpenAsync(Path.Combine(pages.Comparison, "compare.html"));
        IPage page = session.Page;

        (await page.GetAttributeAsync("#gate", "class")).Should().MatchRegex("gate (holds|fails)");
        (await page.Locator("#gate .verdict").TextContentAsync()).Should().StartWith("The gate");
        await page.ClickAsync("#change-table th button:text-is('relative')");
        var relative = new List<double>();
        foreach (ILocator cell in await page.Locator("#change-table tbody td:nth-child(7)").AllAsync())
            relative.Add(double.Parse((await cell.GetAttributeAsync("data-v"))!, Inv));
        relative.Should().BeInAscendingOrder();
        await page.ClickAsync("#differences label:has(input[name=map][value=subgroup32])");
        (await page.Locator("#differences figure.viewer img:not([hidden])").GetAttributeAsync("data-map")).Should().Be("subgroup32");
        await page.ScreenshotAsync(new() { Path = Path.Combine(Screenshots(), "compare.png"), FullPage = true });

        session.Errors.Should().BeEmpty();
        session.Requests.Should().BeEmpty();
    }

    /// <summary>Screenshots stay after the run for a person to look at: VOXPROF_SCREENSHOTS, or the temp folder.</summary>
    private static string Screenshots()
    {
        string dir = Environment.GetEnvironmentVariable("VOXPROF_SCREENSHOTS") is { Length: > 0 } d ? d : Path.Combine(Path.GetTempPath(), "voxprof-screenshots");
        Directory.CreateDirectory(dir);
        return dir;
    }
}
