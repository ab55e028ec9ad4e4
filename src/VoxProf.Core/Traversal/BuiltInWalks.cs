using VoxProf.Core.Memory;
using VoxProf.Core.Rays;
using VoxProf.Core.Strategies;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>The stack walk stepping by a Williams et al. slab test of the current cell.</summary>
public struct SlabStrategy : IStrategy, IStartsRayRecording
{
    public static string Name => "slab";
    public static string Description => "stack walk; each step inside a node is a Williams et al. slab test of the current cell";

    public static TCounters Trace<TBranching, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<NodeRef> path, ref PixelHit hit)
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters =>
        StackWalk.Trace<SlabMode, TBranching, TCounters>(view, ray, tMin, path, ref hit);
}

/// <summary>The stack walk stepping by DDA inside a node.</summary>
public struct DdaStrategy : IStrategy, IStartsRayRecording
{
    public static string Name => "dda";
    public static string Description => "stack walk; slab tests between levels, DDA steps inside a node";

    public static TCounters Trace<TBranching, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<NodeRef> path, ref PixelHit hit)
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters =>
        StackWalk.Trace<DdaMode, TBranching, TCounters>(view, ray, tMin, path, ref hit);
}

/// <summary>The stack walk stepping by DDA and culling with directional occupancy masks.</summary>
public struct DdaMaskStrategy : IStrategy, IStartsRayRecording
{
    public static string Name => "dda-mask";
    public static string Description => "dda plus directional occupancy-mask culling";

    public static TCounters Trace<TBranching, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<NodeRef> path, ref PixelHit hit)
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters =>
        StackWalk.Trace<MaskedDdaMode, TBranching, TCounters>(view, ray, tMin, path, ref hit);
}
