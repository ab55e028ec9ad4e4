using VoxProf.Cli;
using VoxProf.Reports.Pixels;
using VoxProf.Tests.Strategies;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>trace --pixel: one ray through each strategy, printed; the strategy's own code runs for that ray alone.</summary>
public sealed class PixelProbeTests : IDisposable
{
    private readonly SampleRun _run = new("pixel");

    public void Dispose() => _run.Dispose();

    [Fact]
    public void The_ray_hits_and_counts_printed_are_the_whole_traces_and_a_strategy_file_runs_once_writing_nothing()
    {
        // The strategy appends a line per ray it traces: the probe must run it once.
        string calls = _run.In("calls.txt");
        string file = _run.In("counting.cs");
        File.WriteAllText(file, StrategySource.Of("Counting", "counting",
            $"        System.IO.File.AppendAllText(@\"{calls}\", \"ray\\n\");\n        counters = HddaStrategy.Trace<TBranching, TCounters>(view, ray, tMin, path, ref hit);"));
        string whole = _run.In("whole");
        _run.Run("trace", SampleRun.Scene, "-s", "grid,dda", "--size", "48x32", "--quiet", "--no-html", "--out", whole).Should().Be(ExitCodes.Ok, _run.Err.ToString());
        File.Delete(calls);
        _run.Out.GetStringBuilder().Clear();
        // The oracle: the whole trace's pixel files, at the middle pixel of those whose ray hits the post.
        PixelData grid = PixelDataFile.Read(Path.Combine(whole, "pixels-grid.bin.gz"));
        PixelData dda = PixelDataFile.Read(Path.Combine(whole, "pixels-dda.bin.gz"));
        int[] hitting = [.. Enumerable.Range(0, grid.Hits.Length).Where(p => grid.Hits[p].Hit)];
        hitting.Should().NotBeEmpty();
        int at = hitting[hitting.Length / 2];
        (int x, int y) = (at % 48, at / 48);

        int code = _run.Run("trace", SampleRun.Scene, "--strategy-file", file, "-s", "grid,dda,counting", "--size", "48x32", "--pixel", $"{x},{y}", "--out", _run.In("none"));

        code.Should().Be(ExitCodes.Ok, _run.Err.ToString());
        File.ReadAllLines(calls).Should().Equal(["ray"], "one ray, one strategy run");
        Directory.Exists(_run.In("none")).Should().BeFalse("a probe writes nothing");
        string[] lines = _run.Out.ToString().TrimEnd('\n').Split('\n');
        lines[0].Should().Be($"pixel ({x}, {y}) of 48×32, ring-post / front");
        lines[1].Should().StartWith("ray from (32, 20, 1) along (");
        var rows = lines.Skip(3).Select(l => l.Split(' ', StringSplitOptions.RemoveEmptyEntries)).ToArray();
        rows[0].Should().Equal("grid", "dda", "counting");
        string[] Row(string label) => rows.Single(r => r[0] == label)[1..];
        Row("iterations").Should().Equal(grid.Find("iterations")![at].ToString(), dda.Find("iterations")![at].ToString(), dda.Find("iterations")![at].ToString());
        Row("node-fetches").Should().Equal(grid.Find("node-fetches")![at].ToString(), dda.Find("node-fetches")![at].ToString(), dda.Find("node-fetches")![at].ToString());
        Row("cache-lines").Should().Equal(grid.Find("cache-lines")![at].ToString(), dda.Find("cache-lines")![at].ToString(), dda.Find("cache-lines")![at].ToString());
        string.Join(" ", Row("hit")).Should().Be(string.Join(" ", Enumerable.Repeat($"({grid.Hits[at].X}, {grid.Hits[at].Y}, {grid.Hits[at].Z})", 3)));
        rows.Single(r => r[0] == "same")[^3..].Should().Equal("yes", "yes", "yes");
    }

    [Theory]
    [InlineData("48,3", "--pixel: '48,3' is not valid, expected X,Y inside the 48×32 image (0,0 to 47,31)")]
    [InlineData("-1,3", "--pixel: '-1,3' is not valid, expected X,Y inside the 48×32 image (0,0 to 47,31)")]
    [InlineData("7", "--pixel: '7' is not valid, expected X,Y inside the 48×32 image (0,0 to 47,31)")]
    public void A_pixel_outside_the_image_is_refused_before_the_scene_is_read(string pixel, string message)
    {
        _run.Run("trace", "no-such-scene.json", "--size", "48x32", "--pixel", pixel).Should().Be(ExitCodes.BadInput);
        _run.Err.ToString().Should().Be($"voxprof: error: {message}\n");
    }

    [Fact]
    public void A_pixel_of_several_views_is_refused()
    {
        _run.Run("trace", SampleRun.Scene, "--camera", "all", "--size", "48x32", "--pixel", "1,1").Should().Be(ExitCodes.BadInput);
        _run.Err.ToString().Should().Be("voxprof: error: --pixel: follows one ray of one view; give one camera and no --shard\n");
    }
}
