using System.Numerics;
using System.Runtime.CompilerServices;
using VoxProf.Core.Geometry;

namespace VoxProf.Core.Trees;

/// <summary>
/// A sparse brick tree: N×N×N cells per node, root at index 0 covering [0, RootSize)³, leaves' cells are voxels.
/// Level 0 is the root; a node at level l has cells of size RootSize / N^(l+1); level Depth-1 holds voxels.
/// Empty space costs no memory: only occupied cells have a child or a material. N = 2 and 4 store 24-byte
/// <see cref="Node"/> records in <see cref="Nodes"/>; N = 8 stores 136-byte <see cref="Node8"/> records in
/// <see cref="Nodes8"/>. The cell accessors below read either; kernels use the branching-specialised
/// <see cref="Traversal.TreeView"/> instead.
/// </summary>
public sealed class BrickTree
{
    /// <summary>A tree of 2³ or 4³ nodes.</summary>
    public BrickTree(int branching, int depth, int extentX, int extentY, int extentZ, Node[] nodes, byte[] materials, TreeStats stats)
        : this(branching, depth, extentX, extentY, extentZ, nodes, [], materials, stats)
    {
        if (branching is not (2 or 4))
            throw new ArgumentOutOfRangeException(nameof(branching), "24-byte node records hold branching 2 or 4");
    }

    /// <summary>A tree of 8³ nodes.</summary>
    public BrickTree(int depth, int extentX, int extentY, int extentZ, Node8[] nodes, byte[] materials, TreeStats stats)
        : this(8, depth, extentX, extentY, extentZ, [], nodes, materials, stats)
    {
    }

    private BrickTree(int branching, int depth, int extentX, int extentY, int extentZ, Node[] nodes, Node8[] nodes8,
        byte[] materials, TreeStats stats)
    {
        Branching = branching;
        Log2Branching = BitOperations.Log2((uint)branching);
        Depth = depth;
        RootSize = 1 << (Log2Branching * depth);
        ExtentX = extentX;
        ExtentY = extentY;
        ExtentZ = extentZ;
        Nodes = nodes;
        Nodes8 = nodes8;
        Materials = materials;
        Stats = stats;
        _coarse = new Lazy<CoarseOccupancy>(() => CoarseOccupancy.Build(this));
    }

    private readonly Lazy<CoarseOccupancy> _coarse;

    /// <summary>The branching factors a tree can have.</summary>
    public static IReadOnlyList<int> Branchings { get; } = [2, 4, 8];

    public int Branching { get; }
    public int Log2Branching { get; }

    /// <summary>Cells per node: Branching³.</summary>
    public int CellsPerNode => 1 << (3 * Log2Branching);

    /// <summary>Number of node levels; the root is level 0, leaves are level Depth - 1.</summary>
    public int Depth { get; }

    /// <summary>Side of the cube the root covers: Branching^Depth voxels.</summary>
    public int RootSize { get; }

    public int ExtentX { get; }
    public int ExtentY { get; }
    public int ExtentZ { get; }
    public Box3i Bounds => new(0, 0, 0, ExtentX, ExtentY, ExtentZ);

    /// <summary>Node records of a 2³ or 4³ tree (empty for 8³); index 0 is the root.</summary>
    public Node[] Nodes { get; }

    /// <summary>Node records of an 8³ tree (empty otherwise); index 0 is the root.</summary>
    public Node8[] Nodes8 { get; }

    /// <summary>Number of node records, whatever their type.</summary>
    public int NodeCount => Branching == 8 ? Nodes8.Length : Nodes.Length;

    /// <summary>Bytes of one node record as stored.</summary>
    public int RecordBytes => RecordBytesFor(Branching);

    /// <summary>One material per solid cell, packed per node by rank.</summary>
    public byte[] Materials { get; }

    public TreeStats Stats { get; }

    /// <summary>The coarse prepass's occupancy grids, built on first use (thread-safe) and kept with the tree.</summary>
    public CoarseOccupancy Coarse => _coarse.Value;

    /// <summary>Bytes of a node record for <paramref name="branching"/>: 24 for 2³ and 4³, 136 for 8³.</summary>
    public static int RecordBytesFor(int branching) => branching == 8 ? Unsafe.SizeOf<Node8>() : Unsafe.SizeOf<Node>();

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

    /// <summary>Whether cell <paramref name="bit"/> of node <paramref name="node"/> is solid.</summary>
    public bool IsSolidCell(int node, int bit) =>
        Branching == 8 ? Nodes8[node].SolidMask.Has(bit) : ((Nodes[node].SolidMask >> bit) & 1) != 0;

    /// <summary>Whether cell <paramref name="bit"/> of node <paramref name="node"/> holds a child node.</summary>
    public bool HasChild(int node, int bit) =>
        Branching == 8 ? Nodes8[node].ChildMask.Has(bit) : ((Nodes[node].ChildMask >> bit) & 1) != 0;

    /// <summary>Index of the child node in cell <paramref name="bit"/> (which must hold one).</summary>
    public int ChildOf(int node, int bit) => Branching == 8
        ? Nodes8[node].FirstChild + Nodes8[node].ChildMask.Rank(bit)
        : Nodes[node].FirstChild + Rank(Nodes[node].ChildMask, bit);

    /// <summary>Material of solid cell <paramref name="bit"/> (which must be solid).</summary>
    public byte MaterialOf(int node, int bit) => Materials[Branching == 8
        ? Nodes8[node].FirstMaterial + Nodes8[node].SolidMask.Rank(bit)
        : Nodes[node].FirstMaterial + Rank(Nodes[node].SolidMask, bit)];

    /// <summary>Number of solid cells and of child nodes of node <paramref name="node"/>.</summary>
    public (int Solid, int Children) CellCounts(int node) => Branching == 8
        ? (Nodes8[node].SolidMask.Count, Nodes8[node].ChildMask.Count)
        : (BitOperations.PopCount(Nodes[node].SolidMask), BitOperations.PopCount(Nodes[node].ChildMask));

    /// <summary>Index of the first child of node <paramref name="node"/>; its children follow it in rank order.</summary>
    public int FirstChildOf(int node) => Branching == 8 ? Nodes8[node].FirstChild : Nodes[node].FirstChild;

    /// <summary>Writes the bits of the occupied cells of node <paramref name="node"/> in increasing order; returns how many.</summary>
    public int OccupiedCells(int node, Span<int> bits)
    {
        int count = 0;
        int words = Branching == 8 ? Mask512.Words : 1;
        for (int w = 0; w < words; w++)
        {
            ulong occupied = Branching == 8
                ? Nodes8[node].ChildMask[w] | Nodes8[node].SolidMask[w]
                : Nodes[node].Occupancy;
            for (; occupied != 0; occupied &= occupied - 1)
                bits[count++] = 64 * w + BitOperations.TrailingZeroCount(occupied);
        }
        return count;
    }

    /// <summary>Material at a voxel (0 = empty). Walks from the root; for tests, reports and the grid reference.</summary>
    public byte Material(int x, int y, int z)
    {
        if ((uint)x >= (uint)ExtentX || (uint)y >= (uint)ExtentY || (uint)z >= (uint)ExtentZ)
            return 0;
        int mask = Branching - 1;
        int nodeIndex = 0;
        for (int level = 0; level < Depth; level++)
        {
            int shift = CellShift(level);
            int bit = CellBit((x >> shift) & mask, (y >> shift) & mask, (z >> shift) & mask);
            if (IsSolidCell(nodeIndex, bit))
                return MaterialOf(nodeIndex, bit);
            if (!HasChild(nodeIndex, bit))
                return 0;
            nodeIndex = ChildOf(nodeIndex, bit);
        }
        throw new InvalidOperationException("a leaf node has a child bit set");
    }

    public bool IsSolid(int x, int y, int z) => Material(x, y, z) != 0;
}
