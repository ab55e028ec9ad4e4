using System.Numerics;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using Xunit.Abstractions;

namespace VoxProf.Sweeps.Traversal;

/// <summary>
/// The acceptance check of the traversal issue: on every sample scene, every named camera and 200 seeded random
/// cameras at 160×90, every tree strategy with and without the prepass finds the grid reference's voxel at every pixel.
/// A difference is allowed only where the reference ray passes within 1e-4 voxel of a voxel edge or corner.
/// </summary>
public class SampleSceneAgreementTests(ITestOutputHelper output)
{
    private const int Width = 160, Height = 90, RandomCameras = 200;
    private const double EdgeTolerance = 1e-4;
    private static readonly Strategy[] Fast = [Strategy.Slab, Strategy.Dda, Strategy.DdaMask, Strategy.Hdda];

    public static TheoryData<string, int> Samples()
    {
        var data = new TheoryData<string, int>();
        foreach (string f in Directory.GetFiles(Path.Combine(AppContext.BaseDirectory, "samples"), "*.json").Order(StringComparer.Ordinal))
        {
            data.Add(Path.GetFileName(f), 4);
            data.Add(Path.GetFileName(f), 2);
        }
        return data;
    }

    [Theory]
    [MemberData(nameof(Samples))]
    public void Every_strategy_agrees_with_the_grid_reference_on_sample_scenes(string file, int branching)
    {
        Scene scene = SceneLoader.Load(Path.Combine(AppContext.BaseDirectory, "samples", file));
        BrickTree tree = TreeBuilder.Build(scene, branching);
        var rng = new Random(20261201);
        var cameras = scene.Cameras.Concat(Enumerable.Range(0, RandomCameras).Select(_ => RandomCamera(rng, scene))).ToList();
        long pixels = 0, nearEdge = 0, bad = 0, hits = 0;
        for (int c = 0; c < cameras.Count; c++)
        {
            CameraSpec cam = cameras[c];
            int block = new[] { 2, 4, 8 }[c % 3];
            TraceRun plain = Tracer.Run(new TraceRequest(scene, tree, cam, Width, Height, [Strategy.Grid, .. Fast]));
            TraceRun pre = Tracer.Run(new TraceRequest(scene, tree, cam, Width, Height, Fast, block));
            PixelHit[] reference = plain.Reference!.Hits;
            var camera = new Camera(cam, Width, Height);
            hits += reference.Count(h => h.Hit);
            foreach (StrategyResult r in plain.Results.Skip(1).Concat(pre.Results))
            {
                pixels += reference.Length;
                for (int i = 0; i < reference.Length; i++)
                {
                    if (r.Hits[i].SameVoxel(reference[i]))
                        continue;
                    double limit = Math.Max(reference[i].Hit ? reference[i].T : 0, r.Hits[i].Hit ? r.Hits[i].T : 0);
                    if (!reference[i].Hit || !r.Hits[i].Hit) limit = double.PositiveInfinity;
                    if (PassesNearEdge(scene, camera.Ray(i % Width, i / Width), limit + 2))
                        nearEdge++;
                    else
                    {
                        bad++;
                        output.WriteLine($"{file} camera {c} {r.Strategy.Name()} pixel {i % Width},{i / Width}: " +
                            $"{Describe(reference[i])} vs {Describe(r.Hits[i])}");
                    }
                }
            }
        }
        output.WriteLine($"{file}: {pixels} pixel comparisons, {hits} reference hits, {nearEdge} near-edge differences, {bad} other");
        hits.Should().BeGreaterThan(0);
        bad.Should().Be(0, "a difference away from voxel edges is a bug");
        ((double)nearEdge / pixels).Should().BeLessThan(1e-4, "near-edge differences must stay below 0.01% of pixels");
    }

    private static string Describe(PixelHit h) => h.Hit ? $"({h.X},{h.Y},{h.Z}) t={h.T}" : "miss";

    private static CameraSpec RandomCamera(Random rng, Scene s)
    {
        float R(int extent, float grow) => (float)(-grow * extent + rng.NextDouble() * extent * (1 + 2 * grow));
        var eye = new Vector3(R(s.ExtentX, 0.3f), R(s.ExtentY, 0.3f), R(s.ExtentZ, 0.3f));
        var target = new Vector3(R(s.ExtentX, 0), R(s.ExtentY, 0), R(s.ExtentZ, 0));
        if (Vector3.Distance(eye, target) < 1) target += new Vector3(5, 1, 3);
        var up = Math.Abs(Vector3.Normalize(target - eye).Y) > 0.99f ? Vector3.UnitX : Vector3.UnitY;
        return new CameraSpec("random", eye, target, up, 30 + (float)rng.NextDouble() * 60);
    }

    /// <summary>
    /// Whether the ray, walked voxel by voxel in double precision up to <paramref name="tLimit"/>, crosses a voxel
    /// face within <see cref="EdgeTolerance"/> of one of that face's edges (a corner is within it of two).
    /// </summary>
    private static bool PassesNearEdge(Scene scene, RaySetup ray, double tLimit)
    {
        if (!SlabTest.Intersect(ray, 0, 0, 0, scene.ExtentX, scene.ExtentY, scene.ExtentZ, 0, double.PositiveInfinity, out SlabHit box))
            return false;
        double end = Math.Min(tLimit, box.Far);
        var w = DdaWalk.Start(ray, box.Near, (int)Math.Floor(ray.Ox + box.Near * ray.Dx), (int)Math.Floor(ray.Oy + box.Near * ray.Dy),
            (int)Math.Floor(ray.Oz + box.Near * ray.Dz), 1);
        do
        {
            double t = w.T;
            int near = 0;
            foreach (double p in new[] { ray.Ox + t * ray.Dx, ray.Oy + t * ray.Dy, ray.Oz + t * ray.Dz })
                if (Math.Abs(p - Math.Round(p)) < EdgeTolerance) near++;
            // The stepped axis sits on its plane; one more coordinate on a plane means an edge.
            if (near >= 2)
                return true;
        }
        while (w.TryStep(end));
        return false;
    }
}
