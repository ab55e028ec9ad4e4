using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>How a trace was run. <see cref="PrepassBlock"/> is 0 when the coarse prepass is off.</summary>
public sealed record TraceSettings(int Width, int Height, int Branching, int PrepassBlock, int Threads);

/// <summary>One trace of one camera with several strategies: the single input of every report writer.</summary>
public sealed class TraceRun
{
    public TraceRun(Scene scene, CameraSpec camera, TraceSettings settings, TreeStats tree, IReadOnlyList<StrategyResult> results)
    {
        Scene = scene;
        Camera = camera;
        Settings = settings;
        Tree = tree;
        Results = results;
    }

    public Scene Scene { get; }
    public CameraSpec Camera { get; }
    public TraceSettings Settings { get; }
    public TreeStats Tree { get; }
    public IReadOnlyList<StrategyResult> Results { get; }

    /// <summary>The grid result when it was traced: the reference for hit mismatches.</summary>
    public StrategyResult? Reference => Results.FirstOrDefault(r => r.Strategy == BuiltInStrategies.Grid);
}
