using System.Runtime.CompilerServices;
using VoxProf.Core.Rays;

namespace VoxProf.Core.Traversal;

/// <summary>Where a ray's walk through the volume starts and ends, shared by every kernel.</summary>
internal struct RayStart
{
    /// <summary>Parameter at which the walk starts (volume entry, 0 inside the volume, or the prepass distance).</summary>
    public double T;
    /// <summary>Parameter at which the ray leaves the volume box.</summary>
    public double TExit;
    /// <summary>Axis of the volume face the ray entered through at <see cref="T"/>, or -1.</summary>
    public int FaceAxis;

    /// <summary>Clips the ray to the volume box [0, extent) with one slab test; false when it misses the volume.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static bool Clip<TCounters>(in TreeView view, in RaySetup ray, double tMin, ref TCounters counters, out RayStart start)
        where TCounters : struct, ICostCounters
    {
        counters.SlabTest();
        start = default;
        if (!SlabTest.Intersect(ray, 0, 0, 0, view.ExtentX, view.ExtentY, view.ExtentZ, 0, double.PositiveInfinity, out SlabHit box))
            return false;
        start.T = box.Near;
        start.TExit = box.Far;
        start.FaceAxis = box.NearAxis;
        if (tMin > start.T)
        {
            if (tMin > box.Far)
                return false;
            start.T = tMin;
            start.FaceAxis = -1;
        }
        return true;
    }

    /// <summary>The voxel containing the ray point at <paramref name="t"/>, clamped into [lo, hi) against rounding.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static int Voxel(double o, double d, double t, int lo, int hi)
    {
        double p = Math.Floor(o + t * d);
        if (p < lo) return lo;
        if (p >= hi) return hi - 1;
        return (int)p;
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

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static void SetHit(ref PixelHit hit, int x, int y, int z, double t, byte material, HitFace face)
    {
        hit.Hit = true;
        hit.X = x;
        hit.Y = y;
        hit.Z = z;
        hit.T = (float)t;
        hit.Material = material;
        hit.Face = face;
    }
}
