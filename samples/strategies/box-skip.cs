// A strategy file with a test none of the built-in strategies makes: before descending into a child node, the
// hierarchical DDA checks whether the ray's remaining segment in that cell meets the child's occupied bounding box
// (the smallest box around its occupied cells). When it does not, the walk steps over the whole cell as if it were
// empty. Two counters of its own show what the test costs and what it saves:
//
//   voxprof trace samples/stonebrook-quarry.vpscene.json --strategy-file samples/strategies/box-skip.cs \
//       --strategy grid,hdda,box-skip --counters iterations,box-skips
//
// The skip is exact, not a guess: a segment that misses the box misses every occupied cell in it, so the hit is the
// grid reference's on every pixel (the mismatch metric says so). A shader would store the box per node; here it is
// recomputed from the masks, and the record read is counted as a node fetch.
using System.Numerics;
using VoxProf.Core.Rays;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;

public struct BoxSkip : IStrategy
{
    public static string Name => "box-skip";
    public static string Description => "hierarchical DDA that skips a child whose occupied box the ray's segment misses";

    public static IReadOnlyList<ExtraCounter> ExtraCounters { get; } =
    [
        new("box-tests", "slab tests of a child's occupied bounding box before descending"),
        new("box-skips", "children stepped over because the ray's segment missed their occupied box"),
    ];

    private const int BoxTests = 0, BoxSkips = 1;

    /// <summary>Grows the box by this much (in voxels) on every side, so rounding can only cost a skip, never a hit.</summary>
    private const double Margin = 1.0 / 16;

    public static TCounters Trace<TBranching, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<NodeRef> path, ref PixelHit hit)
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters
    {
        TCounters counters = default;
        if (!RayStart.Clip(view, ray, tMin, ref counters, out RayStart start))
            return counters;

        NodeRef node = view.Fetch(0, ref counters);
        int depth = 0;
        int s = view.RootShift;
        var dda = DdaState.Start(ray, start.T, start.FaceAxis, start.X >> s, start.Y >> s, start.Z >> s, s);

        while (true)
        {
            counters.Iteration();
            int bit = dda.CellBit<TBranching>();
            if (view.IsOccupied<TBranching>(node, bit))
            {
                if (view.IsSolid<TBranching>(node, bit))
                {
                    dda.SetHit(ref hit, ray, view.SolidMaterial<TBranching>(node, bit));
                    return counters;
                }

                // Test the segment left in this cell against the child's occupied box
                NodeRef child = view.Fetch(view.Child<TBranching>(node, bit), ref counters);
                counters.Extra(BoxTests, 1);
                counters.SlabTest();
                if (SegmentMeetsBox<TBranching>(view, ray, dda, child))
                {
                    // Descend into the child node
                    path[depth++] = node;
                    node = child;
                    counters.Descent();
                    dda.Descend<TBranching>(ray);
                    continue;
                }
                counters.Extra(BoxSkips, 1);
            }

            // Step to the next cell at this level (an empty cell, or a child the segment misses)
            if (!dda.TryStep(ray, start.TExit))
                return counters;
            counters.CellStep();
            if (!dda.LeftNode<TBranching>(ray))
                continue;

            // Ascend while the new cell lies outside the current node
            do
            {
                if (depth == 0)
                    return counters;
                node = path[--depth];
                counters.Ascent();
                dda.Coarsen<TBranching>();
            }
            while (dda.LeftNode<TBranching>(ray));
            dda.Restart(ray);
        }
    }

    /// <summary>Whether the ray between the walk's t and the current cell's exit meets the box of the occupied child cells.</summary>
    private static bool SegmentMeetsBox<TBranching>(in TreeView view, in RaySetup ray, in DdaState dda, NodeRef child)
        where TBranching : struct, IBranching
    {
        // The child's occupied cells' index ranges on each axis (its masks are one 64-bit word, or eight for 8³)
        int n = NodeCells<TBranching>.N, last = n - 1;
        int minX = n, minY = n, minZ = n, maxX = -1, maxY = -1, maxZ = -1;
        for (int w = 0; w < TreeView.MaskWords<TBranching>(); w++)
        {
            for (ulong m = view.OccupancyWord<TBranching>(child, w); m != 0; m &= m - 1)
            {
                int c = 64 * w + BitOperations.TrailingZeroCount(m);
                int cx = c & last, cy = (c >> TBranching.Log2N) & last, cz = c >> (2 * TBranching.Log2N);
                minX = Math.Min(minX, cx); maxX = Math.Max(maxX, cx);
                minY = Math.Min(minY, cy); maxY = Math.Max(maxY, cy);
                minZ = Math.Min(minZ, cz); maxZ = Math.Max(maxZ, cz);
            }
        }

        // The box in voxels, grown by the margin, against the segment [t, the cell's exit]
        int childShift = dda.Shift - TBranching.Log2N;
        double size = 1 << childShift;
        double ox = dda.X << dda.Shift, oy = dda.Y << dda.Shift, oz = dda.Z << dda.Shift;
        double exit = Math.Min(dda.TMaxX, Math.Min(dda.TMaxY, dda.TMaxZ));
        return SlabTest.Intersect(ray,
            ox + minX * size - Margin, oy + minY * size - Margin, oz + minZ * size - Margin,
            ox + (maxX + 1) * size + Margin, oy + (maxY + 1) * size + Margin, oz + (maxZ + 1) * size + Margin,
            dda.T, exit, out _);
    }
}
