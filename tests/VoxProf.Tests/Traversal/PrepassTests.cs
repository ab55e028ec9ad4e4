using System.Numerics;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Tests.Scenes;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// Adversarial scenes for the coarse prepass: tiny, thin and far geometry that a coarse ray can slip past.
/// Laine &amp; Karras (2010): the beam optimization is only valid if every pixel's start distance is at most its true
/// first-hit distance; that premise is what these tests check, pixel by pixel.
/// </summary>
public class PrepassTests
{
    private const int Size = 64;

    public static TheoryData<string, int> Cases()
    {
        var data = new TheoryData<string, int>();
        foreach (string scene in new[] { "voxel", "needle", "sheet", "diagonal" })
            foreach (int k in new[] { 2, 4, 8 })
                data.Add(scene, k);
        return data;
    }

    private static Func<int, int, int, byte> Geometry(string name) => name switch
    {
        "voxel" => (x, y, z) => x == 40 && y == 30 && z == 50 ? (byte)1 : (byte)0,
        "needle" => (x, y, z) => y == 20 && z == 33 && x > 3 ? (byte)2 : (byte)0,
        "sheet" => (x, y, z) => y == 10 ? (byte)3 : (byte)0,
        "diagonal" => (x, y, z) => x == z && y < 40 ? (byte)4 : (byte)0,
        _ => throw new ArgumentException(name),
    };

    private static IEnumerable<CameraSpec> Cameras()
    {
        // Far away, grazing along the sheet, down the needle, and a random spread.
        yield return new CameraSpec("far", new Vector3(-900, 400, -700), new Vector3(40, 30, 50), Vector3.UnitY, 3);
        yield return new CameraSpec("graze", new Vector3(-200, 11.01f, 30), new Vector3(64, 10.9f, 31), Vector3.UnitY, 20);
        yield return new CameraSpec("along", new Vector3(-150, 20.5f, 33.5f), new Vector3(64, 20.4f, 33.6f), Vector3.UnitY, 8);
        var rng = new Random(2010);
        for (int i = 0; i < 4; i++)
            yield return KernelAgreementTests.RandomCamera(rng, Size, inside: false);
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Every_pixel_starts_no_later_than_its_true_first_hit_and_the_image_is_unchanged(string sceneName, int block)
    {
        BrickTree tree = DenseTree.Build(Size, Size, Size, Geometry(sceneName), 2);
        Scene scene = DenseTree.SceneOf(Size, Size, Size);
        int hits = 0;
        foreach (CameraSpec cam in Cameras())
        {
            TraceRun plain = Tracer.Run(new TraceRequest(scene, tree, cam, 160, 90, BuiltInStrategies.All));
            TraceRun fast = Tracer.Run(new TraceRequest(scene, tree, cam, 160, 90, BuiltInStrategies.All, block));
            PrepassMap map = PrepassMap.Compute(tree, new Camera(cam, 160, 90), block, new ParallelOptions());
            PixelHit[] reference = plain.Reference!.Hits;
            for (int y = 0; y < 90; y++)
                for (int x = 0; x < 160; x++)
                {
                    PixelHit h = reference[y * 160 + x];
                    if (!h.Hit)
                        continue;
                    hits++;
                    map.Start(x, y).Should().BeLessThanOrEqualTo(h.T * (1 + 1e-6) + 1e-6, $"{cam.Name} pixel ({x},{y})");
                }
            for (int s = 0; s < plain.Results.Count; s++)
                fast.Results[s].Hits.Should().Equal(plain.Results[s].Hits, $"{cam.Name} {plain.Results[s].Strategy.Name} with prepass {block}");
        }
        hits.Should().BeGreaterThan(0, "the adversarial geometry must be seen by some camera");
    }

    [Fact]
    public void A_voxel_far_down_a_long_volume_is_still_hit_through_a_narrow_field_of_view()
    {
        // Regression: at a 10° field of view a 2×2 block's cone half-angle is about 5e-4 rad, and the old angle (arc
        // cosine of a dot product of float directions) lost most of its digits: every tree strategy with the prepass
        // started pixel (163,114) past voxel (2028,44,39) and missed it.
        using var file = new TempScene("""
            {'version': 1, 'extent': [2048, 64, 64],
             'layers': [{'kind': 'box', 'material': 1, 'min': [2028, 44, 39], 'max': [2029, 45, 40]}],
             'cameras': [{'name': 'far', 'eye': [-1000, 40, 20], 'target': [2000, 32, 32], 'fovY': 10}]}
            """);
        Scene scene = SceneLoader.Load(file.Path);
        foreach (int branching in new[] { 4, 2 })
        {
            BrickTree tree = TreeBuilder.Build(scene, branching);
            TraceRun plain = Tracer.Run(new TraceRequest(scene, tree, scene.Cameras[0], 320, 240, [BuiltInStrategies.Grid]));
            TraceRun pre = Tracer.Run(new TraceRequest(scene, tree, scene.Cameras[0], 320, 240, BuiltInStrategies.All, 2));
            PixelHit g = plain.Reference!.Hits[114 * 320 + 163];
            (g.Hit, g.X, g.Y, g.Z).Should().Be((true, 2028, 44, 39), "the grid reference sees the voxel at pixel (163,114)");
            foreach (StrategyResult r in pre.Results)
            {
                r.Hits.Should().Equal(plain.Reference!.Hits, $"{r.Strategy.Name} with prepass 2, branching {branching}");
                if (r.Strategy != BuiltInStrategies.Grid)
                    r.Get(Counter.PrepassSkip)[114 * 320 + 163].Should().BeGreaterThan(1500u, "the coarse ray skips most of the empty volume before the voxel");
            }
        }
    }

    [Fact]
    public void Fields_of_view_from_1_to_120_degrees_at_distances_up_to_60000_voxels_never_change_a_hit()
    {
        // The short version of the sweep in tests/VoxProf.Sweeps (same property, more and larger cases there).
        var settings = new PrepassProperty.Settings([256, 1024, 2048], 64, 48, [BuiltInStrategies.Dda]);
        var tally = new PrepassProperty.Tally();
        for (int seed = 1; seed <= 32; seed++)
            PrepassProperty.Check(seed, settings, tally);
        tally.Failures.Should().BeEmpty();
        tally.Hits.Should().BeGreaterThan(tally.Pixels / 20, "the cameras look at the geometry");
        tally.Skipped.Should().BeGreaterThan(0, "the prepass must skip distance for the check to mean anything");
    }

    [Fact]
    public void The_prepass_skips_empty_space_in_front_of_a_distant_wall()
    {
        BrickTree tree = DenseTree.Build(Size, Size, Size, (x, y, z) => z >= 60 ? (byte)1 : (byte)0, 4);
        Scene scene = DenseTree.SceneOf(Size, Size, Size);
        var cam = new CameraSpec("wall", new Vector3(32, 32, -100), new Vector3(32, 32, 64), Vector3.UnitY, 20);
        TraceRun run = Tracer.Run(new TraceRequest(scene, tree, cam, 64, 64, [BuiltInStrategies.Dda], 4));
        uint[] skip = run.Results[0].Counters[(int)Counter.PrepassSkip];
        skip.Average(v => (double)v).Should().BeGreaterThan(30, "about 60 voxels of empty space lie in front of the wall");
        uint[] share = run.Results[0].Counters[(int)Counter.PrepassIterations];
        share.Should().Contain(v => v > 0);
    }
}
