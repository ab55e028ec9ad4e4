using System.CommandLine;
using VoxProf.Cli;
using VoxProf.Cli.Commands;
using VoxProf.Core.Limits;
using VoxProf.Tests.Compare;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>The command line's side of bad input: one line, exit code 2, nothing half written.</summary>
public sealed class CommandHardeningTests : IDisposable
{
    private static readonly string Samples = Path.Combine(AppContext.BaseDirectory, "samples");
    private static readonly string RingPost = Path.Combine(Samples, "ring-post.vpscene.json");

    private readonly TempDir _tmp = new();
    private readonly StringWriter _out = new();
    private readonly StringWriter _err = new();

    public void Dispose() => _tmp.Dispose();

    private int Run(params string[] args) => VoxProf.Cli.Cli.Run(args, _out, _err);

    private string Error => _err.ToString().TrimEnd('\n');

    private string Trace(string name, params string[] extra)
    {
        string dir = Path.Combine(_tmp.Path, name);
        Run(["trace", RingPost, "--size", "24x16", "--strategy", "dda,grid", "--quiet", "--out", dir, .. extra]).Should().Be(ExitCodes.Ok, Error);
        return dir;
    }

    [Fact]
    public void A_16384_square_trace_is_refused_before_it_starts_when_it_cannot_fit_in_the_memory_available()
    {
        var pipeline = TracePipeline.Default with { AvailableMemory = () => new MemoryLimit(8_000_000_000, "the test's limit") };
        var root = new RootCommand { TraceCommand.Create(_out, _err, pipeline) };
        string dir = Path.Combine(_tmp.Path, "big");

        int code = root.Parse(["trace", RingPost, "--size", "16384x16384", "--strategy", "dda", "--quiet", "--out", dir]).Invoke(new InvocationConfiguration { Output = _out, Error = _err });

        code.Should().Be(ExitCodes.BadInput);
        // The results alone: 16384² pixels × (11 counters × 4 bytes + the hit record); heatmaps and statistics add more.
        double results = 16384.0 * 16384 * TraceCost.BytesPerPixel;
        Error.Should().StartWith("voxprof: error: tracing 16384×16384 with 1 strategy needs about ")
            .And.Contain($"(results of 1 strategy at 16384×16384 ({TraceCost.BytesPerPixel} bytes per pixel each) {MemoryLimit.Format(results)}")
            .And.EndWith("more than the 8.0 GB available (the test's limit); trace a smaller --size or fewer strategies, or simplify the scene");
        Directory.Exists(dir).Should().BeFalse("nothing is written for a refused run");
    }

    [Fact]
    public void An_empty_out_path_for_trace_exits_2_with_one_line_before_the_scene_is_read()
    {
        Run("trace", "no-such-scene.json", "--out", "").Should().Be(ExitCodes.BadInput);

        Error.Should().Be("voxprof: error: --out: empty; expected an output folder path");
    }

    [Fact]
    public void Several_parser_errors_share_one_line_and_name_no_dotnet_types()
    {
        Run("trace", RingPost, "--bogus", "--prepass", "x").Should().Be(ExitCodes.BadInput);

        Error.Should().Be("voxprof: error: Unrecognized command or argument '--bogus'; Cannot parse argument 'x' for option '--prepass'; expected a whole number up to 2147483647");
    }

    [Fact]
    public void A_newline_in_a_path_is_escaped_so_the_message_stays_one_line()
    {
        string path = Path.Combine(_tmp.Path, "two\nlines.vpscene.json");

        Run("inspect", path).Should().Be(ExitCodes.BadInput);

        Error.Should().NotContain("\n").And.Contain("two\\nlines.vpscene.json: $: scene file not found");
    }

    [Fact]
    public void Inspect_of_a_missing_scene_prints_the_documented_message()
    {
        string path = Path.Combine(_tmp.Path, "gone.vpscene.json");

        Run("inspect", path).Should().Be(ExitCodes.BadInput);

        Error.Should().Be($"voxprof: error: {path}: $: scene file not found: {path}");
    }

    [Fact]
    public void A_folder_given_as_the_scene_is_called_a_folder()
    {
        Run("trace", _tmp.Path, "--quiet").Should().Be(ExitCodes.BadInput);

        Error.Should().Be($"voxprof: error: {_tmp.Path}: $: scene file {_tmp.Path} is a folder; expected a file");
    }

    [Fact]
    public void A_refused_estimate_tells_how_to_raise_the_limit_and_the_limit_can_be_raised()
    {
        Run("inspect", RingPost, "--max-work", "1000").Should().Be(ExitCodes.BadInput);
        Error.Should().StartWith($"voxprof: error: {RingPost}: $.layers[0]: building the tree takes about 99,328 voxel evaluations")
            .And.EndWith("over the work limit of 1,000; raise the limit with --max-work if the run should go ahead");

        _err.GetStringBuilder().Clear();
        Run("inspect", RingPost, "--max-work", "1e6").Should().Be(ExitCodes.Ok, Error);
    }

    [Theory]
    [InlineData("0")]
    [InlineData("-3")]
    [InlineData("NaN")]
    [InlineData("lots")]
    public void A_max_work_that_is_not_a_positive_number_is_refused(string value)
    {
        Run("inspect", RingPost, "--max-work", value).Should().Be(ExitCodes.BadInput);

        Error.Should().Be($"voxprof: error: --max-work: '{value}' is not valid, expected a positive number of voxel evaluations such as 2e10");
    }

    [Fact]
    public void Confine_files_refuses_a_scene_naming_a_file_outside_its_folder()
    {
        string folder = Path.Combine(_tmp.Path, "pr");
        Directory.CreateDirectory(folder);
        string scene = Path.Combine(folder, "pr.vpscene.json");
        File.WriteAllText(scene, File.ReadAllText(RingPost).Replace("\"ring-post.raw\"", $"\"{Path.Combine(Samples, "ring-post.raw")}\"", StringComparison.Ordinal));

        Run("inspect", scene).Should().Be(ExitCodes.Ok, "without the switch any readable file may be named");
        Run("inspect", scene, "--confine-files").Should().Be(ExitCodes.BadInput);

        Error.Should().Contain("$.layers[1].file: ").And.Contain("outside the scene file's folder").And.EndWith("files are confined to that folder");
    }

    [Fact]
    public void Compare_refuses_a_folder_whose_pixel_file_is_not_the_one_its_run_wrote()
    {
        // Same view, different trees: the per-pixel counts differ, so b's file in a's folder is a mix of runs.
        string a = Trace("a");
        string b = Trace("b", "--branching", "2");
        string c = Trace("c");
        File.Copy(Path.Combine(b, "pixels-dda.bin.gz"), Path.Combine(a, "pixels-dda.bin.gz"), overwrite: true);

        Run("compare", c, a, "--out", Path.Combine(_tmp.Path, "cmp")).Should().Be(ExitCodes.BadInput);

        Error.Should().StartWith($"voxprof: error: difference heatmaps: {Path.Combine(a, "pixels-dda.bin.gz")}: differs from what manifest.json lists for run ")
            .And.EndWith("the folder mixes files of different runs, trace again");
    }

    [Fact]
    public void Compare_refuses_a_report_json_that_is_not_the_one_the_manifest_lists()
    {
        string a = Trace("a");
        string b = Trace("b", "--counters", "iterations");
        File.Copy(Path.Combine(b, "report.json"), Path.Combine(a, "report.json"), overwrite: true);

        Run("compare", a, b, "--out", Path.Combine(_tmp.Path, "cmp")).Should().Be(ExitCodes.BadInput);

        Error.Should().StartWith($"voxprof: error: {Path.Combine(a, "report.json")}: differs from what manifest.json lists for run ");
    }

    [Fact]
    public void A_second_trace_into_a_folder_removes_the_heatmaps_of_strategies_it_did_not_trace()
    {
        string dir = Trace("r");
        Run("trace", RingPost, "--size", "24x16", "--strategy", "hdda", "--quiet", "--out", dir).Should().Be(ExitCodes.Ok);

        Directory.GetFiles(dir, "*dda*").Select(Path.GetFileName).Should().OnlyContain(f => f!.Contains("hdda"), "no file of the earlier run stays beside the new one");
    }
}
