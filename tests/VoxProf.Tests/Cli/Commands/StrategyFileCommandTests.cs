using System.Text.Json;
using System.Text.RegularExpressions;
using VoxProf.Cli;
using VoxProf.Reports.Pixels;
using VoxProf.Tests.Strategies;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>trace --strategy-file end to end: the real compiler, tracer and writers on the small ring-post scene.</summary>
public sealed class StrategyFileCommandTests : IDisposable
{
    private readonly string _dir = Path.Combine(Path.GetTempPath(), $"voxprof-sfile-{Guid.NewGuid():N}");
    private readonly StringWriter _out = new(), _err = new();
    private static readonly string Samples = Path.Combine(AppContext.BaseDirectory, "samples");
    private static readonly string Scene = Path.Combine(Samples, "ring-post.vpscene.json");

    public StrategyFileCommandTests() => Directory.CreateDirectory(_dir);

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private int Run(params string[] args) => VoxProf.Cli.Cli.Run(args, _out, _err);

    [Fact]
    public void A_compile_error_exits_2_with_one_compiler_line_per_error_and_no_trace()
    {
        string file = Path.Combine(_dir, "walk.cs");
        File.WriteAllText(file, "public struct Walk\n{\n    int x = ;\n    void F() { y = 1; }\n}\n");
        int code = Run("trace", Scene, "--strategy-file", file, "--size", "16x8", "--out", Path.Combine(_dir, "out"), "--quiet");
        code.Should().Be(ExitCodes.BadInput);
        string[] lines = _err.ToString().TrimEnd('\n').Split('\n');
        lines[..^1].Should().HaveCountGreaterThanOrEqualTo(2)
            .And.OnlyContain(l => Regex.IsMatch(l, $@"^{Regex.Escape(file)}\(\d+,\d+\): error CS\d{{4}}: \S"));
        lines[..^1].Should().Contain(l => l.StartsWith($"{file}(3,13): error CS1525"));
        lines[^1].Should().Be($"voxprof: error: {file}: {lines.Length - 1} compile errors");
        Directory.Exists(Path.Combine(_dir, "out")).Should().BeFalse("nothing is traced or written");
    }

    [Fact]
    public void A_strategy_that_throws_while_tracing_exits_2_naming_its_file_and_pixels_and_writes_nothing()
    {
        string file = Path.Combine(_dir, "throws.cs");
        File.WriteAllText(file, StrategySource.Of("Throws", "throws", "        view.Fetch(view.Nodes.Length + 5, ref counters);"));
        string outDir = Path.Combine(_dir, "out");
        int code = Run("trace", Scene, "--strategy-file", file, "--strategy", "throws", "--size", "40x20", "--out", outDir, "--quiet");
        code.Should().Be(ExitCodes.BadInput, "the fault is in the user's strategy, not in VoxProf");
        _err.ToString().Should().MatchRegex($@"^voxprof: error: {Regex.Escape(file)}: strategy 'throws' failed while tracing the pixels \(0, 0\) to \(15, 15\): IndexOutOfRangeException: node index \d+ is outside the tree's \d+ node records\n$");
        Directory.Exists(outDir).Should().BeFalse("nothing is written for a failed trace");
    }

    [Fact]
    public void A_strategy_files_own_counters_reach_every_report_like_built_in_ones()
    {
        string box = Path.Combine(Samples, "strategies", "box-skip.cs");
        string outDir = Path.Combine(_dir, "out");
        int code = Run("trace", Scene, "--strategy-file", box, "--strategy", "grid,hdda,box-skip", "--counters", "iterations,box-skips",
            "--size", "32x24", "--out", outDir, "--quiet", "--per-pixel", "--threads", "2");
        code.Should().Be(ExitCodes.Ok, _err.ToString());

        // report.json: the metrics of the strategy's counters, valued for it alone; 0 mismatches against grid.
        using var json = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "report.json")));
        var root = json.RootElement;
        root.GetProperty("metrics").EnumerateArray().Select(m => m.GetProperty("name").GetString())
            .Should().Contain(["box-skips.total", "box-tests.p90"]);
        var strategies = root.GetProperty("strategies").EnumerateArray().ToDictionary(s => s.GetProperty("name").GetString()!);
        var boxValues = strategies["box-skip"].GetProperty("values");
        boxValues.GetProperty("box-tests.total").GetDouble().Should().BeGreaterThan(0);
        boxValues.GetProperty("mismatch").GetDouble().Should().Be(0);
        strategies["hdda"].GetProperty("values").TryGetProperty("box-skips.total", out _).Should().BeFalse();

        // summary.csv has the columns; the pixel files hold the counters per pixel, equal to the totals.
        File.ReadAllText(Path.Combine(outDir, "summary.csv")).Should().Contain("box-skips.total");
        PixelData pixels = PixelDataFile.Read(Path.Combine(outDir, "pixels-box-skip.bin.gz"));
        pixels.Find("box-tests")!.Sum(v => (long)v).Should().Be((long)boxValues.GetProperty("box-tests.total").GetDouble());
        File.ReadLines(Path.Combine(outDir, "pixels-box-skip.csv")).First().Should().EndWith(",box-tests,box-skips");

        // The heatmap of a strategy's own counter is drawn for that strategy only.
        File.Exists(Path.Combine(outDir, "heatmap-box-skip-box-skips.png")).Should().BeTrue();
        File.Exists(Path.Combine(outDir, "heatmap-hdda-box-skips.png")).Should().BeFalse();
        File.Exists(Path.Combine(outDir, "heatmap-hdda-iterations.png")).Should().BeTrue();

        // compare gates on the strategy's own counter like on any other.
        Run("trace", Scene, "--strategy-file", box, "--strategy", "grid,box-skip", "--size", "32x24", "--out", Path.Combine(_dir, "again"),
            "--quiet", "--threads", "2").Should().Be(ExitCodes.Ok, _err.ToString());
        Run("compare", outDir, Path.Combine(_dir, "again"), "--out", Path.Combine(_dir, "cmp"), "--fail-on", "box-skip.box-skips.total:0%")
            .Should().Be(ExitCodes.Ok, _err.ToString() + _out.ToString());
        _out.ToString().Should().Contain("box-skips.total");
    }

    [Fact]
    public void A_strategy_named_like_a_built_in_one_is_refused_with_exit_2()
    {
        string file = Path.Combine(_dir, "clash.cs");
        File.WriteAllText(file, File.ReadAllText(Path.Combine(Samples, "strategies", "hdda-again.cs")).Replace("\"hdda-again\"", "\"hdda\""));
        Run("trace", Scene, "--strategy-file", file, "--size", "16x8", "--out", Path.Combine(_dir, "out"), "--quiet").Should().Be(ExitCodes.BadInput);
        _err.ToString().Should().Be($"voxprof: error: {file}: strategy name 'hdda' is already a built-in strategy's name; choose another\n");
    }
}
