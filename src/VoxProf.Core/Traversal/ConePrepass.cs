using VoxProf.Core.Rays;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>
/// The coarse prepass after Laine &amp; Karras (2010), "Efficient sparse voxel octrees" (the beam optimization): one
/// coarse ray per K×K block finds a distance before which no pixel ray of the block can meet anything solid, and every
/// pixel ray of the block starts there. Conservative by construction (argument in docs/strategies.md): the coarse ray
/// carries a cone that contains every pixel ray of its block, and it only advances through a cell when the 3×3×3 cells
/// around it at that level are all empty and the cone's radius, with allowances for the cell pick and for rounding,
/// is at most one cell.
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
    /// the cone never meets the volume). Counts its iterations and the node records its neighbourhood look-ups read.
    /// </summary>
    public static double March(in TreeView view, in RaySetup axis, double slope, out uint iterations, out uint nodeFetches)
    {
        iterations = 0;
        nodeFetches = 0;
        Span<int> stack = stackalloc int[QueryStackSize(view)];

        // The cone cannot touch the volume before its axis enters the box grown by the largest radius it reaches there.
        double far = FarthestCorner(view, axis);
        double grow = slope * far + 1;
        if (!SlabTest.Intersect(axis, -grow, -grow, -grow, view.ExtentX + grow, view.ExtentY + grow, view.ExtentZ + grow,
                0, double.PositiveInfinity, out SlabHit box))
            return double.PositiveInfinity;
        double t = box.Near;
        double tEnd = box.Far;
        double slack = Rounding * (1 + Math.Max(Math.Abs(axis.Ox), Math.Max(Math.Abs(axis.Oy), Math.Abs(axis.Oz))) + tEnd);

        int startLevel = 0;
        while (t < tEnd && iterations < MaxIterations)
        {
            iterations++;

            // Find a coarse level whose 3×3×3 neighbourhood around the cone's cell is empty. The search starts one
            // level above the last one that worked, not at the root: near geometry the root's neighbourhood is never
            // empty, and any empty level is a correct choice.
            double advanceTo = t;
            for (int level = startLevel; level < view.Depth; level++)
            {
                int shift = view.RootShift - level * view.Log2N;
                double size = 1 << shift;
                // A point a nudge ahead picks the cell the ray is about to cross, so a cell boundary never stalls it.
                double ta = t + Nudge * size;
                long cx = (long)Math.Floor((axis.Ox + ta * axis.Dx) / size);
                long cy = (long)Math.Floor((axis.Oy + ta * axis.Dy) / size);
                long cz = (long)Math.Floor((axis.Oz + ta * axis.Dz) / size);
                if (AnyOccupied(view, cx - 1, cy - 1, cz - 1, cx + 2, cy + 2, cz + 2, shift, stack, ref nodeFetches))
                    continue;

                // Empty neighbourhood: advance to the cell's exit while the cone stays inside it. Axis points up to the
                // exit lie in the cell or within the nudge of it (and within rounding), so the cone stays inside the
                // 3×3×3 block while its radius is at most the cell size less those two allowances.
                SlabTest.Intersect(axis, cx * size, cy * size, cz * size, (cx + 1) * size, (cy + 1) * size, (cz + 1) * size,
                    t, double.PositiveInfinity, out SlabHit cell);
                double room = size * (1 - Nudge) - slack;
                double radiusLimit = slope > 0 ? room / slope : double.PositiveInfinity;
                advanceTo = Math.Min(cell.Far, radiusLimit);
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

    private static int QueryStackSize(in TreeView view) => 5 * (view.Depth + 1) * 27;

    private static double FarthestCorner(in TreeView view, in RaySetup ray)
    {
        double dx = Math.Max(Math.Abs(ray.Ox), Math.Abs(view.ExtentX - ray.Ox));
        double dy = Math.Max(Math.Abs(ray.Oy), Math.Abs(view.ExtentY - ray.Oy));
        double dz = Math.Max(Math.Abs(ray.Oz), Math.Abs(view.ExtentZ - ray.Oz));
        return Math.Sqrt(dx * dx + dy * dy + dz * dz);
    }

    /// <summary>
    /// Whether any cell of size 2^<paramref name="shift"/> or larger inside the cell box [lo, hi) (in units of that size)
    /// is occupied. A depth-first walk that only enters cells overlapping the box; adds each node record it reads to
    /// <paramref name="nodeFetches"/>.
    /// </summary>
    internal static bool AnyOccupied(in TreeView view, long lox, long loy, long loz, long hix, long hiy, long hiz, int shift,
        Span<int> stack, ref uint nodeFetches)
    {
        // To voxels, clipped to the extent
        long x0 = Math.Max(0, lox << shift), y0 = Math.Max(0, loy << shift), z0 = Math.Max(0, loz << shift);
        long x1 = Math.Min(view.ExtentX, hix << shift), y1 = Math.Min(view.ExtentY, hiy << shift), z1 = Math.Min(view.ExtentZ, hiz << shift);
        if (x0 >= x1 || y0 >= y1 || z0 >= z1)
            return false;

        int sp = 0;
        stack[sp++] = 0; stack[sp++] = 0; stack[sp++] = 0; stack[sp++] = 0; stack[sp++] = view.RootShift;
        int last = view.N - 1;
        while (sp > 0)
        {
            int nodeShift = stack[--sp], oz = stack[--sp], oy = stack[--sp], ox = stack[--sp], index = stack[--sp];
            ref readonly Node node = ref view.Nodes[index];
            nodeFetches++;
            ulong occupancy = node.ChildMask | node.SolidMask;
            if (occupancy == 0)
                continue;
            int size = 1 << nodeShift;
            int ax = (int)Math.Max(0, (x0 - ox) >> nodeShift), bx = (int)Math.Min(last, (x1 - 1 - ox) >> nodeShift);
            int ay = (int)Math.Max(0, (y0 - oy) >> nodeShift), by = (int)Math.Min(last, (y1 - 1 - oy) >> nodeShift);
            int az = (int)Math.Max(0, (z0 - oz) >> nodeShift), bz = (int)Math.Min(last, (z1 - 1 - oz) >> nodeShift);
            for (int cz = az; cz <= bz; cz++)
                for (int cy = ay; cy <= by; cy++)
                    for (int cx = ax; cx <= bx; cx++)
                    {
                        int bit = view.CellBit(cx, cy, cz);
                        ulong b = 1UL << bit;
                        if ((occupancy & b) == 0)
                            continue;
                        if ((node.SolidMask & b) != 0 || nodeShift <= shift)
                            return true;
                        stack[sp++] = node.FirstChild + BrickTree.Rank(node.ChildMask, bit);
                        stack[sp++] = ox + cx * size;
                        stack[sp++] = oy + cy * size;
                        stack[sp++] = oz + cz * size;
                        stack[sp++] = nodeShift - view.Log2N;
                    }
        }
        return false;
    }
}
