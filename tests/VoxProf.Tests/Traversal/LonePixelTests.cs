using System.Numerics;
using VoxProf.Core.Memory;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Tests.Trees;

namespace VoxProf.Tests.Traversal;

/// <summary>A pixel traced alone (trace --pixel) counts and hits exactly as it does in the whole image's trace.</summary>
public sealed class LonePixelTests
{
    /// <summary>From outside the scene's corner towards its middle, so most rays cross it.</summary>
    private static CameraSpec Facing(Scene scene) => new("c", new Vector3(-0.5f * scene.ExtentX, 1.5f * scene.ExtentY, -0.5f * scene.ExtentZ),
        new Vector3(scene.ExtentX / 2f, scene.ExtentY / 2f, scene.ExtentZ / 2f), Vector3.UnitY, 60);

    [Fact]
    public void Every_counter_and_the_hit_of_a_lone_pixel_equal_the_whole_trace_there_and_nothing_else_is_traced()
    {
        // The prepass's per-block shares and the memory model's per-ray lines included; pixels that start no block.
        Scene scene = TestScenes.Random(11, 48);
        BrickTree tree = TreeBuilder.Build(scene, 4, threads: 1);
        var request = new TraceRequest(scene, tree, Facing(scene), 50, 34, BuiltInStrategies.All, PrepassBlock: 4, Threads: 2,
            Memory: new MemorySettings(128, 8192, 2));
        TraceRun whole = Tracer.Run(request);
        int[] crossing = [.. Enumerable.Range(0, 50 * 34).Where(p => whole.Reference!.Counters[(int)Counter.Iterations][p] > 0)];
        crossing.Length.Should().BeGreaterThan(100, "most rays cross the scene");
        int[] pixels = [crossing[0], crossing[crossing.Length / 2] | 1, crossing[^1], 0];

        foreach (int at in pixels)
        {
            TraceRun lone = Tracer.Run(request with { Pixel = (at % 50, at / 50) });
            for (int s = 0; s < whole.Results.Count; s++)
            {
                StrategyResult w = whole.Results[s], l = lone.Results[s];
                l.Hits[at].Should().Be(w.Hits[at], $"{w.Strategy.Name} pixel {at}");
                for (int c = 0; c < w.Counters.Length; c++)
                {
                    l.Counters[c][at].Should().Be(w.Counters[c][at], $"{w.Strategy.Name} {w.CounterNames[c]} pixel {at}");
                    l.Counters[c].Where((_, p) => p != at).Should().OnlyContain(v => v == 0, "only the pixel is traced");
                }
                l.Hits.Where((_, p) => p != at).Should().OnlyContain(h => !h.Hit);
            }
        }
    }

    [Fact]
    public void A_pixel_outside_the_image_or_with_a_share_of_tiles_is_refused()
    {
        Scene scene = TestScenes.Random(3, 16);
        BrickTree tree = TreeBuilder.Build(scene, 4, threads: 1);
        var request = new TraceRequest(scene, tree, Facing(scene), 20, 10, [BuiltInStrategies.Dda]);
        FluentActions.Invoking(() => Tracer.Run(request with { Pixel = (20, 0) })).Should().Throw<ArgumentOutOfRangeException>();
        FluentActions.Invoking(() => Tracer.Run(request with { Pixel = (0, 0), Tiles = new TileShare(1, 2) })).Should().Throw<ArgumentOutOfRangeException>();
    }
}
