using BenchmarkDotNet.Attributes;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Benchmarks;

/// <summary>
/// Traces the demo scene's cameras at 1280×720 with each strategy, with counting on and compiled out.
/// Run: dotnet run -c Release --project tests/VoxProf.Benchmarks -- --filter '*TraceBenchmarks*'
/// Set VOXPROF_SCENE to trace another scene file.
/// </summary>
[MemoryDiagnoser]
[SimpleJob(launchCount: 1, warmupCount: 1, iterationCount: 5)]
public class TraceBenchmarks
{
    private Scene _scene = null!;
    private BrickTree _tree = null!;

    [ParamsSource(nameof(Strategies))]
    public string Strategy { get; set; } = "dda-mask";

    [Params(0, 1)]
    public int CameraIndex { get; set; }

    public static IEnumerable<string> Strategies => BuiltInStrategies.All.Where(s => s != VoxProf.Core.Strategies.BuiltInStrategies.Grid).Select(s => s.Name);

    [GlobalSetup]
    public void Setup()
    {
        string? path = Environment.GetEnvironmentVariable("VOXPROF_SCENE");
        _scene = path is null ? SampleScenes.Demo() : SceneLoader.Load(path);
        _tree = TreeBuilder.Build(_scene, 4);
    }

    private TraceRequest Request(bool count)
    {
        new StrategyCatalog().TryParse(Strategy, out StrategyDefinition s);
        CameraSpec cam = _scene.Cameras[Math.Min(CameraIndex, _scene.Cameras.Count - 1)];
        return new TraceRequest(_scene, _tree, cam, 1280, 720, [s], CountWork: count);
    }

    [Benchmark(Baseline = true)]
    public TraceRun Counting() => Tracer.Run(Request(true));

    [Benchmark]
    public TraceRun Uncounted() => Tracer.Run(Request(false));
}

/// <summary>Finds scene files relative to the repository root, wherever the benchmark runs from.</summary>
public static class SampleScenes
{
    public static Scene Demo() => SceneLoader.Load(FromRepository("samples/stonebrook-quarry.vpscene.json"));

    public static string FromRepository(string relativePath)
    {
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir != null; dir = dir.Parent)
        {
            string candidate = Path.Combine(dir.FullName, relativePath);
            if (File.Exists(candidate))
                return candidate;
        }
        throw new FileNotFoundException($"{relativePath}: not found above {AppContext.BaseDirectory}");
    }
}
