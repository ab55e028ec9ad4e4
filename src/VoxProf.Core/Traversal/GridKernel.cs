using VoxProf.Core.Rays;

namespace VoxProf.Core.Traversal;

/// <summary>
/// The reference strategy: Amanatides &amp; Woo (1987), "A fast voxel traversal algorithm for ray tracing", over the
/// finest voxels, with a full tree lookup at every voxel. Slow on purpose: it defines the correct answer.
/// </summary>
public static class GridKernel
{
    public static void Trace<TCounters>(in TreeView view, in RaySetup ray, double tMin, ref TCounters counterSink, ref PixelHit hit)
        where TCounters : struct, ICostCounters
    {
        // Count in a local the JIT can keep in registers, and hand the counts over once at the end.
        TCounters counters = default;
        hit = default;
        if (!RayStart.Clip(view, ray, tMin, ref counters, out RayStart start))
            goto Done;

        var walk = DdaWalk.Start(ray, start.T, start.X, start.Y, start.Z, 1.0);
        walk.LastAxis = start.FaceAxis;

        while (true)
        {
            counters.Iteration();

            // Look the voxel up from the root
            byte material = view.Lookup(walk.X, walk.Y, walk.Z, ref counters);
            if (material != 0)
            {
                RayStart.SetHit(ref hit, ray, walk.X, walk.Y, walk.Z, 0, walk.T, walk.LastAxis, material);
                goto Done;
            }

            // Advance to the next voxel; leaving the extent on any axis is a miss
            if (!walk.TryStep(start.TExit))
                goto Done;
            counters.CellStep();
            if ((uint)walk.X >= (uint)view.ExtentX || (uint)walk.Y >= (uint)view.ExtentY || (uint)walk.Z >= (uint)view.ExtentZ)
                goto Done;
        }

    Done:
        counterSink = counters;
    }
}
