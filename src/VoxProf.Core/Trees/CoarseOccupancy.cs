using System.Runtime.CompilerServices;

namespace VoxProf.Core.Trees;

/// <summary>
/// What the coarse prepass asks of the tree, precomputed: for each tree level from the root down to the finest level
/// that fits a memory budget, one bit per cell telling whether the 3×3×3 block of cells around it (at that level) may
/// hold anything. A cell counts as occupied when the tree stores it as solid, as a child node, or inside a solid
/// ancestor, so a clear bit proves that all 27 cells hold no solid voxel. Cells outside the extent are empty, so the
/// grids cover the extent's cells plus one ring, and every cell beyond reads as clear. Kept apart from the node
/// records, whose layout the kernels rely on.
/// </summary>
public sealed partial class CoarseOccupancy
{
    /// <summary>
    /// Largest grid, in bits, a level may take (8 MiB): the finest level kept is the finest one within it, so memory
    /// stays bounded on any extent (the demo's 2048×512×2048 keeps cells of 4 voxels; a 64³ volume keeps voxels).
    /// </summary>
    public const long BitBudget = 1L << 26;

    /// <summary>
    /// Largest sparse level, in words of cell bits (4 Mi words, 32 MiB, about twice the demo's tree): beyond it the
    /// finest dense grid is the finest level, as before the sparse level existed.
    /// </summary>
    public const long SparseWordBudget = 1L << 22;

    private readonly Level[] _levels;
    private readonly SparseLevel? _sparse;
    private readonly double[] _size, _inverse;

    private CoarseOccupancy(Level[] levels, SparseLevel? sparse, int log2N, int rootShift, int extentX, int extentY, int extentZ)
    {
        _levels = levels;
        _sparse = sparse;
        int count = levels.Length + (sparse is null ? 0 : 1);
        _size = new double[count];
        _inverse = new double[count];
        for (int l = 0; l < count; l++)
        {
            _size[l] = Math.ScaleB(1.0, rootShift - l * log2N);
            _inverse[l] = 1 / _size[l];
        }
        Log2N = log2N;
        RootShift = rootShift;
        ExtentX = extentX;
        ExtentY = extentY;
        ExtentZ = extentZ;
    }

    /// <summary>
    /// The finest level the grids answer for (the tree's level numbering: 0 is the root): the finest dense grid, or
    /// the sparse level one below it when there is one (<see cref="HasSparseLevel"/>).
    /// </summary>
    public int FinestLevel => _levels.Length - (_sparse is null ? 1 : 0);

    /// <summary>Whether the finest level is kept sparsely: a word of cell bits per occupied cell of the level above.</summary>
    public bool HasSparseLevel => _sparse is not null;

    /// <summary>Log2 of the tree's branching factor.</summary>
    public int Log2N { get; }

    /// <summary>Log2 of the root's cell size.</summary>
    public int RootShift { get; }

    public int ExtentX { get; }
    public int ExtentY { get; }
    public int ExtentZ { get; }

    /// <summary>Memory the grids hold, in bytes.</summary>
    public long Bytes => _levels.Sum(l => (long)l.Bits.Length * sizeof(ulong)) + (_sparse?.Bytes ?? 0);

    /// <summary>Log2 of the cell size at <paramref name="level"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public int CellShift(int level) => RootShift - level * Log2N;

    /// <summary>Cell size at <paramref name="level"/>, in voxels.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public double CellSize(int level) => _size[level];

    /// <summary>1 / <see cref="CellSize"/>: exact, as the size is a power of two.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public double InverseCellSize(int level) => _inverse[level];

    /// <summary>
    /// Whether some cell of the 3×3×3 block around cell (cx, cy, cz) of <paramref name="level"/> may be occupied (cell
    /// coordinates in units of that level's cell size; any value, inside the extent or not). One read of one word.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public bool NeighbourhoodOccupied(int level, long cx, long cy, long cz)
    {
        if (level >= _levels.Length)
            return _sparse!.NeighbourhoodOccupied(cx, cy, cz);
        ref readonly Level l = ref _levels[level];
        // The grid's cell 0 is the ring outside the extent's cell 0.
        ulong x = (ulong)(cx + 1), y = (ulong)(cy + 1), z = (ulong)(cz + 1);
        if (x >= (ulong)l.SizeX || y >= (ulong)l.SizeY || z >= (ulong)l.SizeZ)
            return false;
        ulong word = l.Bits[(long)(((z * (ulong)l.SizeY) + y) * (ulong)l.WordsPerRow + (x >> 6))];
        return ((word >> (int)(x & 63)) & 1) != 0;
    }

    /// <summary>The lazily built grids of a tree are <see cref="BrickTree.Coarse"/>; this builds them afresh.</summary>
    public static CoarseOccupancy Build(BrickTree tree) => Build(tree, BitBudget, SparseWordBudget);

    /// <summary>Builds the grids under other budgets than the defaults (tests use small ones to reach the sparse level).</summary>
    internal static CoarseOccupancy Build(BrickTree tree, long bitBudget, long sparseWordBudget)
    {
        ArgumentNullException.ThrowIfNull(tree);
        var levels = new List<Level>();
        for (int level = 0; level < tree.Depth; level++)
        {
            int shift = tree.CellShift(level);
            var l = new Level(Cells(tree.ExtentX, shift) + 2, Cells(tree.ExtentY, shift) + 2, Cells(tree.ExtentZ, shift) + 2);
            // A coarser level is never larger, so the first level over budget ends the list (the root always fits).
            if (level > 0 && (long)l.WordsPerRow * 64 * l.SizeY * l.SizeZ > bitBudget)
                break;
            levels.Add(l);
        }
        Level[] grids = [.. levels];
        Mark(tree, grids, 0, 0, 0, 0, 0);
        // The sparse level reads the finest grid's occupancy before the dilation below turns it into neighbourhoods.
        SparseLevel? sparse = grids.Length < tree.Depth ? SparseLevel.Build(tree, grids[^1], grids.Length - 1, sparseWordBudget) : null;
        foreach (Level l in grids)
            Dilate(l);
        return new CoarseOccupancy(grids, sparse, tree.Log2Branching, tree.CellShift(0), tree.ExtentX, tree.ExtentY, tree.ExtentZ);
    }

    private static int Cells(int extent, int shift) => (int)(((long)extent + (1L << shift) - 1) >> shift);

    /// <summary>One level's bits: x fastest in rows of whole words, then y, then z; cell (0,0,0) is the outer ring.</summary>
    private readonly struct Level
    {
        public Level(int sizeX, int sizeY, int sizeZ)
        {
            SizeX = sizeX;
            SizeY = sizeY;
            SizeZ = sizeZ;
            WordsPerRow = (sizeX + 63) >> 6;
            Bits = new ulong[(long)WordsPerRow * sizeY * sizeZ];
        }

        public readonly ulong[] Bits;
        public readonly int SizeX, SizeY, SizeZ, WordsPerRow;

        public long Row(int y, int z) => ((long)z * SizeY + y) * WordsPerRow;
    }
}
