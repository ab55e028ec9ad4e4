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
        int ux = sx > 0 ? 1 : 0, uy = sy > 0 ? 1 : 0, uz = sz > 0 ? 1 : 0;
        int maskBase = ray.Octant << (3 * log2N);
        double tExit = start.TExit;
        double t = start.T;
        int lastAxis = start.FaceAxis;

        // Enter the root at the start point
        ref readonly Node root = ref view.Nodes[0];
        counters.NodeFetch(0);
        ulong childMask = root.ChildMask, solidMask = root.SolidMask;
        int firstChild = root.FirstChild, firstMaterial = root.FirstMaterial;
        int ox = 0, oy = 0, oz = 0;
        int shift = view.RootShift;
        int sp = 0;
        int cx = start.X >> shift, cy = start.Y >> shift, cz = start.Z >> shift;
        double size = 1 << shift;
        // DDA state: the next plane on each axis (an integer-valued double), its crossing time, and the signed cell size
        double px = 0, py = 0, pz = 0, tMaxX = 0, tMaxY = 0, tMaxZ = 0;
        double dpx = sx * size, dpy = sy * size, dpz = sz * size;
        if (TMode.StepsWithDda)
            SetUpDda(ray, ox, oy, oz, cx, cy, cz, shift, ux, uy, uz, out px, out py, out pz, out tMaxX, out tMaxY, out tMaxZ);
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
                    RayStart.SetHit(ref hit, ray, ox + (cx << shift), oy + (cy << shift), oz + (cz << shift), shift, t, lastAxis,
                        view.SolidMaterial(solidMask, firstMaterial, bit));
                    goto Done;
                }

                // Descend: save this level, fetch the child and restart with a slab test of its box
                ref WalkFrame f = ref stack[sp++];
                f.ChildMask = childMask; f.SolidMask = solidMask; f.FirstChild = firstChild; f.FirstMaterial = firstMaterial;
                f.Ox = ox; f.Oy = oy; f.Oz = oz; f.Cx = cx; f.Cy = cy; f.Cz = cz;
                f.TMaxX = tMaxX; f.TMaxY = tMaxY; f.TMaxZ = tMaxZ;
                int nodeIndex = firstChild + BrickTree.Rank(childMask, bit);
                ref readonly Node node = ref view.Nodes[nodeIndex];
                counters.NodeFetch(nodeIndex);
                counters.Descent();
                ox += cx << shift; oy += cy << shift; oz += cz << shift;
                int span = 1 << shift;
                shift -= log2N;
                size = 1 << shift;
                dpx = sx * size; dpy = sy * size; dpz = sz * size;
                childMask = node.ChildMask; solidMask = node.SolidMask;
                firstChild = node.FirstChild; firstMaterial = node.FirstMaterial;
                counters.SlabTest();
                SlabTest.Intersect(ray, ox, oy, oz, ox + span, oy + span, oz + span, t, tExit, out SlabHit box);
                // The box is the cell the walk is in, so its entry planes are behind the walk and Near is t itself.
                t = box.Near;

                // The child cell by the crossing order at the walk's key, with its next-plane times
                cx = CrossingOrder.Cell(ray.Ox, ray.Dx, ray.Ix, ray.ParallelX, 0, t, lastAxis, ox, view.N, shift, out px, out tMaxX);
                cy = CrossingOrder.Cell(ray.Oy, ray.Dy, ray.Iy, ray.ParallelY, 1, t, lastAxis, oy, view.N, shift, out py, out tMaxY);
                cz = CrossingOrder.Cell(ray.Oz, ray.Dz, ray.Iz, ray.ParallelZ, 2, t, lastAxis, oz, view.N, shift, out pz, out tMaxZ);
                if (!TMode.CullsWithMask || MaskAdmits(view, childMask | solidMask, maskBase, cx, cy, cz, ref counters, countCulled: true))
                    continue;
            }
            else
            {
                // Advance to the next cell of this node
                if (TMode.StepsWithDda)
                {
                    // One comparison chain, then the next plane's time in closed form; the cell moves in the same branch
                    // to avoid a second one.
                    if (tMaxX <= tMaxY && tMaxX <= tMaxZ)
                    {
                        if (tMaxX > tExit) goto Done;
                        t = tMaxX; cx += sx; lastAxis = 0;
                        px += dpx; tMaxX = CrossingOrder.Time(px, ray.Ox, ray.Ix);
                    }
                    else if (tMaxY <= tMaxZ)
                    {
                        if (tMaxY > tExit) goto Done;
                        t = tMaxY; cy += sy; lastAxis = 1;
                        py += dpy; tMaxY = CrossingOrder.Time(py, ray.Oy, ray.Iy);
                    }
                    else
                    {
                        if (tMaxZ > tExit) goto Done;
                        t = tMaxZ; cz += sz; lastAxis = 2;
                        pz += dpz; tMaxZ = CrossingOrder.Time(pz, ray.Oz, ray.Iz);
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
                dpx = sx * size; dpy = sy * size; dpz = sz * size;

                // Step the parent past the cell just left
                int axis;
                if (TMode.StepsWithDda)
                {
                    NextPlanes(ox, oy, oz, cx, cy, cz, shift, ux, uy, uz, out px, out py, out pz);
                    if (!StepDda(ray, ref tMaxX, ref tMaxY, ref tMaxZ, ref px, ref py, ref pz, dpx, dpy, dpz, tExit, out axis, out double tp))
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

    /// <summary>The next plane on each axis of cell (cx, cy, cz) of size 2^shift in the node at (ox, oy, oz).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void NextPlanes(int ox, int oy, int oz, int cx, int cy, int cz, int shift, int ux, int uy, int uz,
        out double px, out double py, out double pz)
    {
        px = ox + ((cx + ux) << shift);
        py = oy + ((cy + uy) << shift);
        pz = oz + ((cz + uz) << shift);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void SetUpDda(in RaySetup ray, int ox, int oy, int oz, int cx, int cy, int cz, int shift, int ux, int uy, int uz,
        out double px, out double py, out double pz, out double tMaxX, out double tMaxY, out double tMaxZ)
    {
        NextPlanes(ox, oy, oz, cx, cy, cz, shift, ux, uy, uz, out px, out py, out pz);
        tMaxX = ray.ParallelX ? double.PositiveInfinity : CrossingOrder.Time(px, ray.Ox, ray.Ix);
        tMaxY = ray.ParallelY ? double.PositiveInfinity : CrossingOrder.Time(py, ray.Oy, ray.Iy);
        tMaxZ = ray.ParallelZ ? double.PositiveInfinity : CrossingOrder.Time(pz, ray.Oz, ray.Iz);
    }

    /// <summary>One DDA step: picks the axis of the nearest plane (lowest axis on ties); false past <paramref name="tExit"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static bool StepDda(in RaySetup ray, ref double tMaxX, ref double tMaxY, ref double tMaxZ,
        ref double px, ref double py, ref double pz, double dpx, double dpy, double dpz, double tExit, out int axis, out double t)
    {
        if (tMaxX <= tMaxY && tMaxX <= tMaxZ) { axis = 0; t = tMaxX; px += dpx; tMaxX = CrossingOrder.Time(px, ray.Ox, ray.Ix); }
        else if (tMaxY <= tMaxZ) { axis = 1; t = tMaxY; py += dpy; tMaxY = CrossingOrder.Time(py, ray.Oy, ray.Iy); }
        else { axis = 2; t = tMaxZ; pz += dpz; tMaxZ = CrossingOrder.Time(pz, ray.Oz, ray.Iz); }
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
