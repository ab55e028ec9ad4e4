using System.Runtime.CompilerServices;
using VoxProf.Core.Memory;
using VoxProf.Core.Rays;
using VoxProf.Core.Strategies;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>
/// Hierarchical DDA after Museth (2014), "Hierarchical digital differential analyzer for efficient ray-marching in
/// OpenVDB": one DDA state (cell coordinates at the current level, next-plane times) that changes level in place.
/// Descending refines the cell from the current point; ascending coarsens the coordinates by a shift, which already
/// names the neighbouring coarse cell. No slab test after the volume clip, and no DDA state is saved per level: only
/// the nodes on the path, which a kernel keeps anyway.
/// </summary>
public struct HddaStrategy : IStrategy, IStartsRayRecording
{
    public static string Name => "hdda";
    public static string Description => "Museth's hierarchical DDA: one DDA state that changes level";

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static TCounters Trace<TBranching, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<NodeRef> path, ref PixelHit hit)
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters
    {
        // Count in a local the tracer flushes once per ray, kept in the frame's memory (CountsInMemory).
        TCounters counters = default;
        CountsInMemory.Keep(ref counters);
        if (!RayStart.Clip(view, ray, tMin, ref counters, out RayStart start))
            return counters;
        double tExit = start.TExit;

        // One DDA state at the root's level, and the root's record
        NodeRef node = view.Fetch(0, ref counters);
        // The node's occupancy held in a local while the walk is in it (NodeBits says why)
        var bits = new NodeBits<TBranching>(view, node);
        int depth = 0;
        int rootShift = view.RootShift;
        var dda = DdaState.Start(ray, start.T, start.FaceAxis, start.X >> rootShift, start.Y >> rootShift, start.Z >> rootShift, rootShift);
        // Until its first step the walk is at its start key, where each descent's cell is the start voxel's ancestor
        bool atStart = true;

        while (true)
        {
            counters.Iteration();
            int bit = dda.CellBit<TBranching>();
            if (bits.IsOccupied(view, node, bit))
            {
                if (view.IsSolid<TBranching>(node, bit))
                {
                    dda.SetHit(ref hit, ray, view.SolidMaterial<TBranching>(node, bit));
                    return counters;
                }

                // Descend: refine the cell by the crossing order at the walk's key, keep t
                path[depth++] = node;
                node = view.Fetch(view.Child<TBranching>(node, bit), ref counters);
                bits = new(view, node);
                counters.Descent();
                if (atStart)
                    dda.DescendToStart<TBranching>(ray, start.X, start.Y, start.Z);
                else
                    dda.Descend<TBranching>(ray);
                continue;
            }

            // Advance to the next cell at this level along the smallest t
            atStart = false;
            if (!dda.TryStep<TBranching>(ray, tExit, out bool leftNode))
                return counters;
            counters.CellStep();
            if (!leftNode)
                continue;

            // Ascend while the new cell lies outside the current node: a shift names the neighbouring coarse cell
            do
            {
                if (depth == 0)
                    return counters;
                node = path[--depth];
                counters.Ascent();
                dda.Coarsen<TBranching>();
            }
            while (dda.LeftNode<TBranching>(ray));
            bits = new(view, node);
            dda.Restart(ray);
        }
    }
}
