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
        double adx = ray.AbsIx, ady = ray.AbsIy, adz = ray.AbsIz;
        double tExit = start.TExit;
        double t = start.T;
        int lastAxis = start.FaceAxis;

        // One DDA state: global cell coordinates at the current level and the next-plane times
        ref readonly Node root = ref view.Nodes[0];
        counters.NodeFetch(1);
        ulong childMask = root.ChildMask, solidMask = root.SolidMask;
        int firstChild = root.FirstChild, firstMaterial = root.FirstMaterial;
        int shift = view.RootShift;
        int depth = 0;
        int gx = RayStart.Voxel(ray.Ox, ray.Dx, t, 0, view.ExtentX) >> shift;
        int gy = RayStart.Voxel(ray.Oy, ray.Dy, t, 0, view.ExtentY) >> shift;
        int gz = RayStart.Voxel(ray.Oz, ray.Dz, t, 0, view.ExtentZ) >> shift;
        PlaneTimes(ray, gx, gy, gz, shift, sx, sy, sz, out double tMaxX, out double tMaxY, out double tMaxZ);
        double tdx = (1 << shift) * adx, tdy = (1 << shift) * ady, tdz = (1 << shift) * adz;

        while (true)
        {
            counters.Iteration();
            int bit = view.CellBit(gx & last, gy & last, gz & last);
            ulong b = 1UL << bit;
            if (((childMask | solidMask) & b) != 0)
            {
                int cell = 1 << shift;
                int lx = gx << shift, ly = gy << shift, lz = gz << shift;
                if ((solidMask & b) != 0)
                {
                    RayStart.SetHit(ref hit,
                        RayStart.Voxel(ray.Ox, ray.Dx, t, lx, lx + cell),
                        RayStart.Voxel(ray.Oy, ray.Dy, t, ly, ly + cell),
                        RayStart.Voxel(ray.Oz, ray.Dz, t, lz, lz + cell),
                        t, view.SolidMaterial(solidMask, firstMaterial, bit), RayStart.Face(lastAxis, ray));
                    goto Done;
                }

                // Descend: refine the cell from the current point, keep t
                ref WalkFrame f = ref path[depth++];
                f.ChildMask = childMask; f.SolidMask = solidMask; f.FirstChild = firstChild; f.FirstMaterial = firstMaterial;
                ref readonly Node node = ref view.Nodes[firstChild + BrickTree.Rank(childMask, bit)];
                counters.NodeFetch(1);
                counters.Descent();
                childMask = node.ChildMask; solidMask = node.SolidMask;
                firstChild = node.FirstChild; firstMaterial = node.FirstMaterial;
                shift -= log2N;
                tdx = (1 << shift) * adx; tdy = (1 << shift) * ady; tdz = (1 << shift) * adz;
                gx = RayStart.Voxel(ray.Ox, ray.Dx, t, lx, lx + cell) >> shift;
                gy = RayStart.Voxel(ray.Oy, ray.Dy, t, ly, ly + cell) >> shift;
                gz = RayStart.Voxel(ray.Oz, ray.Dz, t, lz, lz + cell) >> shift;
                PlaneTimes(ray, gx, gy, gz, shift, sx, sy, sz, out tMaxX, out tMaxY, out tMaxZ);
                continue;
            }

            // Advance to the next cell at this level along the smallest t
            int axis;
            bool leftNode;
            if (tMaxX <= tMaxY && tMaxX <= tMaxZ)
            {
                axis = 0; t = tMaxX; tMaxX += tdx; gx += sx;
                leftNode = (gx & last) == (sx > 0 ? 0 : last);
            }
            else if (tMaxY <= tMaxZ)
            {
                axis = 1; t = tMaxY; tMaxY += tdy; gy += sy;
                leftNode = (gy & last) == (sy > 0 ? 0 : last);
            }
            else
            {
                axis = 2; t = tMaxZ; tMaxZ += tdz; gz += sz;
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
            tdx = (1 << shift) * adx; tdy = (1 << shift) * ady; tdz = (1 << shift) * adz;
            PlaneTimes(ray, gx, gy, gz, shift, sx, sy, sz, out tMaxX, out tMaxY, out tMaxZ);
        }

    Done:
        counterSink = counters;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void PlaneTimes(in RaySetup ray, int gx, int gy, int gz, int shift, int sx, int sy, int sz,
        out double tMaxX, out double tMaxY, out double tMaxZ)
    {
        tMaxX = ray.ParallelX ? double.PositiveInfinity : (((gx + (sx > 0 ? 1 : 0)) << shift) - ray.Ox) * ray.Ix;
        tMaxY = ray.ParallelY ? double.PositiveInfinity : (((gy + (sy > 0 ? 1 : 0)) << shift) - ray.Oy) * ray.Iy;
        tMaxZ = ray.ParallelZ ? double.PositiveInfinity : (((gz + (sz > 0 ? 1 : 0)) << shift) - ray.Oz) * ray.Iz;
    }
}
