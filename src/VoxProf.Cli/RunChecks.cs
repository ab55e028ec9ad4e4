using VoxProf.Core.Limits;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Export;

namespace VoxProf.Cli;

/// <summary>Estimates checked before a slow step starts (docs/scene-format.md, "Limits"): a refusal comes at once, not after an hour.</summary>
internal static class RunChecks
{
    /// <summary>Building the tree: its work and its memory.</summary>
    public static BuildEstimate BeforeBuild(Scene scene, int branching, double maxWork, MemoryLimit memory)
    {
        var build = BuildEstimate.Of(scene, branching);
        build.RequireWork(maxWork);
        MemoryNeed.Require($"building the tree of {scene.SourcePath ?? scene.Name}", build.MemoryParts().ToList(), memory);
        return build;
    }

    /// <summary>A trace: the build, the grid reference's steps when it is traced, and the memory of everything together.</summary>
    public static void BeforeTrace(Scene scene, CameraSpec camera, int branching, int width, int height,
        IReadOnlyList<StrategyDefinition> strategies, IReadOnlyList<string> heatmaps, double maxWork, MemoryLimit memory)
    {
        var build = BuildEstimate.Of(scene, branching);
        build.RequireWork(maxWork);
        if (strategies.Contains(BuiltInStrategies.Grid))
            TraceCost.RequireGridWork(scene, camera, width, height, maxWork);
        var parts = build.MemoryParts()
            .Concat(TraceCost.MemoryParts(width, height, strategies.Count))
            .Concat(ReportMemory.Parts(width, height, strategies.Count, heatmaps.Count))
            .ToList();
        MemoryNeed.Require($"tracing {width}×{height} with {strategies.Count} {(strategies.Count == 1 ? "strategy" : "strategies")}", parts, memory);
    }
}
