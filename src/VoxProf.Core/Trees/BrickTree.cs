using System.Numerics;
using VoxProf.Core.Geometry;

namespace VoxProf.Core.Trees;

/// <summary>
/// A sparse brick tree: N×N×N cells per node, root at index 0 covering [0, RootSize)³, leaves' cells are voxels.
/// Level 0 is the root; a node at level l has cells of size RootSize / N^(l+1); level Depth-1 holds voxels.
/// Empty space costs no memory: only occupied cells have a child or a material.
/// </summary>
public sealed class BrickTree
{
    public BrickTree(int branching, int depth, int extentX, int extentY, int extentZ, Node[] nodes, byte[] materials, TreeStats stats)
    {
        if (branching is not (2 or 4))
            throw new ArgumentOutOfRangeException(nameof(branching), "branching must be 2 or 4");
        Branching = branching;
        Log2Branching = BitOperations.Log2((uint)branching);
        Depth = depth;
        RootSize = 1 << (Log2Branching * depth);
        ExtentX = extentX;
        ExtentY = extentY;
        ExtentZ = extentZ;
        Nodes = nodes;
        Materials = materials;
        Stats = stats;
        _coarse = new Lazy<CoarseOccupancy>(() => CoarseOccupancy.Build(this));
    }

    private readonly Lazy<CoarseOccupancy> _coarse;

    public int Branching { get; }
    public int Log2Branching { get; }

    /// <summary>Number of node levels; the root is level 0, leaves are level Depth - 1.</summary>
    public int Depth { get; }

    /// <summary>Side of the cube the root covers: Branching^Depth voxels.</summary>
    public int RootSize { get; }

    public int ExtentX { get; }
    public int ExtentY { get; }
    public int ExtentZ { get; }
    public Box3i Bounds => new(0, 0, 0, ExtentX, ExtentY, ExtentZ);

    /// <summary>Node records; index 0 is the root.</summary>
    public Node[] Nodes { get; }

    /// <summary>One material per solid cell, packed per node by rank.</summary>
    public byte[] Materials { get; }

    public TreeStats Stats { get; }

    /// <summary>The coarse prepass's occupancy grids, built on first use (thread-safe) and kept with the tree.</summary>
    public CoarseOccupancy Coarse => _coarse.Value;

    /// <summary>Smallest depth whose root cube covers the largest extent.</summary>
    public static int DepthFor(int branching, int maxExtent)
    {
        int log2N = BitOperations.Log2((uint)branching);
        int depth = 1;
        while ((1L << (log2N * depth)) < maxExtent)
            depth++;
        return depth;
    }

    /// <summary>Log2 of the cell size of a node at <paramref name="level"/>.</summary>
    public int CellShift(int level) => Log2Branching * (Depth - 1 - level);

    /// <summary>Bit index of a cell within a node, x fastest.</summary>
    public int CellBit(int cx, int cy, int cz) => cx | (cy << Log2Branching) | (cz << (2 * Log2Branching));

    /// <summary>Rank of a bit among the set bits below it: the offset of its child or material.</summary>
    public static int Rank(ulong mask, int bit) => BitOperations.PopCount(mask & ((1UL << bit) - 1));

    /// <summary>Material at a voxel (0 = empty). Walks from the root; for tests, reports and the grid reference.</summary>
    public byte Material(int x, int y, int z)
    {
        if ((uint)x >= (uint)ExtentX || (uint)y >= (uint)ExtentY || (uint)z >= (uint)ExtentZ)
            return 0;
        int mask = Branching - 1;
        int nodeIndex = 0;
        for (int level = 0; level < Depth; level++)
        {
            ref readonly Node node = ref Nodes[nodeIndex];
            int shift = CellShift(level);
            int bit = CellBit((x >> shift) & mask, (y >> shift) & mask, (z >> shift) & mask);
            ulong b = 1UL << bit;
            if ((node.SolidMask & b) != 0)
                return Materials[node.FirstMaterial + Rank(node.SolidMask, bit)];
            if ((node.ChildMask & b) == 0)
                return 0;
            nodeIndex = node.FirstChild + Rank(node.ChildMask, bit);
        }
        throw new InvalidOperationException("a leaf node has a child bit set");
    }

    public bool IsSolid(int x, int y, int z) => Material(x, y, z) != 0;
}
