using System.Numerics;
using System.Runtime.CompilerServices;
using VoxProf.Core.Rays;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>
/// The stack walk behind the slab, dda and dda-mask strategies. Between levels it restarts with a Williams et al. slab
/// test of the child's box; inside a node it steps by slab tests of the current cell (<see cref="SlabMode"/>) or by
/// Amanatides &amp; Woo DDA (<see cref="DdaMode"/>), optionally culling with directional occupancy masks
/// (<see cref="MaskedDdaMode"/>). Each iteration visits one cell at some level. Counter definitions: docs/counters.md.
/// </summary>
public static class StackWalkKernel
{
    /// <param name="stack">Scratch for one frame per level (at least the tree depth), reused across rays.</param>
    public static void Trace<TMode, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<WalkFrame> stack,
        ref TCounters counterSink, ref PixelHit hit)
        where TMode : struct, IWalkMode
        where TCounters : struct, ICostCounters
    {
        // Count in a local the JIT can keep in registers, and hand the counts over once at the end.
        TCounters counters = default;
        hit = default;
        if (!RayStart.Clip(view, ray, tMin, ref counters, out RayStart start))
            goto Done;

        int log2N = view.Log2N;
        int last = view.N - 1;
        int sx = ray.StepX, sy = ray.StepY, sz = ray.StepZ;
        double adx = ray.AbsIx, ady = ray.AbsIy, adz = ray.AbsIz;
        int maskBase = ray.Octant << (3 * log2N);
        double tExit = start.TExit;
        double t = start.T;
        int lastAxis = start.FaceAxis;

        // Enter the root at the start point
        ref readonly Node root = ref view.Nodes[0];
        counters.NodeFetch(1);
        ulong childMask = root.ChildMask, solidMask = root.SolidMask;
        int firstChild = root.FirstChild, firstMaterial = root.FirstMaterial;
        int ox = 0, oy = 0, oz = 0;
        int shift = view.RootShift;
        int sp = 0;
        int cx = RayStart.Voxel(ray.Ox, ray.Dx, t, 0, view.ExtentX) >> shift;
        int cy = RayStart.Voxel(ray.Oy, ray.Dy, t, 0, view.ExtentY) >> shift;
        int cz = RayStart.Voxel(ray.Oz, ray.Dz, t, 0, view.ExtentZ) >> shift;
        double tMaxX = 0, tMaxY = 0, tMaxZ = 0;
        double size = 1 << shift;
        double tdx = size * adx, tdy = size * ady, tdz = size * adz;
        if (TMode.StepsWithDda)
            SetUpDda(ray, ox, oy, oz, cx, cy, cz, shift, sx, sy, sz, out tMaxX, out tMaxY, out tMaxZ);
        if (TMode.CullsWithMask && !MaskAdmits(view, childMask | solidMask, maskBase, cx, cy, cz, ref counters, countCulled: true))
            goto Done;

        while (true)
        {
            counters.Iteration();
            int bit = view.CellBit(cx, cy, cz);
            ulong b = 1UL << bit;
            if (((childMask | solidMask) & b) != 0)
            {
                // Solid cell: the hit voxel is where the ray enters the cell
                if ((solidMask & b) != 0)
                {
                    int lx = ox + (cx << shift), ly = oy + (cy << shift), lz = oz + (cz << shift);
                    int cell = 1 << shift;
                    RayStart.SetHit(ref hit,
                        RayStart.Voxel(ray.Ox, ray.Dx, t, lx, lx + cell),
                        RayStart.Voxel(ray.Oy, ray.Dy, t, ly, ly + cell),
                        RayStart.Voxel(ray.Oz, ray.Dz, t, lz, lz + cell),
                        t, view.SolidMaterial(solidMask, firstMaterial, bit), RayStart.Face(lastAxis, ray));
                    goto Done;
                }

                // Descend: save this level, fetch the child and restart with a slab test of its box
                ref WalkFrame f = ref stack[sp++];
                f.ChildMask = childMask; f.SolidMask = solidMask; f.FirstChild = firstChild; f.FirstMaterial = firstMaterial;
                f.Ox = ox; f.Oy = oy; f.Oz = oz; f.Cx = cx; f.Cy = cy; f.Cz = cz;
                f.TMaxX = tMaxX; f.TMaxY = tMaxY; f.TMaxZ = tMaxZ;
                ref readonly Node node = ref view.Nodes[firstChild + BrickTree.Rank(childMask, bit)];
                counters.NodeFetch(1);
                counters.Descent();
                ox += cx << shift; oy += cy << shift; oz += cz << shift;
                int span = 1 << shift;
                shift -= log2N;
                size = 1 << shift;
                tdx = size * adx; tdy = size * ady; tdz = size * adz;
                childMask = node.ChildMask; solidMask = node.SolidMask;
                firstChild = node.FirstChild; firstMaterial = node.FirstMaterial;
                counters.SlabTest();
                SlabTest.Intersect(ray, ox, oy, oz, ox + span, oy + span, oz + span, t, tExit, out SlabHit box);
                t = box.Near;
                cx = (RayStart.Voxel(ray.Ox, ray.Dx, t, ox, ox + span) - ox) >> shift;
                cy = (RayStart.Voxel(ray.Oy, ray.Dy, t, oy, oy + span) - oy) >> shift;
                cz = (RayStart.Voxel(ray.Oz, ray.Dz, t, oz, oz + span) - oz) >> shift;
                if (TMode.StepsWithDda)
                    SetUpDda(ray, ox, oy, oz, cx, cy, cz, shift, sx, sy, sz, out tMaxX, out tMaxY, out tMaxZ);
                if (!TMode.CullsWithMask || MaskAdmits(view, childMask | solidMask, maskBase, cx, cy, cz, ref counters, countCulled: true))
                    continue;
            }
            else
            {
                // Advance to the next cell of this node
                if (TMode.StepsWithDda)
                {
                    // One comparison chain and one addition; the cell moves in the same branch to avoid a second one.
                    if (tMaxX <= tMaxY && tMaxX <= tMaxZ)
                    {
                        if (tMaxX > tExit) goto Done;
                        t = tMaxX; tMaxX += tdx; cx += sx; lastAxis = 0;
                    }
                    else if (tMaxY <= tMaxZ)
                    {
                        if (tMaxY > tExit) goto Done;
                        t = tMaxY; tMaxY += tdy; cy += sy; lastAxis = 1;
                    }
                    else
                    {
                        if (tMaxZ > tExit) goto Done;
                        t = tMaxZ; tMaxZ += tdz; cz += sz; lastAxis = 2;
                    }
                }
                else
                {
                    counters.SlabTest();
                    int lx = ox + (cx << shift), ly = oy + (cy << shift), lz = oz + (cz << shift);
                    SlabTest.Intersect(ray, lx, ly, lz, lx + size, ly + size, lz + size, t, tExit, out SlabHit cellBox);
                    int axis = cellBox.FarAxis;
                    if (axis < 0)
                        goto Done;
                    t = Math.Max(t, cellBox.Far);
                    lastAxis = axis;
                    if (axis == 0) cx += sx; else if (axis == 1) cy += sy; else cz += sz;
                }
                counters.CellStep();
                if (((cx | cy | cz) & ~last) == 0)
                {
                    if (!TMode.CullsWithMask || MaskAdmits(view, childMask | solidMask, maskBase, cx, cy, cz, ref counters, countCulled: false))
                        continue;
                }
            }

            // Ascend until some ancestor has a next cell to visit
            while (true)
            {
                if (sp == 0)
                    goto Done;
                ref WalkFrame f = ref stack[--sp];
                counters.Ascent();
                childMask = f.ChildMask; solidMask = f.SolidMask; firstChild = f.FirstChild; firstMaterial = f.FirstMaterial;
                ox = f.Ox; oy = f.Oy; oz = f.Oz; cx = f.Cx; cy = f.Cy; cz = f.Cz;
                tMaxX = f.TMaxX; tMaxY = f.TMaxY; tMaxZ = f.TMaxZ;
                shift += log2N;
                size = 1 << shift;
                tdx = size * adx; tdy = size * ady; tdz = size * adz;

                // Step the parent past the cell just left
                int axis;
                if (TMode.StepsWithDda)
                {
                    if (!StepDda(ref tMaxX, ref tMaxY, ref tMaxZ, tdx, tdy, tdz, tExit, out axis, out double tp))
                        goto Done;
                    t = Math.Max(t, tp);
                }
                else
                {
                    // The child's exit plane is this cell's exit plane: no new slab test is needed.
                    axis = lastAxis;
                }
                counters.CellStep();
                lastAxis = axis;
                if (axis == 0) cx += sx; else if (axis == 1) cy += sy; else cz += sz;
                if (((cx | cy | cz) & ~last) == 0 &&
                    (!TMode.CullsWithMask || MaskAdmits(view, childMask | solidMask, maskBase, cx, cy, cz, ref counters, countCulled: false)))
                    break;
            }
        }

    Done:
        counterSink = counters;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void SetUpDda(in RaySetup ray, int ox, int oy, int oz, int cx, int cy, int cz, int shift,
        int sx, int sy, int sz, out double tMaxX, out double tMaxY, out double tMaxZ)
    {
        tMaxX = ray.ParallelX ? double.PositiveInfinity : (ox + ((cx + (sx > 0 ? 1 : 0)) << shift) - ray.Ox) * ray.Ix;
        tMaxY = ray.ParallelY ? double.PositiveInfinity : (oy + ((cy + (sy > 0 ? 1 : 0)) << shift) - ray.Oy) * ray.Iy;
        tMaxZ = ray.ParallelZ ? double.PositiveInfinity : (oz + ((cz + (sz > 0 ? 1 : 0)) << shift) - ray.Oz) * ray.Iz;
    }

    /// <summary>One DDA step: picks the axis of the nearest plane (lowest axis on ties); false past <paramref name="tExit"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static bool StepDda(ref double tMaxX, ref double tMaxY, ref double tMaxZ, double dX, double dY, double dZ,
        double tExit, out int axis, out double t)
    {
        if (tMaxX <= tMaxY && tMaxX <= tMaxZ) { axis = 0; t = tMaxX; tMaxX += dX; }
        else if (tMaxY <= tMaxZ) { axis = 1; t = tMaxY; tMaxY += dY; }
        else { axis = 2; t = tMaxZ; tMaxZ += dZ; }
        return t <= tExit;
    }

    /// <summary>
    /// Directional culling: false when no occupied cell of the node is reachable from cell (cx, cy, cz) in the ray's
    /// octant, so the caller leaves the node at once.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static bool MaskAdmits<TCounters>(in TreeView view, ulong occupancy, int maskBase, int cx, int cy, int cz,
        ref TCounters counters, bool countCulled) where TCounters : struct, ICostCounters
    {
        ulong reach = view.DirectionMasks[maskBase + view.CellBit(cx, cy, cz)];
        if (countCulled)
            counters.MaskCulled(BitOperations.PopCount(occupancy & ~reach));
        if ((occupancy & reach) != 0)
            return true;
        counters.MaskSkipped();
        return false;
    }
}
