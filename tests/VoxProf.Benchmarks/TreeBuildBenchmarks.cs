using BenchmarkDotNet.Attributes;
using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;

namespace VoxProf.Benchmarks;

/// <summary>
/// Tree build time for the demo scene and the 8192×1024×8192 terrain, with N = 2 and N = 4.
/// Run: dotnet run -c Release --project tests/VoxProf.Benchmarks -- --filter '*TreeBuild*'
/// (For peak memory, the `build` mode of the quick harness runs one build per process.)
/// </summary>
[MemoryDiagnoser]
[SimpleJob(launchCount: 1, warmupCount: 1, iterationCount: 3)]
public class TreeBuildBenchmarks
{
    private Scene _scene = null!;

    [Params(2, 4)]
    public int Branching { get; set; }

    [Params("samples/stonebrook-quarry.vpscene.json", "tests/VoxProf.Benchmarks/scenes/wide-terrain.vpscene.json")]
    public string Scene { get; set; } = "";

    [GlobalSetup]
    public void Setup() => _scene = SceneLoader.Load(SampleScenes.FromRepository(Scene));

    [Benchmark]
    public long Build() => TreeBuilder.Build(_scene, Branching).Stats.TotalBytes;
}
