using System.Numerics;
using FluentAssertions;
using VoxProf.Core.Geometry;
using VoxProf.Core.Memory;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using Xunit;

namespace VoxProf.Tests.Memory;

/// <summary>
/// Recording a tile's reads through the counters' own pointer, across the recorder's buffer growing; and the reads the
/// tracer records with the model on, held to those the same kernels make when traced one ray at a time with a counter
/// of the test's own that keeps every node index.
/// </summary>
public sealed class ReadRecordingTests
{
    [Fact]
    public void Every_read_lands_in_its_pixel_in_order_even_when_the_buffer_grows_mid_ray()
    {
        var reads = new TileReads();
        reads.Begin(0, 0, 4, 1);
        // 3,000 reads a pixel: the 4,096-read buffer fills during the second ray and again during the fourth.
        int[][] expected = [.. Enumerable.Range(0, 4).Select(p => Enumerable.Range(0, p == 2 ? 0 : 3000).Select(i => p * 100_000 + i * 7 % 1000).ToArray())];
        var tile = new uint[CounterNames.Count * TileCounts.Slots];
        TileReads.Attach(reads);
        try
        {
            for (int p = 0; p < expected.Length; p++)
            {
                MemoryCounts<CostCounts, TestedRoom> counts = default;
                foreach (int node in expected[p])
                    counts.NodeFetch(node);
                counts.Flush(tile, p, reads);
                tile[TileCounts.Index((int)Counter.NodeFetches, p)].Should().Be((uint)expected[p].Length);
            }
        }
        finally
        {
            TileReads.Attach(null);
        }
        reads.Pixels.Should().Be(4);
        reads.Count.Should().Be(9000);
        for (int p = 0; p < expected.Length; p++)
            reads.Of(p).ToArray().Should().Equal(expected[p], $"pixel {p}");
        reads.All.ToArray().Should().Equal(expected.SelectMany(e => e));
    }

    [Fact]
    public void A_second_tile_starts_from_an_empty_recorder()
    {
        var reads = new TileReads();
        TileReads.Attach(reads);
        try
        {
            var tile = new uint[CounterNames.Count * TileCounts.Slots];
            foreach (int first in new[] { 10, 20 })
            {
                reads.Begin(0, 0, 1, 1);
                MemoryCounts<CostCounts, TestedRoom> counts = default;
                counts.NodeFetch(first);
                counts.NodeFetch(first + 1);
                counts.Flush(tile, 0, reads);
                reads.All.ToArray().Should().Equal(first, first + 1);
            }
        }
        finally
        {
            TileReads.Attach(null);
        }
    }

    private static readonly CameraSpec Camera = new("c", new Vector3(1, 12, 1), new Vector3(63, 0, 63), Vector3.UnitY, 60);

    /// <summary>Every counter a no-op but the node reads, kept in order.</summary>
    private struct ReadList : ICostCounters
    {
        [ThreadStatic]
        public static List<int>? Reads;

        public readonly void Iteration() { }
        public readonly void CellStep() { }
        public readonly void SlabTest() { }
        public readonly void Descent() { }
        public readonly void Ascent() { }
        public readonly void NodeFetch(int nodeIndex) => Reads!.Add(nodeIndex);
        public readonly void MaskCulled(int cells) { }
        public readonly void MaskSkipped() { }
        public readonly void Extra(int index, uint amount) { }
    }

    private static List<int> ReadsOf<TStrategy>(BrickTree tree, Camera camera, int x, int y) where TStrategy : struct, IStrategy
    {
        ReadList.Reads = [];
        var view = new TreeView(tree);
        var hit = default(PixelHit);
        Span<NodeRef> path = stackalloc NodeRef[view.Depth + 1];
        TStrategy.Trace<Branching4, ReadList>(view, camera.Ray(x, y), 0, path, ref hit);
        return ReadList.Reads;
    }

    private static Scene Floor()
    {
        var extent = new Box3i(0, 0, 0, 64, 64, 64);
        return new Scene(64, 64, 64, [new BoxLayer(LayerOp.Add, 1, new Box3i(0, 0, 0, 64, 3, 64), extent),
            new SphereLayer(LayerOp.Add, 2, 40, 10, 30, 8, extent)], [], "floor");
    }

    /// <summary>grid's kernel as a strategy of the test's own, unmarked, so recorded as a strategy file's reads are.</summary>
    private struct GridAsFile : IStrategy
    {
        public static string Name => "grid-as-file";
        public static string Description => "grid's kernel, recorded with a room test at every read";
        public static bool UsesPrepass => false;

        public static TCounters Trace<TBranching, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<NodeRef> path, ref PixelHit hit)
            where TBranching : struct, IBranching
            where TCounters : struct, ICostCounters =>
            GridStrategy.Trace<TBranching, TCounters>(view, ray, tMin, path, ref hit);
    }

    [Fact]
    public void A_built_in_kernel_and_a_files_kernel_record_the_same_reads_though_one_is_traced_again_as_the_buffer_grows()
    {
        // Built-in grid records with no room test (a ray that fills the buffer is traced again into a larger one); the
        // same kernel as an unmarked strategy records with a room test at every read, growing the buffer under the ray.
        Scene scene = Floor();
        BrickTree tree = TreeBuilder.Build(scene, 4, threads: 1);
        StrategyDefinition asFile = StrategyDefinition.Of<GridAsFile>();
        BuiltInStrategies.Grid.StartsRayRecording.Should().BeTrue();
        asFile.StartsRayRecording.Should().BeFalse();
        TraceRun run = Tracer.Run(new TraceRequest(scene, tree, Camera, 36, 20, [BuiltInStrategies.Grid, asFile],
            Threads: 2, Memory: MemorySettings.Default));
        StrategyResult builtIn = run.Results[0], file = run.Results[1];
        for (int c = 0; c < CounterNames.Count; c++)
            file.Counters[c].Should().Equal(builtIn.Counters[c], CounterNames.All[c].Name());
        file.Counters[(int)Counter.CacheLines].Should().Contain(n => n > 0);
        (file.Memory!.Accesses, file.Memory.Hits).Should().Be((builtIn.Memory!.Accesses, builtIn.Memory.Hits));
        for (int g = 0; g < builtIn.Memory.Groups.Count; g++)
            file.Memory.Groups[g].Lines.Should().Equal(builtIn.Memory.Groups[g].Lines);
        file.Hits.Should().Equal(builtIn.Hits);
    }

    [Fact]
    public void Each_pixels_cache_lines_are_the_distinct_lines_of_the_reads_its_kernel_makes()
    {
        // Grid's rays read hundreds of nodes each here, so a 16×16 tile fills the recorder's first buffer of 4,096
        // reads in the middle of a ray: the ray is traced again into a larger buffer, and every read must land once,
        // in order.
        Scene scene = Floor();
        BrickTree tree = TreeBuilder.Build(scene, 4, threads: 1);
        const int W = 36, H = 20;
        TraceRun run = Tracer.Run(new TraceRequest(scene, tree, Camera, W, H, [BuiltInStrategies.Grid, BuiltInStrategies.DdaMask],
            Threads: 2, Memory: MemorySettings.Default));
        var camera = new Camera(Camera, W, H);
        var layout = NodeLayout.For(4);
        int shift = MemorySettings.Default.LineShift;
        long gridReads = 0;
        foreach (StrategyResult r in run.Results)
        {
            uint[] lines = r.Counters[(int)Counter.CacheLines], fetches = r.Counters[(int)Counter.NodeFetches];
            for (int y = 0; y < H; y++)
            {
                for (int x = 0; x < W; x++)
                {
                    List<int> reads = r.Strategy.Name == "grid" ? ReadsOf<GridStrategy>(tree, camera, x, y) : ReadsOf<DdaMaskStrategy>(tree, camera, x, y);
                    int distinct = reads.SelectMany(n => Enumerable.Range(layout.FirstLine(n, shift), layout.LastLine(n, shift) - layout.FirstLine(n, shift) + 1))
                        .Distinct().Count();
                    lines[y * W + x].Should().Be((uint)distinct, $"{r.Strategy.Name} pixel ({x}, {y})");
                    fetches[y * W + x].Should().Be((uint)reads.Count, $"{r.Strategy.Name} pixel ({x}, {y})");
                    if (r.Strategy.Name == "grid")
                        gridReads += reads.Count;
                }
            }
        }
        (gridReads / (W * H)).Should().BeGreaterThan(4096 / 256, "a tile's reads should overrun the first buffer");

        // The whole model (the replay's accesses and hits, the groups' lines) from the test's own reads, fed tile by
        // tile in the tracer's order: a ray recorded twice, or a read lost when the buffer grew, would change them.
        foreach (StrategyResult r in run.Results)
        {
            int[][] reads = [.. Enumerable.Range(0, W * H).Select(p => (r.Strategy.Name == "grid"
                ? ReadsOf<GridStrategy>(tree, camera, p % W, p / W) : ReadsOf<DdaMaskStrategy>(tree, camera, p % W, p / W)).ToArray())];
            (MemoryResult expected, uint[] cacheLines) = FrameMemoryTests.Model(new FrameMemoryTests.Frame(W, H, reads), MemorySettings.Default);
            MemoryResult got = r.Memory!;
            (got.Accesses, got.Hits).Should().Be((expected.Accesses, expected.Hits), r.Strategy.Name);
            for (int g = 0; g < expected.Groups.Count; g++)
                got.Groups[g].Lines.Should().Equal(expected.Groups[g].Lines, $"{r.Strategy.Name} {expected.Groups[g].Shape.Name}");
            r.Counters[(int)Counter.CacheLines].Should().Equal(cacheLines, r.Strategy.Name);
        }
    }
}
