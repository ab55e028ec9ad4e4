using System.Numerics;
using System.Runtime.CompilerServices;

namespace VoxProf.Core.Rays;

/// <summary>
/// Everything a kernel needs per ray, computed once: origin, direction, reciprocal, step signs and octant.
/// The ray is built in single precision (as the user's shader builds it); traversal arithmetic then runs in double,
/// and every kernel orders plane crossings the same way, so every strategy makes the same decisions (docs/strategies.md,
/// "The crossing order").
/// Zero components: +0.0 and -0.0 both mark the axis as parallel. Kernels never multiply by the infinite reciprocal
/// of a parallel axis: its boundary times are +∞ by construction, so no 0·∞ NaN can form. The step sign of an axis
/// follows the sign of the reciprocal (so -0.0 counts as negative), which only picks the octant of the mask table.
/// </summary>
public readonly struct RaySetup
{
    public RaySetup(Vector3 origin, Vector3 direction)
        : this(origin.X, origin.Y, origin.Z, direction.X, direction.Y, direction.Z) { }

    // Inlined into the tracer's pixel loop, where a call per ray showed in profiles.
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public RaySetup(double ox, double oy, double oz, double dx, double dy, double dz)
    {
        Ox = ox; Oy = oy; Oz = oz;
        Dx = dx; Dy = dy; Dz = dz;
        Ix = 1.0 / dx; Iy = 1.0 / dy; Iz = 1.0 / dz;
        ParallelX = dx == 0; ParallelY = dy == 0; ParallelZ = dz == 0;
        // Branch on the reciprocal: 1/-0.0 is -∞, so a negative zero counts as a negative direction.
        Octant = (Ix < 0 ? 1 : 0) | (Iy < 0 ? 2 : 0) | (Iz < 0 ? 4 : 0);
        StepX = Ix < 0 ? -1 : 1; StepY = Iy < 0 ? -1 : 1; StepZ = Iz < 0 ? -1 : 1;
        AbsIx = Math.Abs(Ix); AbsIy = Math.Abs(Iy); AbsIz = Math.Abs(Iz);
    }

    public readonly double Ox, Oy, Oz;
    public readonly double Dx, Dy, Dz;
    public readonly double Ix, Iy, Iz;
    public readonly bool ParallelX, ParallelY, ParallelZ;

    /// <summary>Bit a set when the reciprocal of axis a is negative (x = 1, y = 2, z = 4).</summary>
    public readonly int Octant;

    /// <summary>Cell step per axis: -1 where the reciprocal is negative, else +1.</summary>
    public readonly int StepX, StepY, StepZ;

    /// <summary>|1/d| per axis: the parameter length of one unit cell (+∞ on a parallel axis).</summary>
    public readonly double AbsIx, AbsIy, AbsIz;

    public double Inv(int axis) => axis == 0 ? Ix : axis == 1 ? Iy : Iz;
}
