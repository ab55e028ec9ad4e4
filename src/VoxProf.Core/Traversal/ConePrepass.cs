using System.Runtime.CompilerServices;
using VoxProf.Core.Rays;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>
/// The coarse prepass after Laine &amp; Karras (2010), "Efficient sparse voxel octrees" (the beam optimization): one
/// coarse ray per K×K block finds a distance before which no pixel ray of the block can meet anything solid, and every
/// pixel ray of the block starts there. Conservative by construction (argument in docs/strategies.md): the coarse ray
/// carries a cone that contains every pixel ray of its block, and it only advances from a cell whose 3×3×3 cells at that
/// level are all empty (one look-up in the tree's <see cref="CoarseOccupancy"/>), and only as far as the whole cone
/// stays inside those cells, with allowances for the cell pick and for rounding.
/// </summary>
public static class ConePrepass
{
    private const int MaxIterations = 1 << 20;

    /// <summary>How far ahead of the current point (in cells) the cell to test is picked, so a boundary never stalls the ray.</summary>
    private const double Nudge = 1e-7;

    /// <summary>
    /// Allowance for rounding, relative to the largest coordinate or distance involved: a ray point or plane time in
    /// double goes through a handful of operations of relative error 2^-53 each; 2^-30 leaves a factor of about 10^6.
    /// </summary>
    public const double Rounding = 1.0 / (1L << 30);

    /// <summary>
    /// Marches one coarse ray along the unit axis <paramref name="axis"/> with cone slope <paramref name="slope"/>
    /// (radius at distance s is slope·s) and returns a distance along the axis before which the cone is empty (+∞ when
    /// the cone never meets the volume). Counts its iterations and its look-ups in <paramref name="grids"/> (one per
    /// level tested, less the tests it already knows the answer to).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double March(CoarseOccupancy grids, in RaySetup axis, double slope, out uint iterations, out uint lookups)
    {
        int level = 0;
        return March(grids, axis, slope, 0, ref level, out iterations, out lookups);
    }

    /// <summary>
    /// As <see cref="March(CoarseOccupancy, in RaySetup, double, out uint, out uint)"/>, starting no nearer than
    /// <paramref name="from"/> along the axis, where the caller knows the cone is of no interest before it, and
    /// searching for an empty level from <paramref name="startLevel"/> down, which on return is where the next search
    /// would have started (the prepass starts a block's coarse ray where the enclosing block's stopped, and from its
    /// level: near geometry the coarse levels are never empty, and any empty level is a correct choice).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static double March(CoarseOccupancy grids, in RaySetup axis, double slope, double from, ref int startLevel,
        out uint iterations, out uint lookups)
    {
        iterations = 0;
        lookups = 0;

        // The cone cannot touch the volume before its axis enters the box grown by the largest radius it reaches there.
        double far = FarthestCorner(grids, axis);
        double grow = slope * far + 1;
        if (!SlabTest.Intersect(axis, -grow, -grow, -grow, grids.ExtentX + grow, grids.ExtentY + grow, grids.ExtentZ + grow,
                0, double.PositiveInfinity, out SlabHit box))
            return double.PositiveInfinity;
        double t = Math.Max(box.Near, from);
        double tEnd = box.Far;
        double slack = Rounding * (1 + Math.Max(Math.Abs(axis.Ox), Math.Max(Math.Abs(axis.Oy), Math.Abs(axis.Oz))) + tEnd);

        startLevel = Math.Clamp(startLevel, 0, grids.FinestLevel);
        // Per level, the last cell whose neighbourhood was found occupied: the grids never change, so while the ray is
        // still in that cell the answer is known without a look-up (most iterations retry the level above the one that
        // worked last, from inside the same coarser cell).
        int levels = grids.FinestLevel + 1;
        Span<long> occupiedCells = stackalloc long[3 * levels];
        occupiedCells.Fill(long.MinValue);
        // Per level, half the room (below), and the farthest the cone may go while its radius fits the room and half
        // the room: the same values every iteration.
        Span<double> halfRooms = stackalloc double[levels];
        Span<double> radiusLimits = stackalloc double[levels];
        Span<double> halfRoomLimits = stackalloc double[levels];
        for (int level = 0; level < levels; level++)
        {
            double room = grids.CellSize(level) * (1 - Nudge) - slack;
            halfRooms[level] = room / 2;
            radiusLimits[level] = slope > 0 ? room / slope : double.PositiveInfinity;
            halfRoomLimits[level] = slope > 0 ? room / 2 / slope : double.PositiveInfinity;
        }
        while (t < tEnd && iterations < MaxIterations)
        {
            iterations++;

            // Find a coarse level whose 3×3×3 neighbourhood around the cone's cell is empty. The search starts one
            // level above the last one that worked, not at the root: near geometry the root's neighbourhood is never
            // empty, and any empty level is a correct choice.
            double advanceTo = t;
            for (int level = startLevel; level <= grids.FinestLevel; level++)
            {
                double size = grids.CellSize(level), inverse = grids.InverseCellSize(level);
                // A point a nudge ahead picks the cell the ray is about to cross, so a cell boundary never stalls it.
                // The size is a power of two: multiplying by its inverse divides exactly.
                double ta = t + Nudge * size;
                // A point of the march lies within the grown volume box, far inside long's range, so the processor's
                // own conversion is exact and a saturating cast's checks would only lengthen each stride's latency.
                long cx = double.ConvertToIntegerNative<long>(Math.Floor((axis.Ox + ta * axis.Dx) * inverse));
                long cy = double.ConvertToIntegerNative<long>(Math.Floor((axis.Oy + ta * axis.Dy) * inverse));
                long cz = double.ConvertToIntegerNative<long>(Math.Floor((axis.Oz + ta * axis.Dz) * inverse));
                int k = 3 * level;
                if (occupiedCells[k] == cx && occupiedCells[k + 1] == cy && occupiedCells[k + 2] == cz)
                    continue;
                lookups++;
                if (grids.NeighbourhoodOccupied(level, cx, cy, cz))
                {
                    (occupiedCells[k], occupiedCells[k + 1], occupiedCells[k + 2]) = (cx, cy, cz);
                    continue;
                }

                // Empty neighbourhood: the cone stays inside the 3×3×3 block while the axis stays within g of the cell
                // and the radius within the rest of the room (the cell size less the nudge and rounding allowances;
                // axis points from t on lie in the cell grown by g, or within the nudge of the cell, and within
                // rounding). While the radius is under half the room, g is the other half: the axis goes on to the
                // exit of the cell grown by g, about twice the cell's own stride. After that g is 0: the cell's exit,
                // with the whole room for the radius.
                bool narrow = t < halfRoomLimits[level];
                double g = narrow ? halfRooms[level] : 0;
                double exit = SlabTest.Exit(axis, cx * size - g, cy * size - g, cz * size - g, (cx + 1) * size + g, (cy + 1) * size + g, (cz + 1) * size + g);
                advanceTo = Math.Min(exit, narrow ? halfRoomLimits[level] : radiusLimits[level]);
                startLevel = Math.Max(0, level - 1);
                break;
            }
            if (advanceTo <= t)
                break;
            t = advanceTo;
        }
        if (t >= tEnd)
            return double.PositiveInfinity;
        // Stay the rounding allowance before the stopping point, so rounding in a pixel ray's own walk cannot start it
        // past a voxel it enters just before.
        return Math.Max(0, t - slack);
    }

    private static double FarthestCorner(CoarseOccupancy grids, in RaySetup ray)
    {
        double dx = Math.Max(Math.Abs(ray.Ox), Math.Abs(grids.ExtentX - ray.Ox));
        double dy = Math.Max(Math.Abs(ray.Oy), Math.Abs(grids.ExtentY - ray.Oy));
        double dz = Math.Max(Math.Abs(ray.Oz), Math.Abs(grids.ExtentZ - ray.Oz));
        return Math.Sqrt(dx * dx + dy * dy + dz * dz);
    }
}
