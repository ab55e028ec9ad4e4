using System.CommandLine;
using VoxProf.Cli;
using VoxProf.Cli.Commands;
using VoxProf.Core;
using VoxProf.Core.Traversal;
using VoxProf.Tests.Strategies;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>trace --tile-limit: a strategy whose loop never ends is reported, and the run ends, instead of hanging.</summary>
public sealed class TileLimitTests : IDisposable
{
    private readonly SampleRun _run = new("hang");

    public void Dispose() => _run.Dispose();

    [Theory]
    [InlineData("front")]
    [InlineData("all")]
    public void A_strategy_stuck_in_one_tile_is_named_with_its_file_and_pixels_the_run_exits_2_and_the_output_folder_keeps_what_it_held(string cameras)
    {
        // The strategy waits for a file only the test's exit creates: stuck as a loop that never ends would be, but
        // released once the command has given up, so the test process keeps no spinning thread.
        string release = _run.In("release");
        string file = _run.In("stuck.cs");
        File.WriteAllText(file, StrategySource.Of("Stuck", "stuck",
            $"        while (!System.IO.File.Exists(@\"{release}\")) System.Threading.Thread.Sleep(5);"));
        string outDir = _run.In("out");
        Directory.CreateDirectory(outDir);
        int? exitCode = null;
        var pipeline = TracePipeline.Default with
        {
            // On a real run the process ends here; the test stops the command after its trace instead.
            Exit = code =>
            {
                exitCode = code;
                File.WriteAllText(release, "");
            },
            Trace = (request, progress) =>
            {
                _ = Tracer.Run(request, progress);
                throw new InputException(exitCode is null ? "the trace ended without a stall" : "stopped by the test");
            },
        };
        var root = new RootCommand { TraceCommand.Create(_run.Out, _run.Err, pipeline) };

        int code = root.Parse(["trace", SampleRun.Scene, "--strategy-file", file, "--strategy", "dda,stuck", "--size", "40x20", "--threads", "1", "--camera", cameras,
            "--tile-limit", "0.2", "--quiet", "--out", outDir]).Invoke(new InvocationConfiguration { Output = _run.Out, Error = _run.Err });

        exitCode.Should().Be(ExitCodes.BadInput, "the hang is in the user's strategy, not in VoxProf");
        string[] lines = _run.Err.ToString().TrimEnd('\n').Split('\n');
        lines[0].Should().MatchRegex($@"^voxprof: error: {System.Text.RegularExpressions.Regex.Escape(file)}: strategy 'stuck' has traced the pixels \(0, 0\) to \(15, 15\) for \d+(\.\d)? s without finishing; does every step of its loop advance the ray\? \(--tile-limit SECONDS allows slower tiles, 0 turns this check off\)$");
        lines[1].Should().Be("voxprof: error: stopped by the test");
        code.Should().Be(ExitCodes.BadInput);
        Directory.EnumerateFileSystemEntries(outDir).Should().BeEmpty("the folder is left as it was");
        Directory.EnumerateDirectories(_run.Dir).Should().Equal([outDir], "the run's hidden stage folder is thrown away");
    }

    [Theory]
    [InlineData("-1")]
    [InlineData("abc")]
    [InlineData("NaN")]
    public void A_tile_limit_that_is_not_seconds_is_refused_before_the_scene_is_read(string value)
    {
        int code = _run.Run("trace", "no-such-scene.json", "--tile-limit", value);

        code.Should().Be(ExitCodes.BadInput);
        _run.Err.ToString().Should().Be($"voxprof: error: --tile-limit: '{value}' is not valid, expected seconds from 0 (no check) to 1000000, such as 30 or 2.5\n");
    }

    [Fact]
    public void A_tile_limit_of_0_turns_the_check_off_and_a_stall_of_a_built_in_strategy_is_an_internal_error()
    {
        var limit = new TileLimit();
        var command = new Command("t");
        limit.AddTo(command);
        limit.Watch(command.Parse(["--tile-limit", "0"])).Should().BeNull();
        limit.Watch(command.Parse(["--tile-limit", "2.5"]))!.Limit.Should().Be(TimeSpan.FromSeconds(2.5));
        limit.Watch(command.Parse([]))!.Limit.Should().Be(TimeSpan.FromSeconds(TileLimit.DefaultSeconds));

        var (line, code) = TileLimit.Report(new TileStall(VoxProf.Core.Strategies.BuiltInStrategies.Hdda, 16, 0, 31, 15, TimeSpan.FromSeconds(31)));
        line.Should().Be("voxprof: internal error: strategy 'hdda' has traced the pixels (16, 0) to (31, 15) for 31 s without finishing");
        code.Should().Be(ExitCodes.InternalError);
    }
}
