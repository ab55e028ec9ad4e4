using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// The rules of docs/counters.md ("Rules between counters"), each checked pixel by pixel over seeded random scenes and
/// cameras, with and without the prepass, for both branching factors. The rule numbers match the document.
/// </summary>
public class CounterRuleTests
{
    private const int Width = 40, Height = 30;

    public static TheoryData<int, int> Cases() => new() { { 2, 1 }, { 4, 2 }, { 2, 3 }, { 4, 4 }, { 8, 5 } };

    private sealed record Case(BrickTree Tree, TraceRun Run, Camera Camera, PrepassMap? Prepass)
    {
        public ReadOnlySpan<uint> Get(StrategyDefinition s, Counter c) => Run.Results.Single(r => r.Strategy == s).Get(c);
        public PixelHit Hit(StrategyDefinition s, int i) => Run.Results.Single(r => r.Strategy == s).Hits[i];
    }

    private static IEnumerable<Case> Runs(int branching, int seed)
    {
        const int size = 36;
        BrickTree tree = DenseTree.Build(size, size - 5, size + 3, KernelAgreementTests.RandomBlobs(seed, size, 10), branching);
        Scene scene = DenseTree.SceneOf(size, size - 5, size + 3);
        var rng = new Random(seed * 97);
        for (int c = 0; c < 6; c++)
        {
            CameraSpec cam = KernelAgreementTests.RandomCamera(rng, size, inside: c % 3 == 0);
            int block = new[] { 0, 2, 4, 8 }[c % 4];
            TraceRun run = Tracer.Run(new TraceRequest(scene, tree, cam, Width, Height, BuiltInStrategies.All, block, 2));
            var camera = new Camera(cam, Width, Height);
            PrepassMap? map = block > 0 ? PrepassMap.Compute(tree, camera, block, new ParallelOptions()) : null;
            yield return new Case(tree, run, camera, map);
        }
    }

    private static readonly StrategyDefinition[] TreeStrategies = [BuiltInStrategies.Slab, BuiltInStrategies.Dda, BuiltInStrategies.DdaMask, BuiltInStrategies.Hdda];

    [Theory]
    [MemberData(nameof(Cases))]
    public void Rules_1_to_5_hold_for_every_pixel_of_every_strategy(int branching, int seed)
    {
        int entered = 0;
        foreach (Case k in Runs(branching, seed))
        {
            for (int i = 0; i < Width * Height; i++)
            {
                string at = $"pixel {i} (branching {branching}, prepass {k.Run.Settings.PrepassBlock})";
                foreach (StrategyDefinition s in BuiltInStrategies.All)
                {
                    uint it = k.Get(s, Counter.Iterations)[i], steps = k.Get(s, Counter.CellSteps)[i], slabs = k.Get(s, Counter.SlabTests)[i];
                    uint down = k.Get(s, Counter.Descents)[i], up = k.Get(s, Counter.Ascents)[i], fetches = k.Get(s, Counter.NodeFetches)[i];
                    // Rule 1: the clip is always one slab test; a walk that never starts counts nothing else.
                    slabs.Should().BeGreaterThanOrEqualTo(1u, $"{s.Name} {at}");
                    bool started = s == BuiltInStrategies.Grid ? it > 0 : fetches > 0;
                    if (!started)
                    {
                        (it, steps, slabs, down, up, fetches).Should().Be((0u, 0u, 1u, 0u, 0u, 0u), $"{s.Name} {at} never starts");
                        k.Hit(s, i).Hit.Should().BeFalse();
                        continue;
                    }
                    if (s == BuiltInStrategies.Grid)
                    {
                        // Rule 2
                        entered++;
                        (slabs, down, up).Should().Be((1u, 0u, 0u), $"grid {at}");
                        it.Should().Be(steps + (k.Hit(s, i).Hit ? 1u : 0u), $"every grid iteration but a hit ends with a step {at}");
                        fetches.Should().Be(LookupDepthSum(k.Tree, k.Camera.Ray(i % Width, i / Width), (int)it), $"grid {at}");
                        continue;
                    }
                    // Rule 3 and 4
                    fetches.Should().Be(down + 1u, $"{s.Name} {at}");
                    up.Should().BeLessThanOrEqualTo(down, $"{s.Name} {at}");
                    // Rule 5
                    if (s == BuiltInStrategies.Dda || s == BuiltInStrategies.DdaMask)
                    {
                        slabs.Should().Be(1u + down, $"{s.Name} {at}");
                    }
                    else if (s == BuiltInStrategies.Hdda)
                    {
                        slabs.Should().Be(1u, $"hdda {at}");
                    }
                    else if (s == BuiltInStrategies.Slab)
                    {
                        long extra = slabs - 1L - down - (steps - (long)up);
                        extra.Should().BeInRange(0, k.Hit(s, i).Hit ? 0 : 1, $"slab {at}");
                    }
                }
            }
        }
        entered.Should().BeGreaterThan(1000, "the random cameras must mostly see the volume");
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Rules_6_to_8_relate_the_tree_strategies_that_visit_the_same_cells(int branching, int seed)
    {
        long ascents = 0;
        foreach (Case k in Runs(branching, seed))
        {
            for (int i = 0; i < Width * Height; i++)
            {
                string at = $"pixel {i} (branching {branching}, prepass {k.Run.Settings.PrepassBlock})";
                (uint It, uint Steps, uint Down, uint Up, uint Fetch) Of(StrategyDefinition s) =>
                    (k.Get(s, Counter.Iterations)[i], k.Get(s, Counter.CellSteps)[i], k.Get(s, Counter.Descents)[i],
                        k.Get(s, Counter.Ascents)[i], k.Get(s, Counter.NodeFetches)[i]);
                var dda = Of(BuiltInStrategies.Dda);
                ascents += dda.Up;
                // Rule 6: a slab test of the current cell finds the DDA's exit plane, so slab walks the same cells.
                Of(BuiltInStrategies.Slab).Should().Be(dda, $"slab against dda {at}");
                // Rule 7: hdda walks the same cells without the parent-level step after each ascent.
                var hdda = Of(BuiltInStrategies.Hdda);
                (hdda.It, hdda.Down, hdda.Up, hdda.Fetch).Should().Be((dda.It, dda.Down, dda.Up, dda.Fetch), $"hdda against dda {at}");
                dda.Steps.Should().Be(hdda.Steps + dda.Up, $"hdda against dda {at}");
                // Rule 8: dda-mask walks a subsequence of dda's cells; leaving a node early can cost one ascent more at the end.
                var mask = Of(BuiltInStrategies.DdaMask);
                mask.It.Should().BeLessThanOrEqualTo(dda.It, at);
                mask.Steps.Should().BeLessThanOrEqualTo(dda.Steps, at);
                mask.Down.Should().BeLessThanOrEqualTo(dda.Down, at);
                mask.Fetch.Should().BeLessThanOrEqualTo(dda.Fetch, at);
                mask.Up.Should().BeLessThanOrEqualTo(dda.Up + 1u, at);
            }
        }
        ascents.Should().BeGreaterThan(0, "the walks must leave nodes for the rules to mean anything");
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Rules_9_and_10_mask_and_prepass_counters_stay_where_they_belong(int branching, int seed)
    {
        long culled = 0, shared = 0;
        int cells = branching * branching * branching;
        foreach (Case k in Runs(branching, seed))
        {
            foreach (StrategyResult r in k.Run.Results)
            {
                for (int i = 0; i < Width * Height; i++)
                {
                    uint down = r.Get(Counter.Descents)[i];
                    uint mc = r.Get(Counter.MaskCulledCells)[i], ms = r.Get(Counter.MaskSkippedNodes)[i];
                    // Rule 9
                    if (r.Strategy != BuiltInStrategies.DdaMask)
                        (mc, ms).Should().Be((0u, 0u), r.Strategy.Name);
                    else
                    {
                        ms.Should().BeLessThanOrEqualTo(down + 1u);
                        ((long)mc).Should().BeLessThanOrEqualTo((down + 1L) * (cells - 1));
                        culled += mc;
                    }
                    // Rule 10
                    if (k.Prepass == null || r.Strategy == BuiltInStrategies.Grid)
                    {
                        r.Get(Counter.PrepassIterations)[i].Should().Be(0);
                        r.Get(Counter.PrepassNodeFetches)[i].Should().Be(0);
                        r.Get(Counter.PrepassSkip)[i].Should().Be(0);
                    }
                }
                if (k.Prepass != null && r.Strategy != BuiltInStrategies.Grid)
                    shared += CheckShares(k.Prepass, r);
            }
        }
        culled.Should().BeGreaterThan(0);
        shared.Should().BeGreaterThan(0);
    }

    /// <summary>
    /// Rule 10: per K×K block, the pixels' shares add up to the work charged to the block and differ by at most one;
    /// over the image they add up to every coarse ray's work, at every level.
    /// </summary>
    private static long CheckShares(PrepassMap map, StrategyResult r)
    {
        long total = 0;
        var sums = new Dictionary<Counter, long> { [Counter.PrepassIterations] = 0, [Counter.PrepassNodeFetches] = 0 };
        for (int y0 = 0; y0 < Height; y0 += map.Block)
        {
            for (int x0 = 0; x0 < Width; x0 += map.Block)
            {
                foreach ((Counter c, uint expected) in new[]
                {
                    (Counter.PrepassIterations, map.BlockIterations(x0, y0)),
                    (Counter.PrepassNodeFetches, map.BlockNodeFetches(x0, y0)),
                })
                {
                    var shares = new List<uint>();
                    for (int y = y0; y < Math.Min(Height, y0 + map.Block); y++)
                        for (int x = x0; x < Math.Min(Width, x0 + map.Block); x++)
                            shares.Add(r.Get(c)[y * Width + x]);
                    shares.Sum(v => (long)v).Should().Be(expected, $"{c.Name()} of the block at ({x0},{y0})");
                    (shares.Max() - shares.Min()).Should().BeLessThanOrEqualTo(1u);
                    sums[c] += expected;
                    total += expected;
                }
            }
        }
        sums[Counter.PrepassIterations].Should().Be(map.TotalIterations);
        sums[Counter.PrepassNodeFetches].Should().Be(map.TotalLookups);
        map.Levels.Select(l => l.Block).Should().Equal(Enumerable.Range(0, 6).Select(i => PrepassMap.TopBlock >> i).Where(b => b >= map.Block));
        return total;
    }

    /// <summary>
    /// Rule 2's sum: the voxels grid visits, walked again by an Amanatides &amp; Woo DDA from the same start, each costing
    /// the node records on the path from the root down to the node that decides it.
    /// </summary>
    private static uint LookupDepthSum(BrickTree tree, RaySetup ray, int voxels)
    {
        var view = new TreeView(tree);
        var counters = new NoCounters();
        RayStart.Clip(view, ray, 0, ref counters, out RayStart start).Should().BeTrue();
        var walk = DdaState.Start(ray, start.T, start.FaceAxis, start.X, start.Y, start.Z, 0);
        uint sum = 0;
        for (int v = 0; v < voxels; v++)
        {
            sum += (uint)LookupDepth(tree, walk.X, walk.Y, walk.Z);
            walk.TryStep(ray, double.PositiveInfinity);
        }
        return sum;
    }

    /// <summary>Node records read to decide one voxel: the root, then one per child entered until a solid or empty cell.</summary>
    private static int LookupDepth(BrickTree tree, int x, int y, int z)
    {
        int index = 0, depth = 0;
        for (int level = 0; level < tree.Depth; level++)
        {
            depth++;
            int shift = tree.CellShift(level), m = tree.Branching - 1;
            int bit = tree.CellBit((x >> shift) & m, (y >> shift) & m, (z >> shift) & m);
            if (!tree.HasChild(index, bit))
                break;
            index = tree.ChildOf(index, bit);
        }
        return depth;
    }
}
