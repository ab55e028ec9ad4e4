using System.Numerics;
using FluentAssertions;
using VoxProf.Core.Memory;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Statistics;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Tests.Trees;
using Xunit;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// Counters a trace cannot make non-zero (the prepass's without the prepass, the cache lines without the memory model)
/// share one buffer of zeros, and the totals over them are the counter itself: the same values with less memory.
/// </summary>
public sealed class ResultBufferTests
{
    private static readonly CameraSpec Camera = new("c", new Vector3(-10, 60, -30), new Vector3(24, 12, 24), Vector3.UnitY, 60);
    private static readonly Counter[] Unproduced = [Counter.PrepassIterations, Counter.PrepassNodeFetches, Counter.PrepassSkip, Counter.CacheLines];

    [Fact]
    public void Without_the_prepass_and_the_memory_model_their_counters_share_one_zero_buffer_and_the_totals_are_the_counters()
    {
        Scene scene = TestScenes.Random(5, 40);
        BrickTree tree = TreeBuilder.Build(scene, 4, threads: 1);
        TraceRun run = Tracer.Run(new TraceRequest(scene, tree, Camera, 40, 24, BuiltInStrategies.All, Threads: 2));

        uint[] zeros = run.Results[0].Counters[(int)Counter.CacheLines];
        zeros.Should().OnlyContain(v => v == 0);
        foreach (StrategyResult r in run.Results)
        {
            foreach (Counter c in Unproduced)
                r.Counters[(int)c].Should().BeSameAs(zeros, $"{r.Strategy.Name} cannot make {c} non-zero");
            foreach (Counter c in new[] { Counter.Iterations, Counter.NodeFetches, Counter.SlabTests })
                r.Counters[(int)c].Should().NotBeSameAs(zeros).And.Contain(v => v > 0, $"{r.Strategy.Name} counts {c}");
            Measures.TotalIterations.Values(r).Should().BeSameAs(r.Counters[(int)Counter.Iterations]);
            Measures.TotalNodeFetches.Values(r).Should().BeSameAs(r.Counters[(int)Counter.NodeFetches]);
        }
    }

    [Fact]
    public void The_counters_a_built_in_strategy_declares_it_never_counts_are_zero_on_every_ray_and_share_the_zero_buffer()
    {
        Scene scene = TestScenes.Random(5, 40);
        BrickTree tree = TreeBuilder.Build(scene, 4, threads: 1);
        // The memory model on: the shared zeros are then not the cache lines' buffer, so sharing is the declaration's.
        TraceRun run = Tracer.Run(new TraceRequest(scene, tree, Camera, 40, 24, BuiltInStrategies.All, Threads: 2,
            Memory: MemorySettings.Default));
        uint[] zeros = run.Results[0].Counters[(int)Counter.PrepassSkip];
        var camera = new Camera(Camera, 40, 24);
        var view = new TreeView(tree);
        BuiltInStrategies.All.Sum(d => d.NeverCounts.Count).Should().Be(4 + 2 * 3, "grid never descends, ascends or culls; slab, dda and hdda never cull");
        foreach (StrategyResult r in run.Results)
        {
            foreach (Counter c in r.Strategy.NeverCounts)
                r.Counters[(int)c].Should().BeSameAs(zeros, $"{r.Strategy.Name} declares it never counts {c}");
            // The declaration held to the kernel itself, ray by ray, with counters of its own.
            for (int p = 0; p < 40 * 24; p++)
            {
                CostCounts counts = KernelCounts(r.Strategy.Name, view, camera.Ray(p % 40, p / 40));
                var tile = new uint[CounterNames.Count * TileCounts.Slots];
                counts.Flush(tile, 0, null);
                foreach (Counter c in r.Strategy.NeverCounts)
                    tile[TileCounts.Index((int)c, 0)].Should().Be(0u, $"{r.Strategy.Name} pixel {p} {c}");
                tile[TileCounts.Index((int)Counter.Iterations, 0)].Should().Be(r.Counters[(int)Counter.Iterations][p]);
            }
        }
        run.Results.Single(r => r.Strategy.Name == "dda-mask").Counters[(int)Counter.MaskCulledCells].Should().NotBeSameAs(zeros)
            .And.Contain(v => v > 0);
    }

    private static CostCounts KernelCounts(string strategy, in TreeView view, in RaySetup ray)
    {
        Span<NodeRef> path = stackalloc NodeRef[view.Depth + 1];
        var hit = default(PixelHit);
        return strategy switch
        {
            "grid" => GridStrategy.Trace<Branching4, CostCounts>(view, ray, 0, path, ref hit),
            "slab" => SlabStrategy.Trace<Branching4, CostCounts>(view, ray, 0, path, ref hit),
            "dda" => DdaStrategy.Trace<Branching4, CostCounts>(view, ray, 0, path, ref hit),
            "dda-mask" => DdaMaskStrategy.Trace<Branching4, CostCounts>(view, ray, 0, path, ref hit),
            _ => HddaStrategy.Trace<Branching4, CostCounts>(view, ray, 0, path, ref hit),
        };
    }

    [Fact]
    public void With_the_prepass_and_the_memory_model_each_strategy_has_its_own_buffers_and_the_totals_add_up()
    {
        Scene scene = TestScenes.Random(5, 40);
        BrickTree tree = TreeBuilder.Build(scene, 4, threads: 1);
        TraceRun run = Tracer.Run(new TraceRequest(scene, tree, Camera, 40, 24, [BuiltInStrategies.Grid, BuiltInStrategies.Dda],
            PrepassBlock: 4, Threads: 2, Memory: new MemorySettings(128, 8192, 2)));

        StrategyResult grid = run.Results[0], dda = run.Results[1];
        dda.Counters[(int)Counter.PrepassIterations].Should().Contain(v => v > 0, "dda uses the prepass");
        dda.Counters[(int)Counter.CacheLines].Should().Contain(v => v > 0).And.NotBeSameAs(grid.Counters[(int)Counter.CacheLines]);
        // grid never uses the prepass: its prepass counters are the shared zeros even in a run that has one.
        grid.Counters[(int)Counter.PrepassIterations].Should().OnlyContain(v => v == 0)
            .And.BeSameAs(grid.Counters[(int)Counter.PrepassSkip]);

        uint[] total = Measures.TotalIterations.Values(dda);
        uint[] own = dda.Counters[(int)Counter.Iterations], share = dda.Counters[(int)Counter.PrepassIterations];
        for (int p = 0; p < total.Length; p++)
            total[p].Should().Be(own[p] + share[p], $"pixel {p}");
    }
}
