using System.Runtime.CompilerServices;
using VoxProf.Core.Rays;

namespace VoxProf.Core.Traversal;

/// <summary>
/// Amanatides &amp; Woo (1987) 3D DDA over a uniform grid of cubic cells: after set-up, each step is one comparison
/// chain and one addition. Tie rule at exact edges and corners: the lowest axis steps first (x, then y, then z).
/// A parallel axis (zero component) has its next-plane time fixed at +∞, so it never steps and never forms 0·∞.
/// </summary>
public struct DdaWalk
{
    public int X, Y, Z;
    /// <summary>Parameter at which the walk entered the current cell.</summary>
    public double T;
    public double TMaxX, TMaxY, TMaxZ;
    public double TDeltaX, TDeltaY, TDeltaZ;
    public int StepX, StepY, StepZ;
    /// <summary>Axis of the last step, or -1 before the first.</summary>
    public int LastAxis;

    /// <summary>Starts in cell (x, y, z) of a grid with the given cell size, at parameter <paramref name="t"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static DdaWalk Start(in RaySetup ray, double t, int x, int y, int z, double cellSize)
    {
        var w = new DdaWalk { X = x, Y = y, Z = z, T = t, LastAxis = -1 };
        w.StepX = ray.StepX;
        w.StepY = ray.StepY;
        w.StepZ = ray.StepZ;
        w.TMaxX = ray.ParallelX ? double.PositiveInfinity : ((x + (w.StepX > 0 ? 1 : 0)) * cellSize - ray.Ox) * ray.Ix;
        w.TMaxY = ray.ParallelY ? double.PositiveInfinity : ((y + (w.StepY > 0 ? 1 : 0)) * cellSize - ray.Oy) * ray.Iy;
        w.TMaxZ = ray.ParallelZ ? double.PositiveInfinity : ((z + (w.StepZ > 0 ? 1 : 0)) * cellSize - ray.Oz) * ray.Iz;
        w.TDeltaX = ray.ParallelX ? double.PositiveInfinity : cellSize * ray.AbsIx;
        w.TDeltaY = ray.ParallelY ? double.PositiveInfinity : cellSize * ray.AbsIy;
        w.TDeltaZ = ray.ParallelZ ? double.PositiveInfinity : cellSize * ray.AbsIz;
        return w;
    }

    /// <summary>Advances to the next cell along the smallest t; false when that cell would start after <paramref name="tEnd"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public bool TryStep(double tEnd)
    {
        if (TMaxX <= TMaxY && TMaxX <= TMaxZ)
        {
            if (TMaxX > tEnd) return false;
            T = TMaxX; X += StepX; TMaxX += TDeltaX; LastAxis = 0;
        }
        else if (TMaxY <= TMaxZ)
        {
            if (TMaxY > tEnd) return false;
            T = TMaxY; Y += StepY; TMaxY += TDeltaY; LastAxis = 1;
        }
        else
        {
            if (TMaxZ > tEnd) return false;
            T = TMaxZ; Z += StepZ; TMaxZ += TDeltaZ; LastAxis = 2;
        }
        return true;
    }
}
