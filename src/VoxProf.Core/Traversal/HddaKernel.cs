using System.Runtime.CompilerServices;
using VoxProf.Core.Rays;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>
/// Hierarchical DDA after Museth (2014), "Hierarchical digital differential analyzer for efficient ray-marching in
/// OpenVDB": one DDA state (cell coordinates at the current level, next-plane times) that changes level in place.
/// Descending refines the cell from the current point; ascending coarsens the coordinates by a shift, which already
/// names the neighbouring coarse cell. No slab test after the volume clip, and no DDA state is saved per level: only
/// the node records on the path, which a kernel keeps anyway.
/// </summary>
public static class HddaKernel
{
    public static void Trace<TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<WalkFrame> path,
        ref TCounters counterSink, ref PixelHit hit)
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
        double tExit = start.TExit;
        double t = start.T;
        int lastAxis = start.FaceAxis;

        // One DDA state: global cell coordinates at the current level, the next plane on each axis (an integer-valued
        // double), its crossing time, and the signed cell size
        ref readonly Node root = ref view.Nodes[0];
        counters.NodeFetch(0);
        ulong childMask = root.ChildMask, solidMask = root.SolidMask;
        int firstChild = root.FirstChild, firstMaterial = root.FirstMaterial;
        int shift = view.RootShift;
        int depth = 0;
        int gx = start.X >> shift, gy = start.Y >> shift, gz = start.Z >> shift;
        PlaneTimes(ray, gx, gy, gz, shift, ux, uy, uz, out double px, out double py, out double pz,
            out double tMaxX, out double tMaxY, out double tMaxZ);
        double dpx = sx * (double)(1 << shift), dpy = sy * (double)(1 << shift), dpz = sz * (double)(1 << shift);

        while (true)
        {
            counters.Iteration();
            int bit = view.CellBit(gx & last, gy & last, gz & last);
            ulong b = 1UL << bit;
            if (((childMask | solidMask) & b) != 0)
            {
                int lx = gx << shift, ly = gy << shift, lz = gz << shift;
                if ((solidMask & b) != 0)
                {
                    RayStart.SetHit(ref hit, ray, lx, ly, lz, shift, t, lastAxis, view.SolidMaterial(solidMask, firstMaterial, bit));
                    goto Done;
                }

                // Descend: refine the cell by the crossing order at the walk's key, keep t
                ref WalkFrame f = ref path[depth++];
                f.ChildMask = childMask; f.SolidMask = solidMask; f.FirstChild = firstChild; f.FirstMaterial = firstMaterial;
                int nodeIndex = firstChild + BrickTree.Rank(childMask, bit);
                ref readonly Node node = ref view.Nodes[nodeIndex];
                counters.NodeFetch(nodeIndex);
                counters.Descent();
                childMask = node.ChildMask; solidMask = node.SolidMask;
                firstChild = node.FirstChild; firstMaterial = node.FirstMaterial;
                shift -= log2N;
                dpx = sx * (double)(1 << shift); dpy = sy * (double)(1 << shift); dpz = sz * (double)(1 << shift);
                gx = (lx >> shift) + CrossingOrder.Cell(ray.Ox, ray.Dx, ray.Ix, ray.ParallelX, 0, t, lastAxis, lx, view.N, shift, out px, out tMaxX);
                gy = (ly >> shift) + CrossingOrder.Cell(ray.Oy, ray.Dy, ray.Iy, ray.ParallelY, 1, t, lastAxis, ly, view.N, shift, out py, out tMaxY);
                gz = (lz >> shift) + CrossingOrder.Cell(ray.Oz, ray.Dz, ray.Iz, ray.ParallelZ, 2, t, lastAxis, lz, view.N, shift, out pz, out tMaxZ);
                continue;
            }

            // Advance to the next cell at this level along the smallest t, the next plane's time in closed form
            int axis;
            bool leftNode;
            if (tMaxX <= tMaxY && tMaxX <= tMaxZ)
            {
                axis = 0; t = tMaxX; gx += sx;
                px += dpx; tMaxX = CrossingOrder.Time(px, ray.Ox, ray.Ix);
                leftNode = (gx & last) == (sx > 0 ? 0 : last);
            }
            else if (tMaxY <= tMaxZ)
            {
                axis = 1; t = tMaxY; gy += sy;
                py += dpy; tMaxY = CrossingOrder.Time(py, ray.Oy, ray.Iy);
                leftNode = (gy & last) == (sy > 0 ? 0 : last);
            }
            else
            {
                axis = 2; t = tMaxZ; gz += sz;
                pz += dpz; tMaxZ = CrossingOrder.Time(pz, ray.Oz, ray.Iz);
                leftNode = (gz & last) == (sz > 0 ? 0 : last);
            }
            if (t > tExit)
                goto Done;
            counters.CellStep();
            lastAxis = axis;
            if (!leftNode)
                continue;

            // Ascend while the new cell lies outside the current node: a shift names the neighbouring coarse cell
            int stepSign = axis == 0 ? sx : axis == 1 ? sy : sz;
            int wrapped = stepSign > 0 ? 0 : last;
            while (true)
            {
                if (depth == 0)
                    goto Done;
                ref WalkFrame f = ref path[--depth];
                counters.Ascent();
                childMask = f.ChildMask; solidMask = f.SolidMask; firstChild = f.FirstChild; firstMaterial = f.FirstMaterial;
                shift += log2N;
                gx >>= log2N; gy >>= log2N; gz >>= log2N;
                int g = axis == 0 ? gx : axis == 1 ? gy : gz;
                if ((g & last) != wrapped)
                    break;
            }
            dpx = sx * (double)(1 << shift); dpy = sy * (double)(1 << shift); dpz = sz * (double)(1 << shift);
            PlaneTimes(ray, gx, gy, gz, shift, ux, uy, uz, out px, out py, out pz, out tMaxX, out tMaxY, out tMaxZ);
        }

    Done:
        counterSink = counters;
    }

    /// <summary>The next plane on each axis of global cell (gx, gy, gz) of size 2^shift, and its crossing time.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void PlaneTimes(in RaySetup ray, int gx, int gy, int gz, int shift, int ux, int uy, int uz,
        out double px, out double py, out double pz, out double tMaxX, out double tMaxY, out double tMaxZ)
    {
        px = (gx + ux) << shift;
        py = (gy + uy) << shift;
        pz = (gz + uz) << shift;
        tMaxX = ray.ParallelX ? double.PositiveInfinity : CrossingOrder.Time(px, ray.Ox, ray.Ix);
        tMaxY = ray.ParallelY ? double.PositiveInfinity : CrossingOrder.Time(py, ray.Oy, ray.Iy);
        tMaxZ = ray.ParallelZ ? double.PositiveInfinity : CrossingOrder.Time(pz, ray.Oz, ray.Iz);
    }
}
