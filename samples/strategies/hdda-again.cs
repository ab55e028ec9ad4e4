// A strategy file: Museth's hierarchical DDA written again from VoxProf's public building blocks, exactly as the
// built-in `hdda` strategy is, so its counts equal hdda's counter for counter. Start your own from this file:
//
//   voxprof trace samples/stonebrook-quarry.vpscene.json --strategy-file samples/strategies/hdda-again.cs \
//       --strategy grid,hdda,hdda-again
//
// docs/writing-a-strategy.md explains every block. This is code you chose to run: VoxProf compiles it and runs it
// in its own process, like a test.
using VoxProf.Core.Rays;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;

public struct HddaAgain : IStrategy
{
    public static string Name => "hdda-again";
    public static string Description => "hierarchical DDA, written as a strategy file";

    public static TCounters Trace<TBranching, TCounters>(in TreeView view, in RaySetup ray, double tMin, Span<NodeRef> path, ref PixelHit hit)
        where TBranching : struct, IBranching
        where TCounters : struct, ICostCounters
    {
        // Count in a local: the tracer flushes it once per ray
        TCounters counters = default;

        // Clip the ray to the volume (one counted slab test) and find its first voxel
        if (!RayStart.Clip(view, ray, tMin, ref counters, out RayStart start))
            return counters;

        // One DDA state at the root's level, and the root's record (held as the NodeRef the read returned)
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
                // A solid cell is the hit
                if (view.IsSolid<TBranching>(node, bit))
                {
                    dda.SetHit(ref hit, ray, view.SolidMaterial<TBranching>(node, bit));
                    return counters;
                }

                // Descend into the child node, refining the cell where the walk is
                path[depth++] = node;
                node = view.Fetch(view.Child<TBranching>(node, bit), ref counters);
                counters.Descent();
                dda.Descend<TBranching>(ray);
                continue;
            }

            // Step to the next cell at this level
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
}
