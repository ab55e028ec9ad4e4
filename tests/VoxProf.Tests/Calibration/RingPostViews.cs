using VoxProf.Core.Scenes;
using VoxProf.Core.Statistics;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Calibration;

/// <summary>
/// Real traces of a small sample scene to calibrate against: ring-post's three cameras, every strategy, with and
/// without the prepass at 48×32 and without it at 32×24 (two sizes, so the per-pixel cost is not just a constant).
/// Traced once per test class that takes it as a fixture.
/// </summary>
public sealed class RingPostViews
{
    public const int Width = 48;
    public const int Height = 32;

    public RingPostViews()
    {
        Scene = SceneLoader.Load(Path.Combine(AppContext.BaseDirectory, "samples", "ring-post.vpscene.json"));
        BrickTree tree = TreeBuilder.Build(Scene, 4, 2);
        var runs = new List<TraceRun>();
        foreach (CameraSpec camera in Scene.Cameras)
        {
            foreach (int prepass in new[] { 0, 4 })
                runs.Add(Tracer.Run(new TraceRequest(Scene, tree, camera, Width, Height, BuiltInStrategies.All, prepass, 2)));
            runs.Add(Tracer.Run(new TraceRequest(Scene, tree, camera, 32, 24, BuiltInStrategies.All, 0, 2)));
        }
        Runs = runs;
        Statistics = runs.SelectMany(StrategyStatistics.Compute).ToArray();
    }

    public Scene Scene { get; }

    public IReadOnlyList<TraceRun> Runs { get; }

    /// <summary>Every strategy of every run: 3 cameras × 3 runs × 5 strategies.</summary>
    public IReadOnlyList<StrategyStatistics> Statistics { get; }
}
