using System.Runtime.CompilerServices;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>The read-only arrays and constants a kernel needs, gathered once per trace so kernels take one argument.</summary>
public readonly struct TreeView
{
    public TreeView(BrickTree tree)
    {
        Nodes = tree.Nodes;
        Materials = tree.Materials;
        Depth = tree.Depth;
        Log2N = tree.Log2Branching;
        N = tree.Branching;
        RootShift = tree.CellShift(0);
        ExtentX = tree.ExtentX;
        ExtentY = tree.ExtentY;
        ExtentZ = tree.ExtentZ;
        DirectionMasks = DirectionalMasks.For(tree.Branching);
    }

    public readonly Node[] Nodes;
    public readonly byte[] Materials;
    public readonly int Depth;
    public readonly int Log2N;
    public readonly int N;
    /// <summary>Log2 of the root's cell size.</summary>
    public readonly int RootShift;
    public readonly int ExtentX, ExtentY, ExtentZ;
    /// <summary>Indexed [octant × N³ + cell]: every cell a ray in that octant can reach from that cell.</summary>
    public readonly ulong[] DirectionMasks;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public int CellBit(int cx, int cy, int cz) => cx | (cy << Log2N) | (cz << (2 * Log2N));

    /// <summary>Material at a voxel inside the extent, counting each node record read.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public byte Lookup<TCounters>(int x, int y, int z, ref TCounters counters) where TCounters : struct, ICostCounters
    {
        int m = N - 1;
        int index = 0;
        int shift = RootShift;
        while (true)
        {
            ref readonly Node node = ref Nodes[index];
            counters.NodeFetch(index);
            int bit = CellBit((x >> shift) & m, (y >> shift) & m, (z >> shift) & m);
            ulong b = 1UL << bit;
            if ((node.SolidMask & b) != 0)
                return Materials[node.FirstMaterial + BrickTree.Rank(node.SolidMask, bit)];
            if ((node.ChildMask & b) == 0)
                return 0;
            index = node.FirstChild + BrickTree.Rank(node.ChildMask, bit);
            shift -= Log2N;
        }
    }

    /// <summary>Material of a solid cell of a node (its bit is known to be set in <paramref name="solidMask"/>).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public byte SolidMaterial(ulong solidMask, int firstMaterial, int bit) =>
        Materials[firstMaterial + BrickTree.Rank(solidMask, bit)];
}
