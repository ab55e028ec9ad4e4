using System.Numerics;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Traversal;

/// <summary>Differential tests: every tree strategy against the grid reference on seeded random scenes and cameras.</summary>
public class KernelAgreementTests
{
    private static readonly StrategyDefinition[] Fast = [BuiltInStrategies.Slab, BuiltInStrategies.Dda, BuiltInStrategies.DdaMask, BuiltInStrategies.Hdda];

    internal static Func<int, int, int, byte> RandomBlobs(int seed, int size, int count)
    {
        var rng = new Random(seed);
        var blobs = Enumerable.Range(0, count)
            .Select(_ => (x: rng.Next(size), y: rng.Next(size), z: rng.Next(size), r: rng.Next(1, Math.Max(2, size / 5)), m: (byte)rng.Next(1, 5)))
            .ToArray();
        return (x, y, z) =>
        {
            foreach (var b in blobs)
            {
                int dx = x - b.x, dy = y - b.y, dz = z - b.z;
                if (dx * dx + dy * dy + dz * dz <= b.r * b.r)
                    return b.m;
            }
            return 0;
        };
    }

    internal static CameraSpec RandomCamera(Random rng, int size, bool inside)
    {
        float span = inside ? size : size * 3f;
        float offset = inside ? 0 : -size;
        var eye = new Vector3(offset + (float)rng.NextDouble() * span, offset + (float)rng.NextDouble() * span, offset + (float)rng.NextDouble() * span);
        var target = new Vector3((float)rng.NextDouble() * size, (float)rng.NextDouble() * size, (float)rng.NextDouble() * size);
        if (Vector3.Distance(eye, target) < 1) target += new Vector3(3, 1, 2);
        var up = Math.Abs(Vector3.Normalize(target - eye).Y) > 0.99f ? Vector3.UnitX : Vector3.UnitY;
        return new CameraSpec("random", eye, target, up, 30 + (float)rng.NextDouble() * 60);
    }

    /// <summary>Returns the number of pixels whose hit (voxel, distance, face, material) differs from the grid reference.</summary>
    internal static int Mismatches(TraceRun run, StrategyDefinition strategy)
    {
        var reference = run.Reference!.Hits;
        var hits = run.Results.Single(r => r.Strategy == strategy).Hits;
        return Enumerable.Range(0, hits.Length).Count(i => !PrepassProperty.Same(hits[i], reference[i]));
    }

    [Theory]
    [InlineData(2, 1)]
    [InlineData(4, 2)]
    [InlineData(2, 3)]
    [InlineData(4, 4)]
    [InlineData(8, 5)]
    [InlineData(8, 6)]
    public void Every_strategy_finds_the_voxel_the_grid_reference_finds(int branching, int seed)
    {
        const int size = 40;
        BrickTree tree = DenseTree.Build(size, size - 7, size + 5, RandomBlobs(seed, size, 12), branching);
        Scene scene = DenseTree.SceneOf(size, size - 7, size + 5);
        var rng = new Random(seed * 31);
        int total = 0, bad = 0;
        for (int c = 0; c < 12; c++)
        {
            CameraSpec cam = RandomCamera(rng, size, inside: c % 3 == 0);
            foreach (int prepass in new[] { 0, 4 })
            {
                TraceRun run = Tracer.Run(new TraceRequest(scene, tree, cam, 48, 32, [BuiltInStrategies.Grid, .. Fast], prepass, 2));
                foreach (StrategyDefinition s in Fast)
                    bad += Mismatches(run, s);
                total += 48 * 32 * Fast.Length;
            }
        }
        // Every kernel follows the same crossing order (docs/strategies.md), so there is no tolerance.
        bad.Should().Be(0, "strategies must agree with the reference on every pixel");
        total.Should().BeGreaterThan(0);
    }

    [Fact]
    public void Hit_material_face_and_distance_are_those_of_the_reference_bit_for_bit()
    {
        BrickTree tree = DenseTree.Build(32, 32, 32, RandomBlobs(7, 32, 10), 4);
        Scene scene = DenseTree.SceneOf(32, 32, 32);
        var cam = new CameraSpec("c", new Vector3(-20, 40, -15), new Vector3(16, 10, 16), Vector3.UnitY, 50);
        TraceRun run = Tracer.Run(new TraceRequest(scene, tree, cam, 40, 30, [BuiltInStrategies.Grid, .. Fast]));
        var reference = run.Reference!.Hits;
        reference.Count(h => h.Hit).Should().BeGreaterThan(100, "the camera must see geometry for this test to mean anything");
        foreach (StrategyResult r in run.Results)
        {
            for (int i = 0; i < reference.Length; i++)
            {
                if (!reference[i].Hit || !r.Hits[i].SameVoxel(reference[i]))
                    continue;
                r.Hits[i].Material.Should().Be(reference[i].Material);
                r.Hits[i].Face.Should().Be(reference[i].Face);
                r.Hits[i].T.Should().Be(reference[i].T, "every kernel enters the hit voxel at the same plane crossing");
            }
        }
    }

    [Fact]
    public void Counts_are_identical_with_one_and_two_threads()
    {
        BrickTree tree = DenseTree.Build(48, 48, 48, RandomBlobs(11, 48, 15), 2);
        Scene scene = DenseTree.SceneOf(48, 48, 48);
        var cam = new CameraSpec("c", new Vector3(-10, 60, -30), new Vector3(24, 12, 24), Vector3.UnitY, 60);
        StrategyDefinition[] all = [BuiltInStrategies.Grid, .. Fast];
        TraceRun one = Tracer.Run(new TraceRequest(scene, tree, cam, 64, 48, all, 4, Threads: 1));
        TraceRun two = Tracer.Run(new TraceRequest(scene, tree, cam, 64, 48, all, 4, Threads: 2));
        for (int s = 0; s < all.Length; s++)
        {
            for (int c = 0; c < CounterNames.Count; c++)
                one.Results[s].Counters[c].Should().Equal(two.Results[s].Counters[c]);
            one.Results[s].Hits.Should().Equal(two.Results[s].Hits);
        }
        one.Results[1].Counters[(int)Counter.Iterations].Sum(v => (long)v).Should().BeGreaterThan(0);
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    [InlineData(8)]
    public void A_camera_inside_a_solid_voxel_hits_it_at_distance_zero(int branching)
    {
        BrickTree tree = DenseTree.Build(16, 16, 16, (x, y, z) => y < 8 ? (byte)3 : (byte)0, branching);
        Scene scene = DenseTree.SceneOf(16, 16, 16);
        var cam = new CameraSpec("c", new Vector3(5.5f, 4.25f, 6.5f), new Vector3(9, 4, 6), Vector3.UnitY, 60);
        TraceRun run = Tracer.Run(new TraceRequest(scene, tree, cam, 8, 6, [BuiltInStrategies.Grid, .. Fast], 2));
        foreach (StrategyResult r in run.Results)
        {
            r.Hits.Should().OnlyContain(h => h.Hit && h.T == 0 && h.X == 5 && h.Y == 4 && h.Z == 6 && h.Face == HitFace.None,
                $"{r.Strategy.Name} starts inside solid voxel (5,4,6)");
        }
    }
}
