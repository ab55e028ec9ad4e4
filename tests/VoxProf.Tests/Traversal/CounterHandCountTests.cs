using System.Numerics;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// Every counter of every strategy on a tree small enough to walk by hand (definitions: docs/counters.md). The ray and
/// the cells it visits follow Amanatides &amp; Woo (1987) for the DDA steps and Williams et al. (2005) for the slab
/// tests; the walk-throughs in the comments are the expected values.
/// </summary>
public class CounterHandCountTests
{
    // The tree: extent 4×4×4, branching 2, so two levels. The root's cells are 2 voxels wide; root cell (0,0,0) holds
    // node A, root cell (1,0,0) node B, the other six root cells are empty. Node A has one solid voxel, (0,0,0); node B
    // has two, (3,1,0) (B's local cell (1,1,0)) and (2,0,1) (local (0,0,1)).
    private static readonly BrickTree Tree = DenseTree.Build(4, 4, 4, (x, y, z) => (x, y, z) switch
    {
        (0, 0, 0) => (byte)1,
        (3, 1, 0) => (byte)2,
        (2, 0, 1) => (byte)3,
        _ => (byte)0,
    }, branching: 2);

    // The ray: a 1×1 image whose only pixel looks straight down +x from (-1, 1.5, 0.5); y and z components are +0.0,
    // so those axes are parallel and never step. It crosses x = 0 at t = 1, x = 1 at 2, x = 2 at 3, x = 3 at 4 and
    // visits voxels (0,1,0), (1,1,0), (2,1,0), then hits (3,1,0) at t = 4 through its -x face.
    private static readonly CameraSpec Camera = new("hand", new Vector3(-1, 1.5f, 0.5f), new Vector3(10, 1.5f, 0.5f), Vector3.UnitY, 60);

    private static StrategyResult Trace(StrategyDefinition strategy)
    {
        TraceRun run = Tracer.Run(new TraceRequest(DenseTree.SceneOf(4, 4, 4), Tree, Camera, 1, 1, [strategy]));
        StrategyResult r = run.Results[0];
        PixelHit h = r.Hits[0];
        (h.Hit, h.X, h.Y, h.Z, h.T, h.Face, h.Material).Should().Be((true, 3, 1, 0, 4.0, HitFace.NegX, (byte)2));
        return r;
    }

    private static void ShouldCount(StrategyResult r, uint iterations, uint cellSteps, uint slabTests, uint descents,
        uint ascents, uint nodeFetches, uint maskCulled = 0, uint maskSkipped = 0)
    {
        var expected = new Dictionary<Counter, uint>
        {
            [Counter.Iterations] = iterations,
            [Counter.CellSteps] = cellSteps,
            [Counter.SlabTests] = slabTests,
            [Counter.Descents] = descents,
            [Counter.Ascents] = ascents,
            [Counter.NodeFetches] = nodeFetches,
            [Counter.MaskCulledCells] = maskCulled,
            [Counter.MaskSkippedNodes] = maskSkipped,
            [Counter.PrepassIterations] = 0,
            [Counter.PrepassNodeFetches] = 0,
            [Counter.PrepassSkip] = 0,
            [Counter.CacheLines] = 0, // the memory model is off
        };
        foreach (Counter c in CounterNames.All)
            r.Get(c)[0].Should().Be(expected[c], $"{r.Strategy.Name} {c.Name()}");
    }

    [Fact]
    public void Grid_counts_by_hand()
    {
        // Clip to the volume: 1 slab test; entry at t = 1 through x = 0 into voxel (0,1,0).
        // Iteration 1, voxel (0,1,0): look-up reads the root (root cell (0,0,0) has a child) and node A (local cell
        //   (0,1,0) is empty): 2 node fetches. Step x to (1,1,0) at t = 2: cell step 1.
        // Iteration 2, voxel (1,1,0): root, A: 2 fetches (4). Step x to (2,1,0) at t = 3: cell step 2.
        // Iteration 3, voxel (2,1,0): root (root cell (1,0,0) has a child), node B (local (0,1,0) empty): 2 (6).
        //   Step x to (3,1,0) at t = 4: cell step 3.
        // Iteration 4, voxel (3,1,0): root, B (local (1,1,0) solid): 2 (8). Hit.
        ShouldCount(Trace(BuiltInStrategies.Grid), iterations: 4, cellSteps: 3, slabTests: 1, descents: 0, ascents: 0, nodeFetches: 8);
    }

    [Fact]
    public void Dda_counts_by_hand()
    {
        // Clip: slab test 1, t = 1, start voxel (0,1,0). Read the root: fetch 1. Root cell (0,0,0); next x plane 2 at t = 3.
        // Iteration 1, root cell (0,0,0) has a child: descent 1, read A: fetch 2, slab test of A's box [0,2)³: 2.
        //   Child cell (0,1,0); next x plane 1 at t = 2.
        // Iteration 2, A (0,1,0) empty: DDA step x to (1,1,0) at t = 2: cell step 1.
        // Iteration 3, A (1,1,0) empty: step x at t = 3 to (2,1,0), outside A: cell step 2. Ascent 1 to the root, whose
        //   saved next plane x = 2 at t = 3 is the plane just crossed: the parent steps to root cell (1,0,0): cell step 3.
        // Iteration 4, root (1,0,0) has a child: descent 2, read B: fetch 3, slab test of B's box: 3. Child (0,1,0).
        // Iteration 5, B (0,1,0) empty: step x to (1,1,0) at t = 4: cell step 4.
        // Iteration 6, B (1,1,0) solid: hit.
        ShouldCount(Trace(BuiltInStrategies.Dda), iterations: 6, cellSteps: 4, slabTests: 3, descents: 2, ascents: 1, nodeFetches: 3);
    }

    [Fact]
    public void Slab_counts_by_hand()
    {
        // The same cells as dda, but every step inside a node is a slab test of the current cell, whose exit plane
        // gives the step: clip 1, descents into A and B 2, in-node steps at iterations 2, 3 and 5: 3, so 6 slab tests.
        // The parent's step after the ascent crosses the plane the child left by, so it needs no slab test.
        ShouldCount(Trace(BuiltInStrategies.Slab), iterations: 6, cellSteps: 4, slabTests: 6, descents: 2, ascents: 1, nodeFetches: 3);
    }

    [Fact]
    public void Hdda_counts_by_hand()
    {
        // Clip: slab test 1 (the only one). Read the root: fetch 1. Cell (0,0,0) at the root level.
        // Iteration 1, root cell (0,0,0) has a child: descent 1, read A: fetch 2; refine to voxel cell (0,1,0).
        // Iteration 2, (0,1,0) empty: step x to (1,1,0): cell step 1, still in A.
        // Iteration 3, (1,1,0) empty: step x to (2,1,0): cell step 2; x wrapped to 0, so it left A. Ascent 1: the
        //   coordinates shifted right name root cell (1,0,0) directly, with no parent-level step.
        // Iteration 4, root (1,0,0) has a child: descent 2, read B: fetch 3; refine to (2,1,0).
        // Iteration 5, (2,1,0) empty: step x to (3,1,0): cell step 3.
        // Iteration 6, (3,1,0) solid: hit.
        ShouldCount(Trace(BuiltInStrategies.Hdda), iterations: 6, cellSteps: 3, slabTests: 1, descents: 2, ascents: 1, nodeFetches: 3);
    }

    [Fact]
    public void Dda_mask_counts_by_hand()
    {
        // Octant: every reciprocal is positive (+0.0 gives +∞), so from cell c a ray reaches the cells on or beyond c
        // on every axis.
        // Clip: slab test 1. Read the root: fetch 1. Entry test at root cell (0,0,0): every cell is reachable, so no
        //   occupied cell is culled.
        // Iteration 1, root (0,0,0) has a child: descent 1, read A: fetch 2, slab test 2. Entry cell (0,1,0): A's only
        //   occupied cell (0,0,0) has y = 0 < 1, out of reach: 1 culled cell, nothing reachable, so A is skipped whole
        //   (1 skipped node). Ascent 1; the root steps x to (1,0,0) at t = 3: cell step 1; (1,0,0) is reachable.
        // Iteration 2, root (1,0,0) has a child: descent 2, read B: fetch 3, slab test 3. Entry cell (0,1,0): B's
        //   occupied cell (0,0,1) has y = 0, culled (2 culled cells); (1,1,0) is reachable.
        // Iteration 3, B (0,1,0) empty: step x to (1,1,0): cell step 2; still reachable.
        // Iteration 4, B (1,1,0) solid: hit.
        ShouldCount(Trace(BuiltInStrategies.DdaMask), iterations: 4, cellSteps: 2, slabTests: 3, descents: 2, ascents: 1, nodeFetches: 3,
            maskCulled: 2, maskSkipped: 1);
    }

    [Fact]
    public void The_coarse_prepass_ray_counts_its_iterations_and_grid_look_ups_by_hand()
    {
        // One solid voxel, (3,0,0), in a 4³ octree: the root's cells are 2 voxels wide. The coarse grids mark, at the
        // root level, the cells within one cell of root cell (1,0,0): x in 0..2; at the voxel level, x in 2..4 (y and
        // z within one of 0 on both). The coarse ray runs down +x from (-1, 0.5, 0.5) with cone slope 0.01 (radius
        // 0.01·t, under half a cell here), so each stride goes to the exit of the cell grown by half its room on every
        // side: about half a cell (g = 1 at the root level, 0.5 at the voxel level, less the allowances). The grown
        // volume box contains the eye, so the ray starts at t = 0. Each level tested is one look-up, except a cell
        // already found set at that level, whose answer is known.
        // Iteration 1, t = 0, x = -1: root level, cell x = -1 ([-2, 0)): clear, 1 look-up. Advance to x = 0 + 1 (t = 2).
        // Iteration 2, t = 2, x = 1: root level, cell 0: set (2). Voxel level, voxel 0 (the point is a rounding
        //   allowance short of x = 1): clear (3). Advance to x = 1 + 0.5 (t = 2.5).
        // Iteration 3, t = 2.5, x = 1.5: root level, cell 0 again: known set, no look-up; voxel 1 clear (4). Advance
        //   to x = 2 + 0.5 (t = 3.5).
        // Iteration 4, t = 3.5, x = 2.5: root level, cell 1: set (5); voxel 2 set (6). No level is clear: stop at
        //   t = 3.5 (less the allowances), before the voxel's face at t = 4.
        BrickTree tree = DenseTree.Build(4, 4, 4, (x, y, z) => x == 3 && y == 0 && z == 0 ? (byte)1 : (byte)0, 2);
        var axis = new RaySetup(-1, 0.5, 0.5, 1, 0, 0);
        double s = ConePrepass.March(tree.Coarse, axis, 0.01, out uint iterations, out uint lookups);
        iterations.Should().Be(4);
        lookups.Should().Be(6);
        s.Should().BeLessThan(3.5).And.BeGreaterThan(3.5 - 1e-6);
    }
}
