using System.Numerics;
using System.Runtime.CompilerServices;

namespace VoxProf.Core.Trees.Building;

/// <summary>Counts a finished tree level by level by walking it from the root.</summary>
internal static class TreeMeasure
{
    public static TreeStats Measure(Node[] nodes, int materialCount, BuildPlan plan, TimeSpan buildTime)
    {
        int depth = plan.Depth;
        long[] nodesPerLevel = new long[depth];
        long[] solidPerLevel = new long[depth];
        long[] bytesPerLevel = new long[depth];
        long solidVoxels = 0;
        int nodeSize = Unsafe.SizeOf<Node>();

        // Depth-first with an explicit stack: at most N³ pending siblings per level.
        var stack = new Stack<(int Index, int Level)>();
        stack.Push((0, 0));
        while (stack.Count > 0)
        {
            (int index, int level) = stack.Pop();
            Node node = nodes[index];
            int solids = BitOperations.PopCount(node.SolidMask);
            nodesPerLevel[level]++;
            solidPerLevel[level] += solids;
            bytesPerLevel[level] += nodeSize + solids;
            long side = 1L << plan.CellShift(level);
            solidVoxels += solids * side * side * side;
            int children = BitOperations.PopCount(node.ChildMask);
            for (int c = children - 1; c >= 0; c--)
                stack.Push((node.FirstChild + c, level + 1));
        }

        long totalBytes = (long)nodes.Length * nodeSize + materialCount;
        return new TreeStats(plan.N, depth, plan.RootSize, nodesPerLevel, solidPerLevel, bytesPerLevel,
            solidVoxels, totalBytes, buildTime);
    }
}
