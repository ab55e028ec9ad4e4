using System.Runtime.CompilerServices;

namespace VoxProf.Core.Traversal;

/// <summary>
/// A node's branching factor as a compile-time constant: a kernel takes it as a generic struct parameter, so the JIT
/// folds every cell shift and mask into a constant instead of reloading a field inside the loop.
/// </summary>
public interface IBranching
{
    /// <summary>Log2 of the cells per node edge (1 for 2³ nodes, 2 for 4³, 3 for 8³).</summary>
    static abstract int Log2N { get; }
}

/// <summary>2×2×2 cells per node.</summary>
public struct Branching2 : IBranching
{
    public static int Log2N => 1;
}

/// <summary>4×4×4 cells per node.</summary>
public struct Branching4 : IBranching
{
    public static int Log2N => 2;
}

/// <summary>8×8×8 cells per node: 512-bit masks (<see cref="Trees.Node8"/>).</summary>
public struct Branching8 : IBranching
{
    public static int Log2N => 3;
}

/// <summary>Cell arithmetic of a node with branching <typeparamref name="TBranching"/>.</summary>
public static class NodeCells<TBranching> where TBranching : struct, IBranching
{
    /// <summary>Cells per node edge.</summary>
    public static int N
    {
        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        get => 1 << TBranching.Log2N;
    }

    /// <summary>Mask of a cell coordinate within its node (N − 1).</summary>
    public static int Last
    {
        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        get => (1 << TBranching.Log2N) - 1;
    }

    /// <summary>Bit of cell (cx, cy, cz) of a node, x fastest; coordinates are within the node.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static int Bit(int cx, int cy, int cz) => cx | (cy << TBranching.Log2N) | (cz << (2 * TBranching.Log2N));

    /// <summary>Bit of the cell at level coordinates (gx, gy, gz) within the node that holds it.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static int BitOf(int gx, int gy, int gz) => Bit(gx & Last, gy & Last, gz & Last);
}
