using System.Numerics;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;

namespace VoxProf.Core.Trees.Building;

/// <summary>Immutable facts every build worker shares: the layers, the tree shape and the level split.</summary>
internal sealed class BuildPlan
{
    // Dense blocks are at least this many voxels on a side: below it, classifying cell by cell costs more than
    // evaluating the block (common practice for brick builders; 16³ fits a per-thread buffer in L1/L2).
    internal const int MinDenseSide = 16;

    // Subtrees handed to worker threads are at least this many voxels on a side: a few thousand tasks for a
    // large terrain, enough to balance two to sixteen cores, few enough that the top levels cost nothing.
    private const int MinTaskSide = 256;

    public BuildPlan(Scene scene, int branching)
    {
        if (branching is not (2 or 4))
            throw new ArgumentOutOfRangeException(nameof(branching), branching, "branching must be 2 or 4");
        Layers = [.. scene.Layers];
        Extent = scene.Bounds;
        N = branching;
        Log2N = BitOperations.Log2((uint)branching);
        CellsPerNode = 1 << (3 * Log2N);
        FullMask = CellsPerNode == 64 ? ulong.MaxValue : (1UL << CellsPerNode) - 1;
        int maxExtent = Math.Max(1, Math.Max(scene.ExtentX, Math.Max(scene.ExtentY, scene.ExtentZ)));
        Depth = BrickTree.DepthFor(branching, maxExtent);
        RootSize = 1 << (Log2N * Depth);
        DenseSide = SmallestPowerAtLeast(MinDenseSide);
        // The task level depends only on the tree shape, never on the thread count: the layout follows from it.
        int taskSide = SmallestPowerAtLeast(MinTaskSide);
        TaskLevel = 0;
        while (SideAt(TaskLevel) > taskSide)
            TaskLevel++;
    }

    public Layer[] Layers { get; }
    public Box3i Extent { get; }
    public int N { get; }
    public int Log2N { get; }
    public int CellsPerNode { get; }
    public ulong FullMask { get; }
    public int Depth { get; }
    public int RootSize { get; }

    /// <summary>Side of the blocks evaluated densely: a power of N.</summary>
    public int DenseSide { get; }

    /// <summary>Level of the nodes built as independent subtrees (0 when the whole tree is one task).</summary>
    public int TaskLevel { get; }

    /// <summary>Side of the region a node at <paramref name="level"/> covers.</summary>
    public int SideAt(int level) => 1 << (Log2N * (Depth - level));

    /// <summary>Log2 of the cell side of a node at <paramref name="level"/>.</summary>
    public int CellShift(int level) => Log2N * (Depth - 1 - level);

    private int SmallestPowerAtLeast(int side)
    {
        int s = N;
        while (s < side)
            s <<= Log2N;
        return s;
    }
}
