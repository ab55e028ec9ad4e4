using System.Runtime.CompilerServices;
using VoxProf.Core.Memory;
using VoxProf.Core.Rays;
using VoxProf.Core.Strategies;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>
/// The reference strategy: Amanatides &amp; Woo (1987), "A fast voxel traversal algorithm for ray tracing", over the
/// finest voxels, with a full tree lookup at every voxel. Slow on purpose: it defines the correct answer, so it starts
/// every ray at the eye, never where the prepass would let it.
/// </summary>
public struct GridStrategy : IStrategy, IStartsRayRecording
{
    public static string Name => "grid";
    public static string Description => "Amanatides & Woo 3D DDA over the finest voxels, with a tree lookup per voxel";
    public static bool UsesPrepass => false;

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static TCounters Trace<TBranching, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<NodeRef> path, ref PixelHit hit)
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters
    {
        // Count in a local the JIT can keep in registers; the tracer flushes it once per ray.
        TCounters counters = default;
        RayRecording.Start(ref counters);
        if (!RayStart.Clip(view, ray, tMin, ref counters, out RayStart start))
            return counters;
        var dda = DdaState.Start(ray, start.T, start.FaceAxis, start.X, start.Y, start.Z, 0);
        var last = default(LastLookup);

        while (true)
        {
            counters.Iteration();

            // Look the voxel up from the root (counted as such even where the last walk's path is reused)
            byte material = view.LookupAgain<TBranching, TCounters>(dda.X, dda.Y, dda.Z, path, ref last, ref counters);
            if (material != 0)
            {
                dda.SetHit(ref hit, ray, material);
                return counters;
            }

            // Advance to the next voxel; leaving the extent on any axis is a miss
            if (!dda.TryStep(ray, start.TExit))
                return counters;
            counters.CellStep();
            if ((uint)dda.X >= (uint)view.ExtentX || (uint)dda.Y >= (uint)view.ExtentY || (uint)dda.Z >= (uint)view.ExtentZ)
                return counters;
        }
    }
}
