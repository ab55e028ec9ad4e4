using System.Runtime.CompilerServices;

namespace VoxProf.Core.Trees.Building;

/// <summary>Counts a finished tree level by level by walking it from the root.</summary>
internal static class TreeMeasure
{
    /// <summary>The stats of <paramref name="tree"/> (whose own <see cref="BrickTree.Stats"/> are not read).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static TreeStats Measure(BrickTree tree, TimeSpan buildTime)
    {
        int depth = tree.Depth;
        long[] nodesPerLevel = new long[depth];
        long[] solidPerLevel = new long[depth];
        long[] bytesPerLevel = new long[depth];
        long solidVoxels = 0;
        int nodeSize = tree.RecordBytes;

        // Depth-first with an explicit stack: at most N³ pending siblings per level.
        var stack = new Stack<(int Index, int Level)>();
        stack.Push((0, 0));
        while (stack.Count > 0)
        {
            (int index, int level) = stack.Pop();
            (int solids, int children) = tree.CellCounts(index);
            nodesPerLevel[level]++;
            solidPerLevel[level] += solids;
            bytesPerLevel[level] += nodeSize + solids;
            long side = 1L << tree.CellShift(level);
            solidVoxels += solids * side * side * side;
            int first = tree.FirstChildOf(index);
            for (int c = children - 1; c >= 0; c--)
                stack.Push((first + c, level + 1));
        }

        long totalBytes = (long)tree.NodeCount * nodeSize + tree.Materials.Length;
        return new TreeStats(tree.Branching, depth, tree.RootSize, nodesPerLevel, solidPerLevel, bytesPerLevel,
            solidVoxels, totalBytes, buildTime);
    }
}
