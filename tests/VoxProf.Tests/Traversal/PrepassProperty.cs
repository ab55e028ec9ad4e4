using System.Numerics;
using VoxProf.Core.Geometry;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// The prepass property of docs/strategies.md checked pixel by pixel: on seeded random scenes of small, thin geometry
/// along a long volume, seen by cameras with fields of view from 1° to 120° at distances up to 60,000 voxels, every
/// pixel's prepass start lies at or before its first hit and every tree strategy with the prepass finds exactly the
/// grid reference's hit. Laine &amp; Karras (2010): the beam optimization is valid only if every start is at most the
/// true first-hit distance. Shared by the short run in the main suite and the long sweep.
/// </summary>
internal static class PrepassProperty
{
    public sealed record Settings(int[] Lengths, int Width, int Height, StrategyDefinition[] Strategies, double MaxDistance = 60000);

    public sealed class Tally
    {
        public long Pixels, Hits, Skipped, Checks;
        public List<string> Failures { get; } = [];
    }

    /// <summary>One seeded case: a scene, a camera, and every block size K = 2, 4, 8.</summary>
    public static void Check(int seed, Settings settings, Tally tally)
    {
        var rng = new Random(seed);
        int length = settings.Lengths[rng.Next(settings.Lengths.Length)];
        var extent = new Box3i(0, 0, 0, length, 64, 64);
        var layers = new List<Layer>();
        var targets = new List<Vector3>();
        int count = 8 + rng.Next(40);
        for (int i = 0; i < count; i++)
        {
            // Single voxels, small blocks, and one-voxel needles and sheets: what a coarse ray slips past most easily.
            int x = rng.Next(length), y = rng.Next(64), z = rng.Next(64);
            (int sx, int sy, int sz) = rng.Next(4) switch
            {
                0 => (1, 1, 1),
                1 => (1 + rng.Next(3), 1 + rng.Next(3), 1 + rng.Next(3)),
                2 => (1 + rng.Next(length / 4), 1, 1),
                _ => (1, 1 + rng.Next(32), 1 + rng.Next(32)),
            };
            layers.Add(new BoxLayer(LayerOp.Add, (byte)(1 + i % 5), new Box3i(x, y, z, x + sx, y + sy, z + sz), extent));
            targets.Add(new Vector3(x + 0.5f, y + 0.5f, z + 0.5f));
        }
        var scene = new Scene(length, 64, 64, layers, [], $"prepass-{seed}");
        BrickTree tree = TreeBuilder.Build(scene, rng.Next(2) == 0 ? 2 : 4, threads: 1);

        // Distances are spread evenly on a log scale so the far get as many cases as the near. Half the cameras look
        // down the long volume from beyond its end, with a field of view that frames its far end (narrow when far:
        // the case where a block's cone is thinnest where the geometry is); the others look at one piece from any
        // side with a field of view from 1° to 120°, also spread on a log scale.
        double distance = Math.Exp(Math.Log(10) + rng.NextDouble() * (Math.Log(settings.MaxDistance) - Math.Log(10)));
        Vector3 eye, target;
        float fov;
        if (rng.Next(2) == 0)
        {
            eye = new Vector3(-(float)distance, 32 + (float)(rng.NextDouble() - 0.5) * 64, 32 + (float)(rng.NextDouble() - 0.5) * 64);
            target = new Vector3(length, 32 + (float)(rng.NextDouble() - 0.5) * 40, 32 + (float)(rng.NextDouble() - 0.5) * 40);
            double frame = 2 * Math.Atan(48 / (distance + length)) * 180 / Math.PI * (0.5 + rng.NextDouble() * 2);
            fov = (float)Math.Clamp(frame, 1, 120);
        }
        else
        {
            target = targets[rng.Next(targets.Count)];
            Vector3 dir = Vector3.Normalize(new Vector3((float)(rng.NextDouble() * 2 - 1), (float)(rng.NextDouble() * 2 - 1), (float)(rng.NextDouble() * 2 - 1)));
            eye = target - (float)distance * dir;
            fov = (float)Math.Exp(rng.NextDouble() * Math.Log(120));
        }
        Vector3 up = Math.Abs(Vector3.Normalize(target - eye).Y) > 0.95f ? Vector3.UnitX : Vector3.UnitY;
        var cam = new CameraSpec("far", eye, target, up, fov);
        string name = $"seed {seed}: length {length}, fov {fov:F2}°, distance {distance:F0}";

        TraceRun plain = Tracer.Run(new TraceRequest(scene, tree, cam, settings.Width, settings.Height, [BuiltInStrategies.Grid], 0, 1));
        PixelHit[] reference = plain.Reference!.Hits;
        var camera = new Camera(cam, settings.Width, settings.Height);
        tally.Pixels += reference.Length;
        tally.Hits += reference.Count(h => h.Hit);
        // The same grids with the voxel level just over the dense budget: the finest level is then the sparse one.
        long voxelBits = ((length + 2 + 63) / 64 * 64L) * 66 * 66;
        CoarseOccupancy sparse = CoarseOccupancy.Build(tree, voxelBits - 1, CoarseOccupancy.SparseWordBudget);
        if (!sparse.HasSparseLevel)
            Fail(tally, $"{name}: no sparse level under a budget just below the voxel grid");
        foreach (int block in new[] { 2, 4, 8 })
        {
            PrepassMap map = PrepassMap.Compute(tree, camera, block, new ParallelOptions { MaxDegreeOfParallelism = 1 });
            PrepassMap sparseMap = PrepassMap.Compute(sparse, camera, block, new ParallelOptions { MaxDegreeOfParallelism = 1 });
            TraceRun pre = Tracer.Run(new TraceRequest(scene, tree, cam, settings.Width, settings.Height, settings.Strategies, block, 1));
            for (int i = 0; i < reference.Length; i++)
            {
                int x = i % settings.Width, y = i / settings.Width;
                if (reference[i].Hit && map.Start(x, y) > reference[i].T)
                    Fail(tally, $"{name}, K {block}, pixel ({x},{y}): start {map.Start(x, y):R} after the first hit at {reference[i].T:R}");
                if (reference[i].Hit && sparseMap.Start(x, y) > reference[i].T)
                    Fail(tally, $"{name}, K {block}, sparse voxel level, pixel ({x},{y}): start {sparseMap.Start(x, y):R} after the first hit at {reference[i].T:R}");
                foreach (StrategyResult r in pre.Results)
                {
                    tally.Checks++;
                    if (!Same(r.Hits[i], reference[i]))
                        Fail(tally, $"{name}, K {block}, {r.Strategy.Name} pixel ({x},{y}): {Describe(r.Hits[i])} against grid {Describe(reference[i])}");
                    tally.Skipped += r.Get(Counter.PrepassSkip)[i];
                }
            }
        }
    }

    /// <summary>The whole hit: voxel, distance, entry face and material.</summary>
    public static bool Same(in PixelHit a, in PixelHit b) =>
        a.Hit == b.Hit && a.X == b.X && a.Y == b.Y && a.Z == b.Z && a.T == b.T && a.Face == b.Face && a.Material == b.Material;

    private static void Fail(Tally tally, string message)
    {
        if (tally.Failures.Count < 20)
            tally.Failures.Add(message);
        else if (tally.Failures.Count == 20)
            tally.Failures.Add("…");
    }

    private static string Describe(PixelHit h) => h.Hit ? $"({h.X},{h.Y},{h.Z}) t={h.T:R} {PixelHit.FaceName(h.Face)}" : "miss";
}
