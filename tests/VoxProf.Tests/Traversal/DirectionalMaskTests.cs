using VoxProf.Core.Rays;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Traversal;

public class DirectionalMaskTests
{
    private static IEnumerable<(int X, int Y, int Z)> CellsVisited(int n, double ox, double oy, double oz, double dx, double dy, double dz)
    {
        var ray = new RaySetup(ox, oy, oz, dx, dy, dz);
        var w = DdaState.Start(ray, 0, -1, (int)ox, (int)oy, (int)oz, 0);
        while (w.X >= 0 && w.X < n && w.Y >= 0 && w.Y < n && w.Z >= 0 && w.Z < n)
        {
            yield return (w.X, w.Y, w.Z);
            if (!w.TryStep(ray, double.MaxValue))
                yield break;
        }
    }

    private static int Octant(double dx, double dy, double dz) => new RaySetup(0, 0, 0, dx, dy, dz).Octant;

    /// <summary>The table's set for (octant, start cell) as a set of cell indices, whatever the branching.</summary>
    private static HashSet<int> MaskOf(int n, int octant, int start)
    {
        int cells = n * n * n;
        if (n == 8)
        {
            Mask512 wide = DirectionalMasks.Wide[octant * cells + start];
            return Enumerable.Range(0, cells).Where(wide.Has).ToHashSet();
        }
        ulong mask = DirectionalMasks.Build(n)[octant * cells + start];
        return Enumerable.Range(0, cells).Where(b => ((mask >> b) & 1) != 0).ToHashSet();
    }

    [Fact]
    public void A_four_cubed_brick_fits_one_64_bit_mask_and_a_two_cubed_node_eight_bits()
    {
        // A 4×4×4 brick has 64 cells, one per bit of a 64-bit word (common practice for voxel bricks).
        DirectionalMasks.Build(4).Should().HaveCount(8 * 64);
        DirectionalMasks.Build(2).Should().OnlyContain(m => m < 256);
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    [InlineData(8)]
    public void Sampled_rays_never_reach_a_cell_outside_the_mask(int n)
    {
        var rng = new Random(n);
        for (int i = 0; i < 20000; i++)
        {
            double ox = rng.NextDouble() * n, oy = rng.NextDouble() * n, oz = rng.NextDouble() * n;
            double Comp() => rng.Next(8) == 0 ? (rng.Next(2) == 0 ? 0.0 : -0.0) : rng.NextDouble() * 2 - 1;
            double dx = Comp(), dy = Comp(), dz = Comp();
            if (dx == 0 && dy == 0 && dz == 0) continue;
            int start = (int)ox + n * (int)oy + n * n * (int)oz;
            HashSet<int> mask = MaskOf(n, Octant(dx, dy, dz), start);
            foreach (var c in CellsVisited(n, ox, oy, oz, dx, dy, dz))
            {
                int bit = c.X + n * c.Y + n * n * c.Z;
                mask.Should().Contain(bit, $"cell {c} is reached from {start} in octant {Octant(dx, dy, dz)}");
            }
        }
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    [InlineData(8)]
    public void Every_cell_in_the_mask_is_reached_by_some_ray_of_that_octant(int n)
    {
        // Exhaustive: for every octant, start cell and target cell, a witness ray from near the start cell's trailing
        // corner to near the target cell's leading corner. The union of the cells they visit must equal the mask.
        int cells = n * n * n;
        for (int octant = 0; octant < 8; octant++)
        {
            for (int s = 0; s < cells; s++)
            {
                var reached = new HashSet<int>();
                int sx = s % n, sy = s / n % n, sz = s / (n * n);
                for (int q = 0; q < cells; q++)
                {
                    int qx = q % n, qy = q / n % n, qz = q / (n * n);
                    double From(int c, int bit) => (octant & bit) == 0 ? c + 0.01 : c + 0.99;
                    double To(int c, int bit) => (octant & bit) == 0 ? c + 0.99 : c + 0.01;
                    double ox = From(sx, 1), oy = From(sy, 2), oz = From(sz, 4);
                    double dx = To(qx, 1) - ox, dy = To(qy, 2) - oy, dz = To(qz, 4) - oz;
                    if (Octant(dx, dy, dz) != octant)
                        continue;
                    foreach (var c in CellsVisited(n, ox, oy, oz, dx, dy, dz))
                        reached.Add(c.X + n * c.Y + n * n * c.Z);
                }
                reached.SetEquals(MaskOf(n, octant, s)).Should().BeTrue($"octant {octant}, start cell {s}");
            }
        }
    }
}
