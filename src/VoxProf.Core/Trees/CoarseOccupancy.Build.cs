namespace VoxProf.Core.Trees;

public sealed partial class CoarseOccupancy
{
    /// <summary>
    /// Marks the occupied cells of every gridded level: each occupied cell of a node at its own level, and each solid
    /// cell also over its whole extent at every finer gridded level (a solid cell has no children to mark them).
    /// </summary>
    private static void Mark(BrickTree tree, Level[] grids, int index, int level, long ox, long oy, long oz)
    {
        int shift = tree.CellShift(level);
        int log2N = tree.Log2Branching, last = tree.Branching - 1;
        Level grid = grids[level];
        long bx = ox >> shift, by = oy >> shift, bz = oz >> shift;
        Span<int> occupied = stackalloc int[512];
        int count = tree.OccupiedCells(index, occupied);
        foreach (int bit in occupied[..count])
        {
            int cx = bit & last, cy = (bit >> log2N) & last, cz = bit >> (2 * log2N);
            long gx = bx + cx, gy = by + cy, gz = bz + cz;
            // Cells wholly outside the extent hold nothing a ray can hit.
            if (gx >= grid.SizeX - 2 || gy >= grid.SizeY - 2 || gz >= grid.SizeZ - 2)
                continue;
            FillBox(grid, gx, gy, gz, 1);
            if (tree.IsSolidCell(index, bit))
            {
                for (int finer = level + 1; finer < grids.Length; finer++)
                {
                    int scale = log2N * (finer - level);
                    FillBox(grids[finer], gx << scale, gy << scale, gz << scale, 1L << scale);
                }
            }
            else if (level + 1 < grids.Length)
            {
                Mark(tree, grids, tree.ChildOf(index, bit), level + 1,
                    ox + ((long)cx << shift), oy + ((long)cy << shift), oz + ((long)cz << shift));
            }
        }
    }

    /// <summary>Sets the cube of <paramref name="span"/> cells from extent cell (x, y, z), clipped to the extent.</summary>
    private static void FillBox(Level grid, long x, long y, long z, long span)
    {
        // Extent cell c is grid cell c + 1.
        int x0 = (int)x + 1, x1 = (int)Math.Min(x + span, grid.SizeX - 2) + 1;
        int y1 = (int)Math.Min(y + span, grid.SizeY - 2) + 1, z1 = (int)Math.Min(z + span, grid.SizeZ - 2) + 1;
        for (int gz = (int)z + 1; gz < z1; gz++)
            for (int gy = (int)y + 1; gy < y1; gy++)
                SetBits(grid.Bits.AsSpan((int)grid.Row(gy, gz), grid.WordsPerRow), x0, x1);
    }

    /// <summary>Sets bits [from, to) of a row.</summary>
    private static void SetBits(Span<ulong> row, int from, int to)
    {
        for (int x = from; x < to;)
        {
            int word = x >> 6, lo = x & 63;
            int hi = Math.Min(64, lo + (to - x));
            ulong mask = (hi == 64 ? ulong.MaxValue : (1UL << hi) - 1) & ~((1UL << lo) - 1);
            row[word] |= mask;
            x += hi - lo;
        }
    }

    /// <summary>
    /// Turns occupancy into "something in the 3×3×3 block around": a dilation by one cell along x, then y, then z
    /// (the 3×3×3 block is the product of the three one-axis neighbourhoods). Bits beyond a row's last cell may be set
    /// by the x pass; no look-up reads them.
    /// </summary>
    private static void Dilate(Level grid)
    {
        ulong[] bits = grid.Bits;
        int w = grid.WordsPerRow;
        // Along x, within each row: a word takes its neighbours' bits, carrying across word boundaries.
        for (long start = 0; start < bits.Length; start += w)
        {
            ulong previous = 0;
            for (int i = 0; i < w; i++)
            {
                ulong word = bits[start + i];
                ulong next = i + 1 < w ? bits[start + i + 1] : 0;
                bits[start + i] = word | (word << 1) | (previous >> 63) | (word >> 1) | (next << 63);
                previous = word;
            }
        }
        // Along y, rows within each plane; along z, whole planes: the same step on runs of words.
        int plane = w * grid.SizeY;
        for (int z = 0; z < grid.SizeZ; z++)
            DilateRuns(bits.AsSpan(z * plane, plane), w);
        DilateRuns(bits, plane);
    }

    /// <summary>Each run of <paramref name="length"/> words takes the bits of the runs before and after it.</summary>
    private static void DilateRuns(Span<ulong> bits, int length)
    {
        int runs = bits.Length / length;
        Span<ulong> previous = new ulong[length], current = new ulong[length];
        for (int r = 0; r < runs; r++)
        {
            Span<ulong> run = bits.Slice(r * length, length);
            run.CopyTo(current);
            for (int i = 0; i < length; i++)
                run[i] |= previous[i] | (r + 1 < runs ? bits[(r + 1) * length + i] : 0);
            Span<ulong> swap = previous;
            previous = current;
            current = swap;
        }
    }
}
