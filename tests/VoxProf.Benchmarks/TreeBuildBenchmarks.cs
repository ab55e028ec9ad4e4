using BenchmarkDotNet.Attributes;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;

namespace VoxProf.Benchmarks;

/// <summary>
/// Tree build time for a large rolling terrain with a carved tunnel and a floating ball.
/// Run: dotnet run -c Release --project tests/VoxProf.Benchmarks -- --filter *TreeBuild*
/// </summary>
[MemoryDiagnoser]
[SimpleJob(launchCount: 1, warmupCount: 1, iterationCount: 3)]
public class TreeBuildBenchmarks
{
    private Scene _scene = null!;

    [Params(2, 4)]
    public int Branching { get; set; }

    [Params(2048, 8192)]
    public int Side { get; set; }

    [GlobalSetup]
    public void Setup()
    {
        int height = Side / 8;
        var extent = new Box3i(0, 0, 0, Side, height, Side);
        _scene = new Scene(Side, height, Side,
        [
            new RollingTerrainLayer(1, extent, height * 0.4, height * 0.15, Side / 5.0, seed: 17),
            new SlabLayer(LayerOp.Carve, new Box3i(0, height / 5, Side / 2 - 12, Side, height / 5 + 20, Side / 2 + 12), extent),
            new SlabLayer(LayerOp.Add, new Box3i(Side / 3, height * 3 / 4, Side / 3, Side / 3 + 64, height * 3 / 4 + 16, Side / 3 + 64), extent),
        ], []);
    }

    [Benchmark]
    public long Build() => TreeBuilder.Build(_scene, Branching).Stats.TotalBytes;

    /// <summary>An exact box layer, for the carved tunnel and a floating platform.</summary>
    private sealed class SlabLayer(LayerOp op, Box3i box, Box3i extent) : Layer(op, 2, box.Intersect(extent))
    {
        public override string Kind => "slab";

        public override Coverage Classify(in Box3i region) =>
            !Bounds.Intersects(region) ? Coverage.None : Bounds.ContainsBox(region) ? Coverage.Full : Coverage.Partial;

        public override bool Contains(int x, int y, int z) => Bounds.Contains(x, y, z);
    }
}
