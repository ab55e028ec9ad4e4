using System.Runtime.CompilerServices;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>
/// The read-only view of a tree every kernel traverses: node records, materials, level sizes and the directional mask
/// table, gathered once per trace. A kernel (built-in or from a strategy file) can read the tree through it but not
/// change it: every array is handed out as a read-only span.
/// </summary>
public readonly struct TreeView
{
    private readonly Node[] _nodes;
    private readonly byte[] _materials;
    private readonly ulong[] _directionMasks;

    public TreeView(BrickTree tree)
    {
        _nodes = tree.Nodes;
        _materials = tree.Materials;
        Depth = tree.Depth;
        Log2N = tree.Log2Branching;
        N = tree.Branching;
        RootShift = tree.CellShift(0);
        ExtentX = tree.ExtentX;
        ExtentY = tree.ExtentY;
        ExtentZ = tree.ExtentZ;
        _directionMasks = DirectionalMasks.For(tree.Branching);
    }

    /// <summary>Node records; index 0 is the root.</summary>
    public ReadOnlySpan<Node> Nodes => _nodes;

    /// <summary>One material per solid cell, packed per node by rank.</summary>
    public ReadOnlySpan<byte> Materials => _materials;

    /// <summary>Number of node levels: the root is level 0, leaves (whose cells are voxels) level Depth − 1.</summary>
    public readonly int Depth;
    /// <summary>Log2 of the cells per node edge; kernels use the compile-time <see cref="IBranching"/> instead.</summary>
    public readonly int Log2N;
    /// <summary>Cells per node edge.</summary>
    public readonly int N;
    /// <summary>Log2 of the root's cell size; level l's cells have size 2^(RootShift − l·Log2N).</summary>
    public readonly int RootShift;
    /// <summary>The scene's extent in voxels: the volume is [0, Extent) on each axis.</summary>
    public readonly int ExtentX, ExtentY, ExtentZ;

    /// <summary>Indexed [octant × N³ + cell]: every cell a ray in that octant can reach from that cell.</summary>
    public ReadOnlySpan<ulong> DirectionMasks => _directionMasks;

    /// <summary>Cell bit of (cx, cy, cz) within a node, for code that does not know the branching at compile time.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public int CellBit(int cx, int cy, int cz) => cx | (cy << Log2N) | (cz << (2 * Log2N));

    /// <summary>Reads node record <paramref name="index"/>, counting the read.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public Node Fetch<TCounters>(int index, ref TCounters counters) where TCounters : struct, ICostCounters
    {
        counters.NodeFetch(index);
        return _nodes[index];
    }

    /// <summary>Index of the child node of an occupied, non-solid cell of <paramref name="node"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static int ChildIndex(in Node node, int bit) => node.FirstChild + BrickTree.Rank(node.ChildMask, bit);

    /// <summary>Material of a solid cell of <paramref name="node"/> (its bit is set in the solid mask).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public byte SolidMaterial(in Node node, int bit) => _materials[node.FirstMaterial + BrickTree.Rank(node.SolidMask, bit)];

    /// <summary>
    /// The cells of a node a ray in <paramref name="octant"/> can still reach from cell <paramref name="bit"/>
    /// (<see cref="DirectionalMasks"/>); a node whose occupancy misses this set can be left at once.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public ulong Reach<TBranching>(int octant, int bit) where TBranching : struct, IBranching =>
        _directionMasks[(octant << (3 * TBranching.Log2N)) + bit];

    /// <summary>Material at a voxel inside the extent, walked from the root, counting each node record read.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public byte Lookup<TBranching, TCounters>(int x, int y, int z, ref TCounters counters)
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters
    {
        int index = 0;
        int shift = RootShift;
        while (true)
        {
            ref readonly Node node = ref _nodes[index];
            counters.NodeFetch(index);
            int bit = NodeCells<TBranching>.BitOf(x >> shift, y >> shift, z >> shift);
            ulong b = 1UL << bit;
            if ((node.SolidMask & b) != 0)
                return SolidMaterial(node, bit);
            if ((node.ChildMask & b) == 0)
                return 0;
            index = ChildIndex(node, bit);
            shift -= TBranching.Log2N;
        }
    }
}
