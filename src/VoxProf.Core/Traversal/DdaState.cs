using System.Runtime.CompilerServices;
using VoxProf.Core.Rays;

namespace VoxProf.Core.Traversal;

/// <summary>
/// Amanatides &amp; Woo (1987) 3D DDA over the cells of one level of the tree (cells of size 2^<see cref="Shift"/>),
/// the one DDA state every kernel steps with. Cell coordinates are global at that level (voxel coordinate ≫ Shift), so
/// the same state serves a flat grid (Shift 0), a walk that restarts per node and a hierarchical DDA that changes level
/// in place (<see cref="Descend{TBranching}"/>, <see cref="Coarsen{TBranching}"/>).
/// Tie rule at exact edges and corners: the lowest axis steps first (x, then y, then z). Each next-plane time is
/// computed in closed form from the plane's coordinate (<see cref="CrossingOrder.Time"/>), never accumulated, so it is
/// the same double every kernel computes for that plane and every kernel orders the crossings identically
/// (docs/strategies.md, "The crossing order"). A parallel axis (zero component) has its next-plane time fixed at +∞,
/// so it never steps and never forms 0·∞.
/// </summary>
public struct DdaState
{
    /// <summary>Cell coordinates at the current level.</summary>
    public int X, Y, Z;
    /// <summary>Log2 of the current cell size in voxels.</summary>
    public int Shift;
    /// <summary>Parameter of the walk's latest crossing: where it entered the current cell.</summary>
    public double T;
    /// <summary>Axis of the latest crossing, or -1 (none: the walk's key is (T, LastAxis)).</summary>
    public int LastAxis;
    /// <summary>
    /// Time at which the ray crosses the next plane on each axis. The plane itself is not stored: it is the current
    /// cell's far face, an integer the step recomputes, which keeps the state small enough for the JIT to hold in
    /// registers (the `kernels` benchmark).
    /// </summary>
    public double TMaxX, TMaxY, TMaxZ;

    /// <summary>Starts in cell (x, y, z) of size 2^<paramref name="shift"/> at key (<paramref name="t"/>, <paramref name="lastAxis"/>).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static DdaState Start(in RaySetup ray, double t, int lastAxis, int x, int y, int z, int shift)
    {
        var dda = new DdaState { X = x, Y = y, Z = z, Shift = shift, T = t, LastAxis = lastAxis };
        dda.Restart(ray);
        return dda;
    }

    /// <summary>Sets the next planes' times from the current cell: the DDA's only set-up.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void Restart(in RaySetup ray)
    {
        TMaxX = ray.ParallelX ? double.PositiveInfinity : NextTime(X, ray.StepX, ray.Ox, ray.Ix);
        TMaxY = ray.ParallelY ? double.PositiveInfinity : NextTime(Y, ray.StepY, ray.Oy, ray.Iy);
        TMaxZ = ray.ParallelZ ? double.PositiveInfinity : NextTime(Z, ray.StepZ, ray.Oz, ray.Iz);
    }

    /// <summary>
    /// Time of the plane a ray moving <paramref name="step"/> leaves cell <paramref name="cell"/> through: its high
    /// face moving up, its low face moving down, in closed form from the plane's integer coordinate.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private readonly double NextTime(int cell, int step, double o, double inv) =>
        CrossingOrder.Time((cell + ((step + 1) >> 1)) << Shift, o, inv);

    /// <summary>Advances to the next cell along the smallest t; false (and no change) when that cell starts after <paramref name="tEnd"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public bool TryStep(in RaySetup ray, double tEnd) => TryStep<Branching2>(ray, tEnd, out _);

    /// <summary>
    /// As <see cref="TryStep(in RaySetup, double)"/>, and tells whether the step left the node that held the cell
    /// (<see cref="LeftNode{TBranching}"/>), worked out in the branch that knows the axis.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public bool TryStep<TBranching>(in RaySetup ray, double tEnd, out bool leftNode) where TBranching : struct, IBranching
    {
        // One comparison chain, then the next plane's time in closed form; the cell moves in the same branch.
        // A parallel axis keeps +∞ and is never chosen: some axis is not parallel, and its time is finite.
        int last = NodeCells<TBranching>.Last;
        if (TMaxX <= TMaxY && TMaxX <= TMaxZ)
        {
            leftNode = false;
            if (TMaxX > tEnd) return false;
            T = TMaxX; X += ray.StepX; LastAxis = 0;
            TMaxX = NextTime(X, ray.StepX, ray.Ox, ray.Ix);
            leftNode = Entered(X, ray.StepX, last);
        }
        else if (TMaxY <= TMaxZ)
        {
            leftNode = false;
            if (TMaxY > tEnd) return false;
            T = TMaxY; Y += ray.StepY; LastAxis = 1;
            TMaxY = NextTime(Y, ray.StepY, ray.Oy, ray.Iy);
            leftNode = Entered(Y, ray.StepY, last);
        }
        else
        {
            leftNode = false;
            if (TMaxZ > tEnd) return false;
            T = TMaxZ; Z += ray.StepZ; LastAxis = 2;
            TMaxZ = NextTime(Z, ray.StepZ, ray.Oz, ray.Iz);
            leftNode = Entered(Z, ray.StepZ, last);
        }
        return true;
    }

    /// <summary>Moves the cell one step along <paramref name="axis"/> in the ray's direction, leaving times alone.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void MoveCell(in RaySetup ray, int axis)
    {
        if (axis == 0) X += ray.StepX;
        else if (axis == 1) Y += ray.StepY;
        else Z += ray.StepZ;
    }

    /// <summary>
    /// Whether the latest move along <see cref="LastAxis"/> took the cell out of the node that held it: the new cell's
    /// coordinate on that axis is the first one a ray moving that way meets in a node.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public readonly bool LeftNode<TBranching>(in RaySetup ray) where TBranching : struct, IBranching
    {
        int last = NodeCells<TBranching>.Last;
        return LastAxis switch
        {
            0 => Entered(X, ray.StepX, last),
            1 => Entered(Y, ray.StepY, last),
            _ => Entered(Z, ray.StepZ, last),
        };
    }

    /// <summary>
    /// Whether <paramref name="cell"/> is the first cell of its node on a ray moving <paramref name="step"/> (±1):
    /// cell ≡ 0 moving up, cell ≡ last moving down. `step >> 31` is 0 or all ones, so flipping the bits turns the
    /// second test into the first without a branch on the direction.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static bool Entered(int cell, int step, int last) => ((cell ^ (step >> 31)) & last) == 0;

    /// <summary>Bit of the current cell within its node.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public readonly int CellBit<TBranching>() where TBranching : struct, IBranching => NodeCells<TBranching>.BitOf(X, Y, Z);

    /// <summary>
    /// Goes one level down into the current cell: the child cell is the one the walk is in at its key (T, LastAxis) by
    /// the crossing order, with its next planes and their times; T is kept.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void Descend<TBranching>(in RaySetup ray) where TBranching : struct, IBranching
    {
        int lx = X << Shift, ly = Y << Shift, lz = Z << Shift;
        int shift = Shift - TBranching.Log2N;
        int n = NodeCells<TBranching>.N;
        Shift = shift;
        X = (lx >> shift) + ChildCell(ray.Ox, ray.Dx, ray.Ix, ray.ParallelX, 0, T, LastAxis, lx, n, shift, out TMaxX);
        Y = (ly >> shift) + ChildCell(ray.Oy, ray.Dy, ray.Iy, ray.ParallelY, 1, T, LastAxis, ly, n, shift, out TMaxY);
        Z = (lz >> shift) + ChildCell(ray.Oz, ray.Dz, ray.Iz, ray.ParallelZ, 2, T, LastAxis, lz, n, shift, out TMaxZ);
    }

    /// <summary>
    /// <see cref="Descend{TBranching}"/> for a walk still at the key it started at, whose voxel there is
    /// (<paramref name="vx"/>, <paramref name="vy"/>, <paramref name="vz"/>) (<see cref="RayStart"/>): the cell at every
    /// level is that voxel's ancestor. Whether a plane is behind a key depends only on its time and axis, and times grow
    /// with the plane's coordinate along the ray's direction, so the planes behind the key are the ones up to the
    /// voxel's entry face at every level alike; the same cell, and the same next-plane times, as the crossing search.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void DescendToStart<TBranching>(in RaySetup ray, int vx, int vy, int vz) where TBranching : struct, IBranching
    {
        Shift -= TBranching.Log2N;
        X = vx >> Shift;
        Y = vy >> Shift;
        Z = vz >> Shift;
        Restart(ray);
    }

    /// <summary>
    /// <see cref="CrossingOrder.Cell"/> for a descent (and for the hit voxel inside a larger solid cell, whose voxels
    /// are its children in the same sense), with a shortcut on the axis of the walk's latest crossing: that
    /// plane is usually a face of the cell being entered, so the child is the first of its cells a ray moving that way
    /// meets. The shortcut checks its answer by the crossing order itself (its entry plane behind the key, its exit
    /// plane ahead), which is what <see cref="CrossingOrder.Cell"/> settles too, so both give the same cell; when the
    /// check fails the general finder decides.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static int ChildCell(double o, double d, double inv, bool parallel, int axis, double t, int lastAxis, int lo,
        int count, int shift, out double exitTime)
    {
        if (axis == lastAxis && !parallel)
        {
            // On the crossing's own axis "behind" is "at or before t" (CrossingOrder.Behind with axis == lastAxis).
            int size = 1 << shift;
            int edge = inv > 0 ? 0 : count - 1;
            int low = lo + (edge << shift);
            double entry = CrossingOrder.Time(inv > 0 ? low : low + size, o, inv);
            double exit = CrossingOrder.Time(inv > 0 ? low + size : low, o, inv);
            if (entry <= t && exit > t)
            {
                exitTime = exit;
                return edge;
            }
        }
        return CrossingOrder.Cell(o, d, inv, parallel, axis, t, lastAxis, lo, count, shift, out _, out exitTime);
    }

    /// <summary>
    /// Goes one level up: the coordinates shift to the parent level, which already names the coarse cell holding the
    /// current one. Plane times are left alone; call <see cref="Restart"/> before stepping at the new level.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void Coarsen<TBranching>() where TBranching : struct, IBranching
    {
        X >>= TBranching.Log2N;
        Y >>= TBranching.Log2N;
        Z >>= TBranching.Log2N;
        Shift += TBranching.Log2N;
    }

    /// <summary>Records a hit on the current (solid) cell: the hit voxel is the one the walk is in at its key.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public readonly void SetHit(ref PixelHit hit, in RaySetup ray, byte material) =>
        RayStart.SetHit(ref hit, ray, X << Shift, Y << Shift, Z << Shift, Shift, T, LastAxis, material);
}
