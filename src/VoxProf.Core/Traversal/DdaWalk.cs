using System.Runtime.CompilerServices;
using VoxProf.Core.Rays;

namespace VoxProf.Core.Traversal;

/// <summary>
/// Amanatides &amp; Woo (1987) 3D DDA over a uniform grid of cubic cells. Tie rule at exact edges and corners: the lowest
/// axis steps first (x, then y, then z). Each next-plane time is computed in closed form from the plane's coordinate
/// (<see cref="CrossingOrder.Time"/>), not accumulated by repeated addition, so it is the same double every other kernel
/// computes for that plane and every kernel orders the crossings identically. A parallel axis (zero component) has its
/// next-plane time fixed at +∞, so it never steps and never forms 0·∞.
/// </summary>
public struct DdaWalk
{
    public int X, Y, Z;
    /// <summary>Parameter at which the walk entered the current cell.</summary>
    public double T;
    /// <summary>Time at which the ray crosses the next plane on each axis.</summary>
    public double TMaxX, TMaxY, TMaxZ;
    /// <summary>Coordinate of the next plane on each axis: an exact integer multiple of the cell size.</summary>
    public double PlaneX, PlaneY, PlaneZ;
    /// <summary>Signed cell size: what a step adds to the plane coordinate.</summary>
    public double PlaneStepX, PlaneStepY, PlaneStepZ;
    public int StepX, StepY, StepZ;
    /// <summary>Axis of the last step, or -1 before the first.</summary>
    public int LastAxis;
    private double _ox, _oy, _oz, _ix, _iy, _iz;

    /// <summary>Starts in cell (x, y, z) of a grid with the given cell size, at parameter <paramref name="t"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static DdaWalk Start(in RaySetup ray, double t, int x, int y, int z, double cellSize)
    {
        var w = new DdaWalk { X = x, Y = y, Z = z, T = t, LastAxis = -1 };
        w.StepX = ray.StepX;
        w.StepY = ray.StepY;
        w.StepZ = ray.StepZ;
        w._ox = ray.Ox; w._oy = ray.Oy; w._oz = ray.Oz;
        w._ix = ray.Ix; w._iy = ray.Iy; w._iz = ray.Iz;
        w.PlaneX = (x + (w.StepX > 0 ? 1 : 0)) * cellSize;
        w.PlaneY = (y + (w.StepY > 0 ? 1 : 0)) * cellSize;
        w.PlaneZ = (z + (w.StepZ > 0 ? 1 : 0)) * cellSize;
        w.PlaneStepX = w.StepX * cellSize;
        w.PlaneStepY = w.StepY * cellSize;
        w.PlaneStepZ = w.StepZ * cellSize;
        w.TMaxX = ray.ParallelX ? double.PositiveInfinity : CrossingOrder.Time(w.PlaneX, ray.Ox, ray.Ix);
        w.TMaxY = ray.ParallelY ? double.PositiveInfinity : CrossingOrder.Time(w.PlaneY, ray.Oy, ray.Iy);
        w.TMaxZ = ray.ParallelZ ? double.PositiveInfinity : CrossingOrder.Time(w.PlaneZ, ray.Oz, ray.Iz);
        return w;
    }

    /// <summary>Advances to the next cell along the smallest t; false when that cell would start after <paramref name="tEnd"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public bool TryStep(double tEnd)
    {
        // A parallel axis keeps +∞ and is never chosen: some axis is not parallel, and its time is finite.
        if (TMaxX <= TMaxY && TMaxX <= TMaxZ)
        {
            if (TMaxX > tEnd) return false;
            T = TMaxX; X += StepX; LastAxis = 0;
            PlaneX += PlaneStepX;
            TMaxX = CrossingOrder.Time(PlaneX, _ox, _ix);
        }
        else if (TMaxY <= TMaxZ)
        {
            if (TMaxY > tEnd) return false;
            T = TMaxY; Y += StepY; LastAxis = 1;
            PlaneY += PlaneStepY;
            TMaxY = CrossingOrder.Time(PlaneY, _oy, _iy);
        }
        else
        {
            if (TMaxZ > tEnd) return false;
            T = TMaxZ; Z += StepZ; LastAxis = 2;
            PlaneZ += PlaneStepZ;
            TMaxZ = CrossingOrder.Time(PlaneZ, _oz, _iz);
        }
        return true;
    }
}
