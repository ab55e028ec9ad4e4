using System.Numerics;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Tests.Traversal;
using Xunit.Abstractions;

namespace VoxProf.Sweeps.Traversal;

/// <summary>
/// The acceptance check of the traversal: on every sample scene, every tree strategy finds exactly the grid reference's
/// hit (voxel, distance, entry face and material) on every pixel, with and without the prepass (K = 2, 4, 8) and for
/// every branching factor (2, 4, 8): the named cameras at the default 1280×720, and 200 seeded random cameras at
/// 160×90. The two sample strategy files are traced with the built-in ones.
/// Every kernel follows one crossing order (docs/strategies.md), so no difference at all is allowed.
/// </summary>
public class SampleSceneAgreementTests(ITestOutputHelper output)
{
    private const int RandomCameras = 200;
    private static readonly Lazy<StrategyDefinition[]> LazyFast = new(() =>
    [
        BuiltInStrategies.Slab, BuiltInStrategies.Dda, BuiltInStrategies.DdaMask, BuiltInStrategies.Hdda,
        .. StrategyFiles.Compile(Path.Combine(AppContext.BaseDirectory, "samples", "strategies", "hdda-again.cs")),
        .. StrategyFiles.Compile(Path.Combine(AppContext.BaseDirectory, "samples", "strategies", "box-skip.cs")),
    ]);

    private static StrategyDefinition[] Fast => LazyFast.Value;

    private static BrickTree[] Trees(Scene scene) => [TreeBuilder.Build(scene, 4), TreeBuilder.Build(scene, 2), TreeBuilder.Build(scene, 8)];

    public static TheoryData<string> Samples()
    {
        var data = new TheoryData<string>();
        foreach (string f in Directory.GetFiles(Path.Combine(AppContext.BaseDirectory, "samples"), "*.json").Order(StringComparer.Ordinal))
            data.Add(Path.GetFileName(f));
        return data;
    }

    private static Scene Load(string file) => SceneLoader.Load(Path.Combine(AppContext.BaseDirectory, "samples", file));

    [Theory]
    [MemberData(nameof(Samples))]
    public void Every_strategy_agrees_with_the_grid_reference_for_the_named_cameras_at_full_size(string file)
    {
        Scene scene = Load(file);
        BrickTree[] trees = Trees(scene);
        long compared = 0, hits = 0, bad = 0;
        foreach (CameraSpec cam in scene.Cameras)
        {
            // grid reads the tree only to look voxels up, so one branching factor serves as the reference for all.
            PixelHit[] reference = Tracer.Run(new TraceRequest(scene, trees[0], cam, 1280, 720, [BuiltInStrategies.Grid])).Reference!.Hits;
            hits += reference.Count(h => h.Hit);
            foreach (BrickTree tree in trees)
                foreach (int block in new[] { 0, 2, 4, 8 })
                    bad += Compare($"{file} {cam.Name} branching {tree.Branching} prepass {block}", reference,
                        Tracer.Run(new TraceRequest(scene, tree, cam, 1280, 720, Fast, block)), ref compared);
        }
        output.WriteLine($"{file}: {compared} pixel comparisons, {hits} reference hits, {bad} differences");
        hits.Should().BeGreaterThan(0);
        bad.Should().Be(0);
    }

    [Theory]
    [MemberData(nameof(Samples))]
    public void Every_strategy_agrees_with_the_grid_reference_for_random_cameras(string file)
    {
        Scene scene = Load(file);
        BrickTree[] trees = Trees(scene);
        var rng = new Random(20261201);
        long compared = 0, hits = 0, bad = 0;
        for (int c = 0; c < RandomCameras; c++)
        {
            CameraSpec cam = RandomCamera(rng, scene);
            // Each camera gets every branching factor; the prepass block cycles through off, 2, 4 and 8.
            int block = new[] { 0, 2, 4, 8 }[c % 4];
            PixelHit[] reference = Tracer.Run(new TraceRequest(scene, trees[0], cam, 160, 90, [BuiltInStrategies.Grid])).Reference!.Hits;
            hits += reference.Count(h => h.Hit);
            foreach (BrickTree tree in trees)
                bad += Compare($"{file} camera {c} branching {tree.Branching} prepass {block}", reference,
                    Tracer.Run(new TraceRequest(scene, tree, cam, 160, 90, Fast, block)), ref compared);
        }
        output.WriteLine($"{file}: {compared} pixel comparisons, {hits} reference hits, {bad} differences");
        hits.Should().BeGreaterThan(0);
        bad.Should().Be(0);
    }

    private long Compare(string what, PixelHit[] reference, TraceRun run, ref long compared)
    {
        long bad = 0;
        foreach (StrategyResult r in run.Results)
        {
            compared += reference.Length;
            for (int i = 0; i < reference.Length; i++)
            {
                if (PrepassProperty.Same(r.Hits[i], reference[i]))
                    continue;
                if (bad++ < 10)
                    output.WriteLine($"{what} {r.Strategy.Name} pixel {i % r.Width},{i / r.Width}: {Describe(reference[i])} vs {Describe(r.Hits[i])}");
            }
        }
        return bad;
    }

    private static string Describe(PixelHit h) => h.Hit ? $"({h.X},{h.Y},{h.Z}) t={h.T:R} {PixelHit.FaceName(h.Face)}" : "miss";

    private static CameraSpec RandomCamera(Random rng, Scene s)
    {
        float R(int extent, float grow) => (float)(-grow * extent + rng.NextDouble() * extent * (1 + 2 * grow));
        var eye = new Vector3(R(s.ExtentX, 0.3f), R(s.ExtentY, 0.3f), R(s.ExtentZ, 0.3f));
        var target = new Vector3(R(s.ExtentX, 0), R(s.ExtentY, 0), R(s.ExtentZ, 0));
        if (Vector3.Distance(eye, target) < 1) target += new Vector3(5, 1, 3);
        var up = Math.Abs(Vector3.Normalize(target - eye).Y) > 0.99f ? Vector3.UnitX : Vector3.UnitY;
        return new CameraSpec("random", eye, target, up, 30 + (float)rng.NextDouble() * 60);
    }
}
