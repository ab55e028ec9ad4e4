using VoxProf.Core.Memory;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// grid walks from the root only when a voxel leaves the cell its last walk ended in, and counts (and records) the
/// reused path's reads as a walk would. Held here to grid as Amanatides &amp; Woo define it with a lookup from the root
/// at every voxel (the kernel as it stood before): every counter, every hit, and the memory model's results, which
/// depend on the order of the reads, must be the same.
/// </summary>
public class GridLookupTests
{
    /// <summary>grid with <see cref="TreeView.Lookup"/> from the root at every voxel.</summary>
    private struct GridFromRoot : IStrategy
    {
        public static string Name => "grid-from-root";
        public static string Description => "grid, walking from the root at every voxel";
        public static bool UsesPrepass => false;

        public static TCounters Trace<TBranching, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<NodeRef> path, ref PixelHit hit)
            where TBranching : struct, IBranching
            where TCounters : struct, ICostCounters
        {
            TCounters counters = default;
            if (!RayStart.Clip(view, ray, tMin, ref counters, out RayStart start))
                return counters;
            var dda = DdaState.Start(ray, start.T, start.FaceAxis, start.X, start.Y, start.Z, 0);
            while (true)
            {
                counters.Iteration();
                byte material = view.Lookup<TBranching, TCounters>(dda.X, dda.Y, dda.Z, ref counters);
                if (material != 0)
                {
                    dda.SetHit(ref hit, ray, material);
                    return counters;
                }
                if (!dda.TryStep(ray, start.TExit))
                    return counters;
                counters.CellStep();
                if ((uint)dda.X >= (uint)view.ExtentX || (uint)dda.Y >= (uint)view.ExtentY || (uint)dda.Z >= (uint)view.ExtentZ)
                    return counters;
            }
        }
    }

    [Theory]
    [InlineData(2, true)]
    [InlineData(4, true)]
    [InlineData(8, true)]
    // The memory model off: the counters without a recorder take their own short way through a reused path.
    [InlineData(2, false)]
    [InlineData(4, false)]
    public void Grid_counts_and_reads_as_a_walk_from_the_root_at_every_voxel(int branching, bool memory)
    {
        StrategyDefinition fromRoot = StrategyDefinition.Of<GridFromRoot>();
        for (int seed = 1; seed <= 3; seed++)
        {
            const int size = 48;
            BrickTree tree = DenseTree.Build(size, size - 7, size + 5, KernelAgreementTests.RandomBlobs(seed, size, 10), branching);
            Scene scene = DenseTree.SceneOf(size, size - 7, size + 5);
            var rng = new Random(seed * 31 + branching);
            for (int c = 0; c < 3; c++)
            {
                CameraSpec cam = KernelAgreementTests.RandomCamera(rng, size, inside: c == 0);
                TraceRun run = Tracer.Run(new TraceRequest(scene, tree, cam, 36, 24, [BuiltInStrategies.Grid, fromRoot],
                    Threads: 2, Memory: memory ? MemorySettings.Default : null));
                StrategyResult grid = run.Results[0], reference = run.Results[1];
                string where = $"branching {branching}, seed {seed}, camera {c}";
                for (int k = 0; k < CounterNames.Count; k++)
                    grid.Counters[k].Should().Equal(reference.Counters[k], $"{CounterNames.All[k].Name()}, {where}");
                grid.Hits.Should().Equal(reference.Hits, where);
                if (memory)
                {
                    (grid.Memory!.Accesses, grid.Memory.Hits).Should().Be((reference.Memory!.Accesses, reference.Memory.Hits), where);
                    for (int g = 0; g < grid.Memory.Groups.Count; g++)
                        grid.Memory.Groups[g].Lines.Should().Equal(reference.Memory.Groups[g].Lines, where);
                }
                grid.Counters[(int)Counter.NodeFetches].Sum(v => (long)v).Should().BeGreaterThan(
                    grid.Counters[(int)Counter.Iterations].Sum(v => (long)v), "lookups read more than one node on average: paths are reused");
            }
        }
    }
}
