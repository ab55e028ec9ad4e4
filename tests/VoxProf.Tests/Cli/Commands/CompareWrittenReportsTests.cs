using System.Text.Json;
using StbImageSharp;
using VoxProf.Cli;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Colour;
using VoxProf.Reports.Export;
using VoxProf.Reports.Images;
using VoxProf.Tests.Compare;
using VoxProf.Tests.Reports;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>
/// compare over report directories written by the trace report writer (report.json plus per-pixel data), from
/// hand-made traces: the candidate's scene gained work in the top rows, as a new layer in view would add.
/// </summary>
public class CompareWrittenReportsTests : IDisposable
{
    private readonly TempDir _tmp = new();
    private readonly StringWriter _out = new();
    private readonly StringWriter _err = new();

    public void Dispose() => _tmp.Dispose();

    private static TraceRun Candidate()
    {
        var b = TestRuns.Small();
        var scene = new Scene(64, 32, 64, [], b.Scene.Cameras, "yard", "/scenes/yard.json", "ee77ff");
        // Rows 0-1 cost 6 more iterations; dda's pixel (2, 0) now hits a voxel the base missed.
        var grid = TestRuns.Result(BuiltInStrategies.Grid, 16, 8, (x, y) => (uint)(x + y + 1 + (y < 2 ? 6 : 0)), hitShift: false, elapsedMs: 31);
        var dda = TestRuns.Result(BuiltInStrategies.Dda, 16, 8, (x, y) => x == 3 && y == 2 ? 40u : (uint)(x + y + 1) / 2 + (y < 2 ? 6u : 0u), hitShift: true, elapsedMs: 11);
        dda.Hits[15] = new PixelHit { Hit = true, X = 15, Y = 10, Z = 60, T = 40 };
        return new TraceRun(scene, b.Camera, b.Settings, b.Tree, [grid, dda]);
    }

    private (string Base, string Candidate) WriteReports()
    {
        var a = Path.Combine(_tmp.Path, "base");
        var b = Path.Combine(_tmp.Path, "candidate");
        ReportWriter.WriteAll(TestRuns.Small(), TestRuns.Options, a).Failures.Should().BeEmpty();
        ReportWriter.WriteAll(Candidate(), TestRuns.Options, b).Failures.Should().BeEmpty();
        return (a, b);
    }

    private int Run(params string[] args) =>
        VoxProf.Cli.Cli.Run(["compare", .. args, "--out", Path.Combine(_tmp.Path, "cmp")], _out, _err);

    [Fact]
    public void The_iterations_that_rose_are_reported_and_a_tight_rule_fails()
    {
        var (a, b) = WriteReports();

        var code = Run(a, b, "--fail-on", "grid.iterations.mean:5%");

        code.Should().Be(ExitCodes.RuleBroken, _err.ToString());
        _out.ToString().Should().Contain("scene content differs").And.Contain("broken: grid.iterations.mean:5%");
        using var json = JsonDocument.Parse(File.ReadAllText(Path.Combine(_tmp.Path, "cmp", "compare.json")));
        var gridMean = json.RootElement.GetProperty("changes").EnumerateArray()
            .Single(c => c.GetProperty("strategy").GetString() == "grid" && c.GetProperty("metric").GetString() == "iterations.mean");
        // 32 of 128 pixels cost 6 more: the mean rises by 32 * 6 / 128 = 1.5.
        gridMean.GetProperty("change").GetDouble().Should().BeApproximately(1.5, 1e-9);
    }

    [Fact]
    public void A_loose_rule_passes()
    {
        var (a, b) = WriteReports();

        Run(a, b, "--fail-on", "all.iterations.mean:100%", "--quiet").Should().Be(ExitCodes.Ok, _err.ToString());
    }

    [Fact]
    public void Difference_heatmaps_show_the_rise_and_mark_the_changed_hit()
    {
        var (a, b) = WriteReports();

        Run(a, b, "--fail-on", "all.iterations.mean:100%").Should().Be(ExitCodes.Ok, _err.ToString());

        var dir = Path.Combine(_tmp.Path, "cmp");
        var pngs = Directory.GetFiles(dir, "*.png").Select(Path.GetFileName);
        pngs.Should().BeEquivalentTo(["diff-grid-iterations.png", "diff-grid-subgroup32.png", "diff-grid-subgroup64.png",
            "diff-dda-iterations.png", "diff-dda-subgroup32.png", "diff-dda-subgroup64.png"]);
        var image = PngPicture.Read(Path.Combine(dir, "diff-grid-iterations.png")).CropRgb();
        image.Width.Should().Be(16);
        image.Height.Should().Be(8);
        Pixel(image, 0, 0).Should().Equal(Rgb(DivergingRamp.Map(1)), "+6 is the largest rise of the shared scale");
        Pixel(image, 0, 7).Should().Equal(Rgb(DivergingRamp.Map(0)));
        var dda = PngPicture.Read(Path.Combine(dir, "diff-dda-iterations.png")).CropRgb();
        // (15, 0) changed its hit: x + y odd is the light checker square.
        Pixel(dda, 15, 0).Should().Equal(255, 255, 255);
        _out.ToString().Should().Contain("dda: 1 pixels hit a different voxel");
        File.ReadAllText(Path.Combine(dir, "compare.md")).Should().Contain("[diff-dda-iterations.png](diff-dda-iterations.png)");
    }

    [Fact]
    public void Reports_without_per_pixel_data_still_compare_and_say_why_no_images()
    {
        var (a, b) = WriteReports();
        foreach (var f in Directory.GetFiles(b, "pixels-*.bin.gz"))
            File.Delete(f);

        Run(a, b, "--fail-on", "all.iterations.mean:100%").Should().Be(ExitCodes.Ok, _err.ToString());

        Directory.GetFiles(Path.Combine(_tmp.Path, "cmp"), "*.png").Should().BeEmpty();
        _out.ToString().Should().Contain($"no per-pixel data in {b} for grid, dda");
    }

    [Fact]
    public void A_corrupt_pixel_file_exits_2_but_the_tables_are_still_written()
    {
        var (a, b) = WriteReports();
        File.WriteAllBytes(Path.Combine(b, "pixels-dda.bin.gz"), [1, 2, 3]);

        var code = Run(a, b, "--fail-on", "all.iterations.mean:100%");

        code.Should().Be(ExitCodes.BadInput);
        _err.ToString().Should().Contain("pixels-dda.bin.gz");
        File.Exists(Path.Combine(_tmp.Path, "cmp", "compare.md")).Should().BeTrue();
    }

    private static byte[] Pixel(ImageResult img, int x, int y)
    {
        var i = (y * img.Width + x) * 3;
        return img.Data[i..(i + 3)];
    }

    private static byte[] Rgb(SixLabors.ImageSharp.PixelFormats.Rgba32 c) => [c.R, c.G, c.B];
}
