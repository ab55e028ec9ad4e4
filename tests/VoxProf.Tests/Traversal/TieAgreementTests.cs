using System.Numerics;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// Rays built to cross planes at exactly equal times: eyes on integer and half-integer coordinates looking along
/// directions with equal components, so the centre column of the image crosses x and y planes together (an edge) and
/// the centre pixel of a diagonal view crosses all three (a corner). Every strategy must follow the documented tie rule
/// (docs/strategies.md, "The crossing order": the lowest axis first) and so find the grid reference's hit bit for bit,
/// with and without the prepass and for both branching factors.
/// </summary>
public class TieAgreementTests
{
    private const int Size = 32;

    public static TheoryData<int> Seeds() => [1, 2, 3];

    [Theory]
    [MemberData(nameof(Seeds))]
    public void Every_strategy_breaks_exact_ties_as_the_reference_does(int seed)
    {
        var rng = new Random(seed);
        Func<int, int, int, byte> blobs = KernelAgreementTests.RandomBlobs(seed, Size, 14);
        // A checkerboard band as well: solid and empty voxels meeting at every edge the tied rays run along.
        byte Material(int x, int y, int z) => y is >= 12 and < 15 && ((x + y + z) & 1) == 0 ? (byte)6 : blobs(x, y, z);
        Scene scene = DenseTree.SceneOf(Size, Size, Size);
        BrickTree[] trees = [DenseTree.Build(Size, Size, Size, Material, 2), DenseTree.Build(Size, Size, Size, Material, 4)];
        int compared = 0, hits = 0;
        for (int c = 0; c < 10; c++)
        {
            CameraSpec cam = TiedCamera(rng, inside: c % 2 == 0);
            foreach (BrickTree tree in trees)
            {
                foreach (int prepass in new[] { 0, 2, 4, 8 })
                {
                    TraceRun run = Tracer.Run(new TraceRequest(scene, tree, cam, 15, 11, BuiltInStrategies.All, prepass, 1));
                    hits += run.Reference!.Hits.Count(h => h.Hit);
                    foreach (StrategyResult r in run.Results.Skip(1))
                    {
                        compared += r.Hits.Length;
                        KernelAgreementTests.Mismatches(run, r.Strategy).Should().Be(0,
                            $"{r.Strategy.Name} camera {c} eye {cam.Eye} target {cam.Target} branching {tree.Branching} prepass {prepass}");
                    }
                }
            }
        }
        compared.Should().BeGreaterThan(0);
        hits.Should().BeGreaterThan(500, "the tied rays must meet geometry");
    }

    /// <summary>An eye on a grid of half voxels, looking along a direction whose non-zero components are equal.</summary>
    private static CameraSpec TiedCamera(Random rng, bool inside)
    {
        float Coord() => inside ? rng.Next(2, 2 * Size - 2) * 0.5f : rng.Next(-2 * Size, 3 * Size) * 0.5f;
        var eye = new Vector3(Coord(), Coord(), Coord());
        Vector3 dir;
        do
        {
            dir = new Vector3(rng.Next(-1, 2), rng.Next(-1, 2), rng.Next(-1, 2));
        }
        while (dir == Vector3.Zero);
        // With up along an axis where dir is zero (or z), the image's centre column keeps the tied components equal.
        Vector3 up = dir.Z == 0 ? Vector3.UnitZ : dir.Y == 0 ? Vector3.UnitY : dir.X == 0 ? Vector3.UnitX : new Vector3(1, -1, 0);
        return new CameraSpec("tied", eye, eye + 8 * dir, up, 30 + rng.Next(60));
    }
}
