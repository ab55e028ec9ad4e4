using System.Runtime.CompilerServices;
using VoxProf.Core.Rays;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>
/// Compile-time switches of <see cref="StackWalk"/>: the JIT specialises the walk per struct mode, so the unused
/// branches vanish and slab, dda and dda-mask share one loop.
/// </summary>
public interface IWalkMode
{
    /// <summary>Step inside a node with DDA (true) or with a slab test of the current cell (false).</summary>
    static abstract bool StepsWithDda { get; }

    /// <summary>Cull with the directional occupancy masks.</summary>
    static abstract bool CullsWithMask { get; }
}

/// <summary>
/// The stack walk behind the slab, dda and dda-mask strategies. Between levels it restarts with a Williams et al. slab
/// test of the child's box; inside a node it steps by slab tests of the current cell or by Amanatides &amp; Woo DDA,
/// optionally culling with directional occupancy masks. Each iteration visits one cell at some level; the path holds
/// the nodes above the current one. Counter definitions: docs/counters.md.
/// </summary>
public static class StackWalk
{
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static TCounters Trace<TMode, TBranching, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<NodeRef> path, ref PixelHit hit)
        where TMode : struct, IWalkMode
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters
    {
        // The walk reads the mask table unchecked (TreeView.ReachInTable), which is only safe at the tree's own
        // branching; a strategy file calling this walk with another one gets an error instead of a stray read.
        if (TBranching.Log2N != view.Log2N)
            ThrowBranchingMismatch(view.Log2N, TBranching.Log2N);
        // Count in a local the tracer flushes once per ray, kept in the frame's memory (CountsInMemory).
        TCounters counters = default;
        CountsInMemory.Keep(ref counters);
        if (!RayStart.Clip(view, ray, tMin, ref counters, out RayStart start))
            return counters;
        double tExit = start.TExit;

        // Enter the root at the start point. The current cell's bit is carried from the step that reached it to the
        // iteration that tests it, so a masked step computes it once, not twice.
        NodeRef node = view.Fetch(0, ref counters);
        // The node's occupancy held in a local while the walk is in it (NodeBits says why)
        var bits = new NodeBits<TBranching>(view, node);
        int sp = 0;
        int rootShift = view.RootShift;
        var dda = DdaState.Start(ray, start.T, start.FaceAxis, start.X >> rootShift, start.Y >> rootShift, start.Z >> rootShift, rootShift);
        int bit = dda.CellBit<TBranching>();
        if (TMode.CullsWithMask && !MaskAdmits(view, node, bits, ray.Octant, bit, ref counters, countCulled: true))
            return counters;
        // Until its first step the walk is at its start key, where each descent's cell is the start voxel's ancestor
        bool atStart = true;

        while (true)
        {
            counters.Iteration();
            // Whether the walk leaves the node through a face (else the mask left nothing reachable in it)
            bool leftNode;
            if (bits.IsOccupied(view, node, bit))
            {
                // Solid cell: the hit voxel is where the ray enters the cell
                if (view.IsSolid<TBranching>(node, bit))
                {
                    dda.SetHit(ref hit, ray, view.SolidMaterial<TBranching>(node, bit));
                    return counters;
                }

                // Descend: save this level, fetch the child and restart in its box. The modelled algorithm clips the
                // ray to the child's box with a slab test (counted); that box is the cell the walk is in, so its entry
                // planes are behind the walk and the test's near time is the walk's own t: nothing to compute.
                path[sp++] = node;
                node = view.Fetch(view.Child<TBranching>(node, bit), ref counters);
                bits = new(view, node);
                counters.Descent();
                counters.SlabTest();
                if (atStart)
                    dda.DescendToStart<TBranching>(ray, start.X, start.Y, start.Z);
                else
                    dda.Descend<TBranching>(ray);
                bit = dda.CellBit<TBranching>();
                if (!TMode.CullsWithMask || MaskAdmits(view, node, bits, ray.Octant, bit, ref counters, countCulled: true))
                    continue;
                leftNode = false;
            }
            else
            {
                // Advance to the next cell of this node
                atStart = false;
                if (TMode.StepsWithDda)
                {
                    if (!dda.TryStep<TBranching>(ray, tExit, out leftNode))
                        return counters;
                }
                else
                {
                    if (!SlabStep(ray, ref dda, tExit, ref counters))
                        return counters;
                    leftNode = dda.LeftNode<TBranching>(ray);
                }
                counters.CellStep();
                if (!leftNode)
                {
                    bit = dda.CellBit<TBranching>();
                    if (!TMode.CullsWithMask || MaskAdmits(view, node, bits, ray.Octant, bit, ref counters, countCulled: false))
                        continue;
                }
            }

            // Ascend until some ancestor has a next cell to visit, stepping each parent past the cell just left
            atStart = false;
            while (true)
            {
                if (sp == 0)
                    return counters;
                node = path[--sp];
                bits = new(view, node);
                counters.Ascent();
                dda.Coarsen<TBranching>();
                if (TMode.CullsWithMask && !leftNode)
                {
                    // The mask emptied the node while the walk was inside it: step the parent's DDA.
                    dda.Restart(ray);
                    if (!dda.TryStep(ray, tExit))
                        return counters;
                }
                // Otherwise the cell just left lies outside its node, so its coordinates shifted to the parent's level
                // already name the parent's next cell along the same axis, at the same plane crossing: the step the
                // parent takes, with no new slab test or DDA step to compute.
                counters.CellStep();
                leftNode = dda.LeftNode<TBranching>(ray);
                if (!leftNode)
                {
                    bit = dda.CellBit<TBranching>();
                    if (!TMode.CullsWithMask || MaskAdmits(view, node, bits, ray.Octant, bit, ref counters, countCulled: false))
                        break;
                }
            }
            if (TMode.StepsWithDda)
                dda.Restart(ray);
        }
    }

    private static void ThrowBranchingMismatch(int tree, int walk) =>
        throw new ArgumentException($"the walk was compiled for {1 << walk}³ nodes but the tree has {1 << tree}³ nodes");

    /// <summary>Steps to the next cell by a slab test of the current cell's box: its exit plane names the axis.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static bool SlabStep<TCounters>(in RaySetup ray, ref DdaState dda, double tExit, ref TCounters counters)
        where TCounters : struct, ICostCounters
    {
        counters.SlabTest();
        double size = 1 << dda.Shift;
        double lx = dda.X << dda.Shift, ly = dda.Y << dda.Shift, lz = dda.Z << dda.Shift;
        SlabTest.Intersect(ray, lx, ly, lz, lx + size, ly + size, lz + size, dda.T, tExit, out SlabHit cellBox);
        int axis = cellBox.FarAxis;
        if (axis < 0)
            return false;
        dda.T = Math.Max(dda.T, cellBox.Far);
        dda.LastAxis = axis;
        dda.MoveCell(ray, axis);
        return true;
    }

    /// <summary>
    /// Directional culling: false when no occupied cell of the node is reachable from cell <paramref name="bit"/> in
    /// the ray's octant, so the caller leaves the node at once.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static bool MaskAdmits<TBranching, TCounters>(in TreeView view, NodeRef node, NodeBits<TBranching> bits, int octant, int bit,
        ref TCounters counters, bool countCulled)
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters
    {
        if (countCulled)
            counters.MaskCulled(bits.CountUnreachable(view, node, octant, bit));
        if (bits.ReachesOccupied(view, node, octant, bit))
            return true;
        counters.MaskSkipped();
        return false;
    }
}

/// <summary>Slab tests at every step.</summary>
public struct SlabMode : IWalkMode
{
    public static bool StepsWithDda => false;
    public static bool CullsWithMask => false;
}

/// <summary>DDA steps inside a node.</summary>
public struct DdaMode : IWalkMode
{
    public static bool StepsWithDda => true;
    public static bool CullsWithMask => false;
}

/// <summary>DDA steps plus directional mask culling.</summary>
public struct MaskedDdaMode : IWalkMode
{
    public static bool StepsWithDda => true;
    public static bool CullsWithMask => true;
}
