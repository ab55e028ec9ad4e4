using System.Runtime.CompilerServices;

namespace VoxProf.Core.Traversal;

/// <summary>
/// The one order of plane crossings every kernel follows, so that every strategy visits the same voxels
/// (docs/strategies.md, "The crossing order"). A ray crosses the plane at integer coordinate p of axis a at
/// T(a, p) = (p − o_a)·(1/d_a), always computed by <see cref="Time"/>, so two kernels that cross the same plane get the
/// same double. Crossings are ordered by (T, axis): at equal times the lowest axis goes first. A walk's position is the
/// key (t, lastAxis) of its latest crossing; every cell it is in at that key follows from the order alone.
/// </summary>
public static class CrossingOrder
{
    /// <summary>Time at which the ray crosses the plane at <paramref name="plane"/> (an integer-valued double).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static double Time(double plane, double o, double inv) => (plane - o) * inv;

    /// <summary>
    /// Whether a walk at key (<paramref name="t"/>, <paramref name="lastAxis"/>) has the plane crossed at
    /// <paramref name="planeTime"/> on <paramref name="axis"/> behind it: crossed earlier, or at the same time by this or
    /// a lower axis. A plane through the eye (time 0) that the ray moves up through is behind it from the start: the
    /// half-open rule puts the eye in the voxel above that plane.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static bool Behind(double planeTime, int axis, double t, int lastAxis, double inv) =>
        planeTime < t || (planeTime == t && (axis <= lastAxis || (planeTime == 0 && inv > 0)));

    /// <summary>
    /// On one axis, the index k in [0, <paramref name="count"/>) of the cell the walk at key (t, lastAxis) is in, among
    /// cells of size 2^<paramref name="shift"/> starting at <paramref name="lo"/>; the walk is known to be in one of them.
    /// Also the plane the ray leaves that cell through on this axis and the time it crosses it (+∞ on a parallel axis).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static int Cell(double o, double d, double inv, bool parallel, int axis, double t, int lastAxis,
        int lo, int count, int shift, out double exitPlane, out double exitTime)
    {
        // A first guess from the point on the ray. One rounding can put that point on the other side of a plane than the
        // plane's own time says, so the guess may be one cell off; the plane times of its two faces settle it.
        double p = Math.Floor(o + t * d);
        // p is inside [lo, lo + count·2^shift) when converted, so the processor's own conversion is exact and the
        // saturating checks of a C# cast would be dead weight on every descent.
        int k = p < lo ? 0 : p >= lo + ((long)count << shift) ? count - 1 : (double.ConvertToIntegerNative<int>(p) - lo) >> shift;
        int size = 1 << shift;
        if (parallel)
        {
            exitPlane = 0;
            exitTime = double.PositiveInfinity;
            return k;
        }
        if (inv > 0)
        {
            // Moving up: cell k is entered through its low face and left through its high face.
            double low = lo + ((long)k << shift);
            exitPlane = low + size;
            exitTime = Time(exitPlane, o, inv);
            if (k < count - 1 && Behind(exitTime, axis, t, lastAxis, inv))
            {
                k++;
                exitPlane += size;
                exitTime = Time(exitPlane, o, inv);
            }
            else if (k > 0)
            {
                double entryTime = Time(low, o, inv);
                if (!Behind(entryTime, axis, t, lastAxis, inv))
                {
                    k--;
                    exitPlane = low;
                    exitTime = entryTime;
                }
            }
        }
        else
        {
            // Moving down: cell k is entered through its high face and left through its low face.
            double high = lo + ((long)(k + 1) << shift);
            exitPlane = high - size;
            exitTime = Time(exitPlane, o, inv);
            if (k > 0 && Behind(exitTime, axis, t, lastAxis, inv))
            {
                k--;
                exitPlane -= size;
                exitTime = Time(exitPlane, o, inv);
            }
            else if (k < count - 1)
            {
                double entryTime = Time(high, o, inv);
                if (!Behind(entryTime, axis, t, lastAxis, inv))
                {
                    k++;
                    exitPlane = high;
                    exitTime = entryTime;
                }
            }
        }
        return k;
    }
}
