using System.Runtime.CompilerServices;
using VoxProf.Core.Rays;

namespace VoxProf.Core.Traversal;

/// <summary>Result of a slab test: the parameter interval inside the box and the axes of the entry and exit planes.</summary>
public struct SlabHit
{
    public double Near;
    public double Far;
    /// <summary>Axis of the plane the ray enters through (0, 1, 2), or -1 when no plane bounds the entry.</summary>
    public int NearAxis;
    /// <summary>Axis of the plane the ray leaves through, or -1 when no plane bounds the exit.</summary>
    public int FarAxis;
}

/// <summary>
/// Ray/box slab test after Williams, Barrus, Morley &amp; Shirley (2005), "An efficient and robust ray-box intersection
/// algorithm": near and far planes chosen by the sign of the reciprocal direction. Rule for rays lying in a face plane
/// (where the textbook formula forms 0·∞ = NaN): an axis with a zero component (+0.0 or -0.0) is parallel and the ray is
/// inside that slab exactly when lo ≤ o &lt; hi, the same half-open rule that makes voxel x own [x, x+1). So a ray in a
/// box's low face plane is inside the box and a ray in its high face plane is not, on every axis. Ties between axes follow
/// the DDA's crossing order, where the lowest axis crosses first (x, then y, then z): the exit plane is the lowest tied
/// axis (the first plane crossed out of the box), the entry plane the highest (the last plane crossed into it).
/// Every plane time is computed as <see cref="CrossingOrder.Time"/> computes it, so a box face and a DDA plane at the same
/// coordinate get the same time.
/// </summary>
public static class SlabTest
{
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static bool Intersect(in RaySetup r, double loX, double loY, double loZ, double hiX, double hiY, double hiZ,
        double tMin, double tMax, out SlabHit hit)
    {
        hit = default;
        double near = double.NegativeInfinity, far = double.PositiveInfinity;
        int nearAxis = -1, farAxis = -1;

        // X slab
        if (r.ParallelX)
        {
            if (r.Ox < loX || r.Ox >= hiX) return false;
        }
        else
        {
            double a = ((r.Ix < 0 ? hiX : loX) - r.Ox) * r.Ix;
            double b = ((r.Ix < 0 ? loX : hiX) - r.Ox) * r.Ix;
            near = a; far = b; nearAxis = 0; farAxis = 0;
        }

        // Y slab
        if (r.ParallelY)
        {
            if (r.Oy < loY || r.Oy >= hiY) return false;
        }
        else
        {
            double a = ((r.Iy < 0 ? hiY : loY) - r.Oy) * r.Iy;
            double b = ((r.Iy < 0 ? loY : hiY) - r.Oy) * r.Iy;
            if (a >= near) { near = a; nearAxis = 1; }
            if (b < far) { far = b; farAxis = 1; }
        }

        // Z slab
        if (r.ParallelZ)
        {
            if (r.Oz < loZ || r.Oz >= hiZ) return false;
        }
        else
        {
            double a = ((r.Iz < 0 ? hiZ : loZ) - r.Oz) * r.Iz;
            double b = ((r.Iz < 0 ? loZ : hiZ) - r.Oz) * r.Iz;
            if (a >= near) { near = a; nearAxis = 2; }
            if (b < far) { far = b; farAxis = 2; }
        }

        // Clip to the caller's interval; an entry before tMin is no entry plane at all.
        if (near < tMin) { near = tMin; nearAxis = -1; }
        if (far > tMax) { far = tMax; farAxis = -1; }
        hit.Near = near;
        hit.Far = far;
        hit.NearAxis = nearAxis;
        hit.FarAxis = farAxis;
        return near <= far;
    }

    /// <summary>
    /// Where the ray leaves a box: the far time of <see cref="Intersect"/> with no upper clip, computed the same way
    /// plane by plane, without the entry side, for callers that only need the exit (the coarse prepass's strides). 0
    /// where Intersect leaves its result empty: a parallel axis outside the box's slab.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static double Exit(in RaySetup r, double loX, double loY, double loZ, double hiX, double hiY, double hiZ)
    {
        double far = double.PositiveInfinity;
        if (r.ParallelX)
        {
            if (r.Ox < loX || r.Ox >= hiX) return 0;
        }
        else
        {
            far = ((r.Ix < 0 ? loX : hiX) - r.Ox) * r.Ix;
        }
        if (r.ParallelY)
        {
            if (r.Oy < loY || r.Oy >= hiY) return 0;
        }
        else
        {
            double b = ((r.Iy < 0 ? loY : hiY) - r.Oy) * r.Iy;
            if (b < far) far = b;
        }
        if (r.ParallelZ)
        {
            if (r.Oz < loZ || r.Oz >= hiZ) return 0;
        }
        else
        {
            double b = ((r.Iz < 0 ? loZ : hiZ) - r.Oz) * r.Iz;
            if (b < far) far = b;
        }
        return far;
    }
}
