using System.Text.RegularExpressions;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;

namespace VoxProf.Tests.Strategies;

/// <summary>A strategy file's code that throws while tracing is the user's fault, reported as such, and the same way on any thread count.</summary>
public sealed class StrategyFaultTests : IDisposable
{
    private readonly string _dir = Path.Combine(Path.GetTempPath(), $"voxprof-fault-{Guid.NewGuid():N}");

    public StrategyFaultTests() => Directory.CreateDirectory(_dir);

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void A_strategy_that_throws_names_its_file_strategy_and_the_first_failing_tiles_pixels_whatever_the_threads()
    {
        // Throws for the rays leaning toward +x only; with two threads several tiles fail at once, in either order.
        string path = Path.Combine(_dir, "throws.cs");
        File.WriteAllText(path, StrategySource.Of("Throws", "throws", "        if (ray.Dx > 0.2)\n            throw new InvalidOperationException(\"probe ran off its list\");"));
        StrategyDefinition throws = StrategyFiles.Compile(path).Single();
        CameraSpec cam = DemoTrees.Scene.Cameras[0];
        string? first = null;
        foreach (int threads in new[] { 1, 2 })
        {
            var request = new TraceRequest(DemoTrees.Scene, DemoTrees.Tree(4), cam, 96, 40, [throws], Threads: threads);
            var fault = FluentActions.Invoking(() => Tracer.Run(request)).Should().Throw<StrategyFault>().Which;
            fault.Message.Should().MatchRegex($@"^{Regex.Escape(path)}: strategy 'throws' failed while tracing the pixels \(\d+, \d+\) to \(\d+, \d+\): InvalidOperationException: probe ran off its list$");
            first ??= fault.Message;
            fault.Message.Should().Be(first, $"{threads} threads report the same tile");
        }
    }
}
