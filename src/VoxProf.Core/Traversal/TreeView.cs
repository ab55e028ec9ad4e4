using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>
/// The read-only view of a tree every kernel traverses: node records, materials, level sizes and the directional mask
/// table, gathered once per trace. A kernel (built-in or from a strategy file) can read the tree through it but not
/// change it: every array is handed out as a read-only span.
/// A kernel holds a node as the <see cref="NodeRef"/> that <see cref="Fetch{TCounters}"/> returned and asks about its
/// cells through the methods below, which take the branching as a compile-time parameter: for 2³ and 4³ they read a 24-byte <see cref="Node"/> with 64-bit masks, for 8³ a
/// 136-byte <see cref="Node8"/> with 512-bit masks, and the JIT keeps only the one that applies.
/// </summary>
public readonly struct TreeView
{
    private readonly Node[] _nodes;
    private readonly Node8[] _nodes8;
    private readonly byte[] _materials;
    private readonly ulong[] _directionMasks;
    private readonly Mask512[] _directionMasks8;
    private readonly int _nodeCount;

    public TreeView(BrickTree tree)
    {
        _nodes = tree.Nodes;
        _nodes8 = tree.Nodes8;
        _nodeCount = tree.NodeCount;
        _materials = tree.Materials;
        Depth = tree.Depth;
        Log2N = tree.Log2Branching;
        N = tree.Branching;
        RootShift = tree.CellShift(0);
        ExtentX = tree.ExtentX;
        ExtentY = tree.ExtentY;
        ExtentZ = tree.ExtentZ;
        _directionMasks = tree.Branching == 8 ? [] : DirectionalMasks.For(tree.Branching);
        _directionMasks8 = tree.Branching == 8 ? DirectionalMasks.Wide : [];
    }

    // A NodeRef only comes from Fetch, which checked its index, so the reads below need no bounds check of their own
    // (the `kernels` benchmark: the checked reads cost dda-mask 5–8% against records copied into locals).
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private ref readonly Node N4(NodeRef node) => ref Unsafe.Add(ref MemoryMarshal.GetArrayDataReference(_nodes), (nint)(uint)node.Index);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private ref readonly Node8 N8(NodeRef node) => ref Unsafe.Add(ref MemoryMarshal.GetArrayDataReference(_nodes8), (nint)(uint)node.Index);

    /// <summary>Node records of a 2³ or 4³ tree (empty for 8³); index 0 is the root.</summary>
    public ReadOnlySpan<Node> Nodes => _nodes;

    /// <summary>Node records of an 8³ tree (empty otherwise); index 0 is the root.</summary>
    public ReadOnlySpan<Node8> Nodes8 => _nodes8;

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

    /// <summary>2³ and 4³: indexed [octant × N³ + cell], every cell a ray in that octant can reach from that cell.</summary>
    public ReadOnlySpan<ulong> DirectionMasks => _directionMasks;

    /// <summary>8³: the same table with 512-bit masks (<see cref="DirectionalMasks.Wide"/>).</summary>
    public ReadOnlySpan<Mask512> DirectionMasks8 => _directionMasks8;

    /// <summary>Cell bit of (cx, cy, cz) within a node, for code that does not know the branching at compile time.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public int CellBit(int cx, int cy, int cz) => cx | (cy << Log2N) | (cz << (2 * Log2N));

    /// <summary>
    /// Reads node record <paramref name="index"/>, counting the read, and returns the handle the other methods take.
    /// The modelled algorithm keeps the record it read until it moves to another node, so asking about its cells
    /// again is not another read. An index outside the node array throws.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public NodeRef Fetch<TCounters>(int index, ref TCounters counters) where TCounters : struct, ICostCounters
    {
        if ((uint)index >= (uint)_nodeCount)
            ThrowBadIndex(index);
        counters.NodeFetch(index);
        return new NodeRef(index);
    }

    private void ThrowBadIndex(int index) =>
        throw new IndexOutOfRangeException($"node index {index} is outside the tree's {_nodeCount} node records");

    /// <summary>Whether cell <paramref name="bit"/> of node <paramref name="node"/> holds a child or is solid.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public bool IsOccupied<TBranching>(NodeRef node, int bit) where TBranching : struct, IBranching
    {
        if (TBranching.Log2N == 3)
        {
            ref readonly Node8 n = ref N8(node);
            int w = bit >> 6;
            return (((n.ChildMask[w] | n.SolidMask[w]) >> bit) & 1) != 0;
        }
        return ((N4(node).Occupancy >> bit) & 1) != 0;
    }

    /// <summary>Whether cell <paramref name="bit"/> of node <paramref name="node"/> is solid.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public bool IsSolid<TBranching>(NodeRef node, int bit) where TBranching : struct, IBranching =>
        TBranching.Log2N == 3 ? N8(node).SolidMask.Has(bit) : ((N4(node).SolidMask >> bit) & 1) != 0;

    /// <summary>Index of the child node in an occupied, non-solid cell of <paramref name="node"/>, to <see cref="Fetch{TCounters}"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public int Child<TBranching>(NodeRef node, int bit) where TBranching : struct, IBranching
    {
        if (TBranching.Log2N == 3)
        {
            ref readonly Node8 n = ref N8(node);
            return n.FirstChild + n.ChildMask.Rank(bit);
        }
        ref readonly Node r = ref N4(node);
        return r.FirstChild + BrickTree.Rank(r.ChildMask, bit);
    }

    /// <summary>Material of a solid cell of <paramref name="node"/> (its bit is set in the solid mask).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public byte SolidMaterial<TBranching>(NodeRef node, int bit) where TBranching : struct, IBranching
    {
        if (TBranching.Log2N == 3)
        {
            ref readonly Node8 n = ref N8(node);
            return _materials[n.FirstMaterial + n.SolidMask.Rank(bit)];
        }
        ref readonly Node r = ref N4(node);
        return _materials[r.FirstMaterial + BrickTree.Rank(r.SolidMask, bit)];
    }

    /// <summary>Number of 64-bit words in a node's masks: 1 for 2³ and 4³, 8 for 8³ (cell b is bit b mod 64 of word b / 64).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static int MaskWords<TBranching>() where TBranching : struct, IBranching => TBranching.Log2N == 3 ? Mask512.Words : 1;

    /// <summary>Word <paramref name="word"/> of node <paramref name="node"/>'s occupancy (child or solid cells).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public ulong OccupancyWord<TBranching>(NodeRef node, int word) where TBranching : struct, IBranching
    {
        if (TBranching.Log2N == 3)
        {
            ref readonly Node8 n = ref N8(node);
            return n.ChildMask[word] | n.SolidMask[word];
        }
        return N4(node).Occupancy;
    }

    /// <summary>Whether node <paramref name="node"/> has no occupied cell.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public bool IsEmpty<TBranching>(NodeRef node) where TBranching : struct, IBranching =>
        TBranching.Log2N == 3 ? N8(node).ChildMask.IsEmpty && N8(node).SolidMask.IsEmpty : N4(node).Occupancy == 0;

    /// <summary>
    /// Whether some occupied cell of <paramref name="node"/> is among those a ray in <paramref name="octant"/> can
    /// still reach from cell <paramref name="bit"/> (<see cref="DirectionalMasks"/>); if none is, the node can be left
    /// at once.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public bool ReachesOccupied<TBranching>(NodeRef node, int octant, int bit) where TBranching : struct, IBranching
    {
        if (TBranching.Log2N == 3)
        {
            ref readonly Node8 n = ref N8(node);
            return Mask512.AnyInUnion(n.ChildMask, n.SolidMask, _directionMasks8[(octant << 9) + bit]);
        }
        return (N4(node).Occupancy & Reach<TBranching>(octant, bit)) != 0;
    }

    /// <summary>Number of occupied cells of <paramref name="node"/> a ray in <paramref name="octant"/> cannot reach from cell <paramref name="bit"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public int CountUnreachable<TBranching>(NodeRef node, int octant, int bit) where TBranching : struct, IBranching
    {
        if (TBranching.Log2N == 3)
        {
            ref readonly Node8 n = ref N8(node);
            // Child and solid cells are disjoint: the union's count is the sum of the two.
            return Mask512.CountUnionOutside(n.ChildMask, n.SolidMask, _directionMasks8[(octant << 9) + bit]);
        }
        return BitOperations.PopCount(N4(node).Occupancy & ~Reach<TBranching>(octant, bit));
    }

    /// <summary>
    /// 2³ and 4³: the cells of a node a ray in <paramref name="octant"/> can still reach from cell
    /// <paramref name="bit"/> as one 64-bit mask (8³ masks are <see cref="DirectionMasks8"/>).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public ulong Reach<TBranching>(int octant, int bit) where TBranching : struct, IBranching =>
        _directionMasks[(octant << (3 * TBranching.Log2N)) + bit];

    /// <summary>
    /// <see cref="Reach{TBranching}"/> without the bounds check, for the built-in kernels only: their octant comes
    /// from <see cref="Rays.RaySetup.Octant"/> and their bit from the cell they are in, and the tracer picks their
    /// branching from the tree, so the index is always inside the table (the `kernels` benchmark: the check and the
    /// array reload cost dda-mask a few percent).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal ulong ReachInTable<TBranching>(int octant, int bit) where TBranching : struct, IBranching =>
        Unsafe.Add(ref MemoryMarshal.GetArrayDataReference(_directionMasks), (nint)(uint)((octant << (3 * TBranching.Log2N)) + bit));

    /// <summary>
    /// <see cref="Lookup{TBranching, TCounters}"/> for the voxels of one ray in turn: the walk from the root is
    /// repeated only when the voxel leaves the cell the last walk ended in. A voxel inside that cell has the same cell
    /// at every coarser level too, so a walk would read the same nodes in the same order and end the same way; those
    /// reads are counted (and recorded) again from <paramref name="path"/>, exactly as the walk would count them.
    /// grid's rays cross empty space a cell of hundreds of voxels at a time, one voxel per step.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal byte LookupAgain<TBranching, TCounters>(int x, int y, int z, Span<NodeRef> path, ref LastLookup last, ref TCounters counters)
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters
    {
        if (last.Nodes != 0 && ((x >> last.Shift) ^ last.CellX | (y >> last.Shift) ^ last.CellY | (z >> last.Shift) ^ last.CellZ) == 0)
        {
            PathReads.Again(ref counters, path, last.Nodes);
            return last.Material;
        }
        var node = default(NodeRef);
        int shift = RootShift;
        for (int level = 0; ; level++)
        {
            counters.NodeFetch(node.Index);
            path[level] = node;
            int bit = NodeCells<TBranching>.BitOf(x >> shift, y >> shift, z >> shift);
            byte material = 0;
            if (IsSolid<TBranching>(node, bit))
                material = SolidMaterial<TBranching>(node, bit);
            else if (IsOccupied<TBranching>(node, bit))
            {
                node = new NodeRef(Child<TBranching>(node, bit));
                shift -= TBranching.Log2N;
                continue;
            }
            last = new LastLookup(level + 1, shift, x >> shift, y >> shift, z >> shift, material);
            return material;
        }
    }

    /// <summary>Material at a voxel inside the extent, walked from the root, counting each node record read.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public byte Lookup<TBranching, TCounters>(int x, int y, int z, ref TCounters counters)
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters
    {
        var node = default(NodeRef);
        int shift = RootShift;
        while (true)
        {
            counters.NodeFetch(node.Index);
            int bit = NodeCells<TBranching>.BitOf(x >> shift, y >> shift, z >> shift);
            if (IsSolid<TBranching>(node, bit))
                return SolidMaterial<TBranching>(node, bit);
            if (!IsOccupied<TBranching>(node, bit))
                return 0;
            // The builder wrote a valid child index here: no need for Fetch's check.
            node = new NodeRef(Child<TBranching>(node, bit));
            shift -= TBranching.Log2N;
        }
    }
}

/// <summary>Where a ray's last <see cref="TreeView.LookupAgain"/> walk ended: its node count, and the cell it ended in
/// (cell coordinates at that level, whose cells are 2^Shift voxels a side) with the material it found there.</summary>
internal readonly record struct LastLookup(int Nodes, int Shift, int CellX, int CellY, int CellZ, byte Material);
