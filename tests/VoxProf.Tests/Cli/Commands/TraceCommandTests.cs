using System.CommandLine;
using VoxProf.Cli;
using VoxProf.Cli.Commands;
using VoxProf.Core.Memory;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Tests.Reports;

namespace VoxProf.Tests.Cli.Commands;

public sealed class TraceCommandTests : IDisposable
{
    private readonly string _dir = Path.Combine(Path.GetTempPath(), $"voxprof-cli-{Guid.NewGuid():N}");
    private readonly List<TraceRequest> _requests = [];
    private bool _sceneLoaded;

    public void Dispose()
    {
        if (Directory.Exists(_dir))
            Directory.Delete(_dir, recursive: true);
    }

    /// <summary>Stands in for scene loading, tree building and tracing with hand-made results.</summary>
    private TracePipeline Fake(bool terminal = false) => new(
        (_, _) =>
        {
            _sceneLoaded = true;
            return TestRuns.Small().Scene;
        },
        (_, branching, _) => new BrickTree(branching, 1, 4, 4, 4, new Node[1], [], TestRuns.Small().Tree),
        (request, progress) =>
        {
            _requests.Add(request);
            progress?.Report(request.Height * request.Strategies.Count);
            var results = request.Strategies.Select((s, i) =>
                TestRuns.Result(s, request.Width, request.Height, (x, y) => (uint)(x + y + 1 + i), hitShift: i == 1, elapsedMs: 5)).ToList();
            return new TraceRun(request.Scene, request.Camera,
                new TraceSettings(request.Width, request.Height, request.Tree.Branching, request.PrepassBlock, 2), TestRuns.Small().Tree, results);
        },
        () => terminal);

    private (int Code, string Out, string Err) Run(string args, bool terminal = false)
    {
        var output = new StringWriter();
        var error = new StringWriter();
        var root = new RootCommand { TraceCommand.Create(output, error, Fake(terminal)) };
        var parse = root.Parse(args);
        int code = parse.Invoke(new InvocationConfiguration { Output = output, Error = error });
        return (code, output.ToString(), error.ToString());
    }

    [Theory]
    [InlineData("--size 0x720", "--size: '0x720' is not a valid size")]
    [InlineData("--size 20000x10", "--size: '20000x10' is not a valid size")]
    [InlineData("--size wide", "--size: 'wide' is not a valid size")]
    [InlineData("--strategy dda,zigzag", "--strategy: unknown strategy 'zigzag'; expected one of: grid, slab, dda, dda-mask, hdda")]
    [InlineData("--counters iterations,steps", "--counters: unknown counter 'steps'; expected one of: iterations,")]
    [InlineData("--prepass 3", "--prepass: 3 is not valid, expected 2, 4 or 8")]
    [InlineData("--branching 16", "--branching: 16 is not valid, expected 2, 4 or 8")]
    [InlineData("--scale cubic", "--scale: 'cubic' is not valid, expected one of: linear, log")]
    [InlineData("--range 9:1", "--range: '9:1' is not a valid range")]
    [InlineData("--baseline hdda --strategy grid,dda", "--baseline: hdda is not among the traced strategies")]
    [InlineData("--eye 1,2,3", "--target: missing")]
    [InlineData("--fov 0.5", "--fov: 0.5 is not valid, expected a vertical field of view from 1 to 179 degrees")]
    [InlineData("--fov 179.5", "--fov: 179.5 is not valid, expected a vertical field of view from 1 to 179 degrees")]
    [InlineData("--memory maybe", "--memory: 'maybe' is not valid, expected one of: on, off")]
    [InlineData("--memory off --cache-kib 32", "--cache-kib: sets the memory model's cache, which --memory off turns off")]
    [InlineData("--memory off --counters iterations,lines-per-group32", "--counters: lines-per-group32 comes from the memory model, which --memory off turns off")]
    [InlineData("--cache-line 96", "--cache-line: 96 is not valid, expected 64 or 128 (bytes)")]
    [InlineData("--cache-ways 0", "--cache-ways: 0 is not valid, expected 1 to 64")]
    [InlineData("--cache-kib 1 --cache-ways 16 --cache-line 128", "--cache-kib: 1 KiB with 16 ways of 128-byte lines: cache size: 1024 bytes is not valid, expected a whole number of sets")]
    public void Bad_options_exit_2_with_one_line_before_the_scene_is_read(string options, string message)
    {
        ExpectOneLineBadInput($"trace scene.json {options}", message);
        _sceneLoaded.Should().BeFalse();
    }

    private void ExpectOneLineBadInput(string args, string message)
    {
        var (code, output, error) = Run(args);

        code.Should().Be(ExitCodes.BadInput);
        error.Should().StartWith("voxprof: error: " + message);
        error.TrimEnd('\n').Should().NotContain("\n", "one line");
        output.Should().BeEmpty();
    }

    [Fact]
    public void Library_parse_errors_also_exit_2_through_the_command_line_entry_point()
    {
        var output = new StringWriter();
        var error = new StringWriter();
        VoxProf.Cli.Cli.Run(["trace", "scene.json", "--threads", "many"], output, error).Should().Be(ExitCodes.BadInput);
        error.ToString().Should().Contain("many");
    }

    [Fact]
    public void An_out_path_that_is_a_file_is_one_clear_error()
    {
        Directory.CreateDirectory(_dir);
        string file = Path.Combine(_dir, "report");
        File.WriteAllText(file, "keep");

        var (code, _, error) = Run($"trace scene.json --out {file}");

        code.Should().Be(ExitCodes.BadInput);
        error.Should().Be($"voxprof: error: {file}: is a file, expected an output directory\n");
        File.ReadAllText(file).Should().Be("keep");
    }

    [Fact]
    public void A_trace_prints_a_table_and_the_directory_and_writes_the_reports()
    {
        var (code, output, error) = Run($"trace scene.json --size 32x16 --strategy grid,dda --out {_dir} --quiet");

        code.Should().Be(ExitCodes.Ok, error);
        error.Should().BeEmpty();
        string[] lines = output.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        lines[0].Should().Contain("total-iterations.").And.Contain("subgroup32.");
        lines[1].Should().StartWith("strategy").And.Contain("tile-max-mean").And.Contain("simd-efficiency");
        lines[2].Should().StartWith("grid");
        lines[3].Should().StartWith("dda");
        lines[^1].Should().StartWith("wrote ").And.EndWith(_dir);
        File.Exists(Path.Combine(_dir, "report.json")).Should().BeTrue();
        File.Exists(Path.Combine(_dir, "heatmap-dda-subgroup64.png")).Should().BeTrue();
        _requests.Should().ContainSingle().Which.Width.Should().Be(32);
        _requests[0].Camera.Name.Should().Be("gate", "the scene's first camera is the default");
    }

    [Fact]
    public void The_memory_model_is_on_at_its_defaults_unless_turned_off_and_the_cache_options_reach_the_trace()
    {
        Run($"trace scene.json --size 8x4 --out {_dir}/a --quiet").Code.Should().Be(ExitCodes.Ok);
        Run($"trace scene.json --size 8x4 --out {_dir}/b --quiet --cache-line 128 --cache-kib 32 --cache-ways 8").Code.Should().Be(ExitCodes.Ok);
        Run($"trace scene.json --size 8x4 --out {_dir}/c --quiet --memory off").Code.Should().Be(ExitCodes.Ok);
        _requests.Select(r => r.Memory).Should().Equal(MemorySettings.Default, new MemorySettings(128, 32 * 1024, 8), null);
    }

    [Fact]
    public void Progress_goes_to_stderr_only_on_a_terminal_and_not_when_quiet()
    {
        string progress = Run($"trace scene.json --size 16x8 --strategy grid,dda --out {_dir}", terminal: true).Err;
        progress.Should().Contain("building the tree of yard").And.Contain("tracing dda (2/2): 8/8 rows")
            .And.Contain("writing heatmaps").And.Contain("writing report.html");
        Run($"trace scene.json --size 16x8 --strategy grid --out {_dir}", terminal: false).Err.Should().BeEmpty();
        Run($"trace scene.json --size 16x8 --strategy grid --out {_dir} --quiet", terminal: true).Err.Should().BeEmpty();
    }

    [Fact]
    public void A_custom_camera_replaces_the_scene_camera_and_an_unknown_name_lists_the_cameras()
    {
        Run($"trace scene.json --size 16x8 --strategy grid --out {_dir} --eye 1,2,3 --target 4,5,6 --fov 35").Code.Should().Be(0);
        _requests[0].Camera.Should().Be(new CameraSpec("custom", new(1, 2, 3), new(4, 5, 6), System.Numerics.Vector3.UnitY, 35));

        var (code, _, error) = Run($"trace scene.json --camera tower --out {_dir}");
        code.Should().Be(ExitCodes.BadInput);
        error.Should().Be("voxprof: error: --camera: no camera or path 'tower' in /scenes/yard.json; expected one of: gate, a frame such as NAME#000, or all\n");
    }

    // The reproducer (looking straight down with the default up) and its relatives: each camera would give
    // NaN rays or an undefined image orientation, and must stop before tracing with one line naming the option.
    [Theory]
    [InlineData("--eye 32,60,32 --target 32,0,32", "--target 32,0,32: the camera looks along the default up direction (0, 1, 0)")]
    [InlineData("--eye 32,60,32 --target 32,0,32 --up 0,-1,0", "--up 0,-1,0: lies along the view direction")]
    [InlineData("--eye 32,60,32 --target 32,0,32 --up 0,1,0", "--up 0,1,0: lies along the view direction")]
    [InlineData("--eye 0,20,0 --target 32,20,32 --up 1e-30,1e-30,0", "--up 1e-30,1e-30,0: has length 1.41E-30, which single precision cannot turn into a camera basis")]
    [InlineData("--eye 0,0,0 --target 1e-30,0,0", "--target 1e-30,0,0: lies 1E-30 voxels from the eye")]
    [InlineData("--eye 5,5,5 --target 5,5,5", "--target 5,5,5: equals the eye")]
    [InlineData("--up 30.5,-12,62", "--up 30.5,-12,62: lies along the view direction")]
    [InlineData("--up 0,0,0", "--up 0,0,0: zero vector")]
    public void A_command_line_camera_gets_the_scene_file_checks_and_exits_2_before_tracing(string options, string message)
    {
        ExpectOneLineBadInput($"trace scene.json --out {_dir} {options}", message);
        _requests.Should().BeEmpty("nothing is traced with a broken camera");
    }

    [Fact]
    public void An_up_option_that_breaks_a_scene_camera_names_that_camera()
    {
        var (_, _, error) = Run($"trace scene.json --out {_dir} --up 30.5,-12,62");

        error.TrimEnd('\n').Should().EndWith("(camera 'gate' of /scenes/yard.json)");
    }

    [Fact]
    public void Short_options_do_what_their_long_names_do()
    {
        var (code, _, error) = Run($"trace scene.json --size 16x8 -s grid,dda -c gate -b grid -q -o {_dir}");

        code.Should().Be(ExitCodes.Ok, error);
        _requests.Single().Strategies.Should().Equal(BuiltInStrategies.Grid, BuiltInStrategies.Dda);
        File.ReadAllText(Path.Combine(_dir, "summary.md")).Should().Contain("| grid (baseline) |");
    }

    [Fact]
    public void No_pixels_and_no_html_skip_those_files_and_report_json_keeps_the_command_line()
    {
        var (code, _, error) = Run($"trace scene.json --size 16x8 --strategy grid --no-pixels --no-html --out {_dir}");

        code.Should().Be(ExitCodes.Ok, error);
        Directory.GetFiles(_dir).Select(Path.GetFileName).Should().NotContain(n => n!.StartsWith("pixels-") || n == "report.html")
            .And.Contain("report.json");
        string json = File.ReadAllText(Path.Combine(_dir, "report.json"));
        json.Should().Contain("\"pixelData\": false");
        using var doc = System.Text.Json.JsonDocument.Parse(json);
        doc.RootElement.GetProperty("commandLine").EnumerateArray().Select(e => e.GetString()).Should()
            .Equal("trace", "scene.json", "--size", "16x8", "--strategy", "grid", "--no-pixels", "--no-html");
    }

    [Fact]
    public void A_link_base_turns_summary_links_absolute_and_a_relative_one_is_refused()
    {
        Run($"trace scene.json --size 16x8 --strategy dda --out {_dir} --link-base https://ci.example.org/run-7/").Code.Should().Be(0);
        File.ReadAllText(Path.Combine(_dir, "summary.md")).Should().Contain("(https://ci.example.org/run-7/heatmap-dda-iterations.png)");

        ExpectOneLineBadInput($"trace scene.json --out {_dir} --link-base run-7/", "--link-base: 'run-7/' is not an absolute http or https URL");
    }
}
