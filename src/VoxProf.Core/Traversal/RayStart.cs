using System.Runtime.CompilerServices;
using VoxProf.Core.Rays;

namespace VoxProf.Core.Traversal;

/// <summary>Where a ray's walk through the volume starts and ends, shared by every kernel.</summary>
public struct RayStart
{
    /// <summary>Parameter at which the walk starts (volume entry, 0 inside the volume, or the prepass distance).</summary>
    public double T;
    /// <summary>Parameter at which the ray leaves the volume box.</summary>
    public double TExit;
    /// <summary>Axis of the volume face the ray entered through at <see cref="T"/>, or -1 (the walk's key is (T, FaceAxis)).</summary>
    public int FaceAxis;
    /// <summary>The voxel the walk starts in, by the crossing order at (T, FaceAxis); inside the extent.</summary>
    public int X, Y, Z;

    /// <summary>
    /// Clips the ray to the volume box [0, extent) with one slab test and finds its first voxel; false when the ray never
    /// is inside a voxel of the volume (it misses the box, only touches it where it leaves, or starts on a high face and
    /// moves away).
    /// </summary>
    // Not inlined, like SetHit: once per ray, a call costs little, and a kernel's method body without these two compiles
    // to a tighter walk loop (the `kernels` benchmark, docs/performance.md "Ray start and hit out of line").
    [MethodImpl(MethodImplOptions.NoInlining | MethodImplOptions.AggressiveOptimization)]
    public static bool Clip<TCounters>(in TreeView view, in RaySetup ray, double tMin, ref TCounters counters, out RayStart start)
        where TCounters : struct, ICostCounters
    {
        counters.SlabTest();
        start = default;
        if (!SlabTest.Intersect(ray, 0, 0, 0, view.ExtentX, view.ExtentY, view.ExtentZ, 0, double.PositiveInfinity, out SlabHit box))
            return false;
        start.T = box.Near;
        start.TExit = box.Far;
        start.FaceAxis = box.Near == 0 ? FaceAtEye(view, ray) : box.NearAxis;
        if (tMin > start.T)
        {
            if (tMin > box.Far)
                return false;
            start.T = tMin;
            start.FaceAxis = -1;
        }

        // The first voxel by the crossing order, looked for one voxel beyond the extent on each side: a ray whose exit
        // crossing comes before its last entry crossing ends up outside and never is inside a voxel.
        double t = start.T;
        int a = start.FaceAxis;
        start.X = StartCell(ray.Ox, ray.Dx, ray.Ix, ray.ParallelX, 0, t, a, view.ExtentX);
        start.Y = StartCell(ray.Oy, ray.Dy, ray.Iy, ray.ParallelY, 1, t, a, view.ExtentY);
        start.Z = StartCell(ray.Oz, ray.Dz, ray.Iz, ray.ParallelZ, 2, t, a, view.ExtentZ);
        return (uint)start.X < (uint)view.ExtentX && (uint)start.Y < (uint)view.ExtentY && (uint)start.Z < (uint)view.ExtentZ;
    }

    /// <summary>
    /// The start voxel on one axis, among the extent and one voxel beyond it on each side (-1 to extent). A walk that
    /// starts at the eye (t = 0, no entry face) is in the eye's voxel ⌊o⌋ whatever the direction: strictly between two
    /// planes, the one below is at a negative time and the one above at a positive time moving up, the other way round
    /// moving down (a difference of two unequal doubles is never 0, and with |1/d| ≥ 1, as for every unit direction,
    /// neither product rounds to 0); on a plane, the half-open rule the crossing order encodes puts the eye in the
    /// voxel above it; a parallel axis has no crossings. That is what <see cref="CrossingOrder.Cell"/> would settle
    /// with two plane times; every camera inside the volume starts this way, so its rays skip them.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static int StartCell(double o, double d, double inv, bool parallel, int axis, double t, int faceAxis, int extent)
    {
        if (t == 0 && faceAxis < 0 && Math.Abs(inv) >= 1)
        {
            double floor = Math.Floor(o);
            if (floor >= -1 && floor <= extent)
                return (int)floor;
        }
        return CrossingOrder.Cell(o, d, inv, parallel, axis, t, faceAxis, -1, extent + 2, 0, out _, out _) - 1;
    }

    /// <summary>
    /// The entry face of a walk that starts at t = 0. An eye on a low face of the volume is inside the voxel above it by
    /// the half-open rule: no face. An eye on a high face is outside; a ray moving in from there enters through that face
    /// at t = 0 (the highest such axis, as entry ties go to the last plane crossed).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static int FaceAtEye(in TreeView view, in RaySetup ray)
    {
        if (!ray.ParallelZ && ray.Iz < 0 && ray.Oz == view.ExtentZ) return 2;
        if (!ray.ParallelY && ray.Iy < 0 && ray.Oy == view.ExtentY) return 1;
        if (!ray.ParallelX && ray.Ix < 0 && ray.Ox == view.ExtentX) return 0;
        return -1;
    }

    /// <summary>The face a ray entered through when it crossed a plane of <paramref name="axis"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static HitFace Face(int axis, in RaySetup ray)
    {
        if (axis < 0)
            return HitFace.None;
        bool negative = ray.Inv(axis) < 0;
        return (HitFace)(1 + 2 * axis + (negative ? 1 : 0));
    }

    /// <summary>
    /// Records a hit on a solid cell of size 2^<paramref name="shift"/> at voxel (lx, ly, lz): the hit voxel is the
    /// cell's voxel the walk is in at key (t, lastAxis), by the same crossing order the reference walk follows.
    /// </summary>
    [MethodImpl(MethodImplOptions.NoInlining | MethodImplOptions.AggressiveOptimization)]
    public static void SetHit(ref PixelHit hit, in RaySetup ray, int lx, int ly, int lz, int shift, double t, int lastAxis, byte material)
    {
        hit.Hit = true;
        if (shift == 0)
        {
            // A voxel-sized cell is its own hit voxel: the crossing order has one candidate on each axis.
            hit.X = lx;
            hit.Y = ly;
            hit.Z = lz;
        }
        else
        {
            // The voxels of the cell as its children: on the latest crossing's axis the hit voxel is usually on the
            // face the walk entered through, which the descent's shortcut checks by the crossing order.
            int cell = 1 << shift;
            hit.X = lx + DdaState.ChildCell(ray.Ox, ray.Dx, ray.Ix, ray.ParallelX, 0, t, lastAxis, lx, cell, 0, out _);
            hit.Y = ly + DdaState.ChildCell(ray.Oy, ray.Dy, ray.Iy, ray.ParallelY, 1, t, lastAxis, ly, cell, 0, out _);
            hit.Z = lz + DdaState.ChildCell(ray.Oz, ray.Dz, ray.Iz, ray.ParallelZ, 2, t, lastAxis, lz, cell, 0, out _);
        }
        hit.T = t;
        hit.Material = material;
        hit.Face = Face(lastAxis, ray);
    }
}
