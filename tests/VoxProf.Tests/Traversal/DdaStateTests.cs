using VoxProf.Core.Rays;
using VoxProf.Core.Traversal;

namespace VoxProf.Tests.Traversal;

public class DdaStateTests
{
    /// <summary>Walks unit cells of a ray scaled by 1/<paramref name="cell"/>: the same parameters as cells of that size.</summary>
    private static List<(int X, int Y, int Z, double T)> Walk(RaySetup ray, double cell, double tEnd)
    {
        ray = new RaySetup(ray.Ox / cell, ray.Oy / cell, ray.Oz / cell, ray.Dx / cell, ray.Dy / cell, ray.Dz / cell);
        int x = (int)Math.Floor(ray.Ox), y = (int)Math.Floor(ray.Oy), z = (int)Math.Floor(ray.Oz);
        var w = DdaState.Start(ray, 0, -1, x, y, z, 0);
        var cells = new List<(int, int, int, double)> { (w.X, w.Y, w.Z, w.T) };
        while (w.TryStep(ray, tEnd))
            cells.Add((w.X, w.Y, w.Z, w.T));
        return cells;
    }

    [Fact]
    public void Segment_across_cells_of_size_20_visits_the_eight_cells_at_the_published_times()
    {
        // Amanatides & Woo (1987): a segment (5,5)→(105,55) over cells of size 20, worked by hand: 8 cells in this order
        // at these parameters along the segment.
        var ray = new RaySetup(5, 5, 0.5, 100, 50, 0);
        var cells = Walk(ray, 20, 1.0);
        cells.Select(c => (c.X, c.Y)).Should().Equal((0, 0), (1, 0), (1, 1), (2, 1), (3, 1), (3, 2), (4, 2), (5, 2));
        cells.Select(c => c.T).Should().Equal(new[] { 0, 0.15, 0.3, 0.35, 0.55, 0.7, 0.75, 0.95 },
            (a, b) => Math.Abs(a - b) < 1e-12);
        cells.Should().OnlyContain(c => c.Z == 0);
    }

    [Fact]
    public void Segment_over_unit_cells_visits_six_cells()
    {
        // Amanatides & Woo (1987) worked case: (0.5,0.5)→(2.5,3.5) crosses 2 x-planes and 3 y-planes: 6 cells.
        var ray = new RaySetup(0.5, 0.5, 0.5, 2, 3, 0);
        Walk(ray, 1, 1.0).Select(c => (c.X, c.Y)).Should().Equal((0, 0), (0, 1), (1, 1), (1, 2), (2, 2), (2, 3));
    }

    [Fact]
    public void At_an_exact_corner_the_lowest_axis_steps_first()
    {
        // Documented tie rule (docs/strategies.md): x before y before z.
        var ray = new RaySetup(0.5, 0.5, 0.5, 1, 1, 1);
        Walk(ray, 1, 2.0).Select(c => (c.X, c.Y, c.Z)).Take(4).Should().Equal((0, 0, 0), (1, 0, 0), (1, 1, 0), (1, 1, 1));
    }

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void Ray_parallel_to_an_axis_never_steps_on_that_axis_and_forms_no_NaN(bool negativeZero)
    {
        double zero = negativeZero ? -0.0 : 0.0;
        var ray = new RaySetup(3.25, 1.5, 2.75, 0.6, zero, -0.8);
        var cells = Walk(ray, 1, 10);
        cells.Should().OnlyContain(c => c.Y == 1);
        cells.Should().OnlyContain(c => !double.IsNaN(c.T) && !double.IsInfinity(c.T));
        cells.Count.Should().BeGreaterThan(10);
    }

    [Fact]
    public void Walk_visits_exactly_the_cells_a_brute_force_segment_box_test_finds_in_order()
    {
        // Amanatides & Woo (1987) define the traversal as the ordered set of cells the segment passes through; a
        // brute-force double-precision slab test of the segment against every cell of the grid gives that set.
        var rng = new Random(1987);
        const int n = 10;
        for (int trial = 0; trial < 300; trial++)
        {
            double Rnd() => 0.01 + rng.NextDouble() * (n - 0.02);
            double ox = Rnd(), oy = Rnd(), oz = Rnd();
            double dx = Rnd() - ox, dy = Rnd() - oy, dz = Rnd() - oz;
            var ray = new RaySetup(ox, oy, oz, dx, dy, dz);

            var brute = new List<(double T, (int, int, int) Cell)>();
            for (int x = 0; x < n; x++)
                for (int y = 0; y < n; y++)
                    for (int z = 0; z < n; z++)
                    {
                        if (SegmentBox(ox, oy, oz, dx, dy, dz, x, y, z, out double near))
                            brute.Add((near, (x, y, z)));
                    }
            var expected = brute.OrderBy(b => b.T).Select(b => b.Cell).ToList();
            var actual = Walk(ray, 1, 1.0).Select(c => (c.X, c.Y, c.Z)).ToList();
            actual.Should().Equal(expected, $"trial {trial}");
        }
    }

    /// <summary>Textbook segment/box overlap in double precision, requiring a non-degenerate overlap.</summary>
    private static bool SegmentBox(double ox, double oy, double oz, double dx, double dy, double dz, int x, int y, int z, out double near)
    {
        double t0 = 0, t1 = 1;
        foreach (var (o, d, lo) in new[] { (ox, dx, (double)x), (oy, dy, (double)y), (oz, dz, (double)z) })
        {
            double a = (lo - o) / d, b = (lo + 1 - o) / d;
            t0 = Math.Max(t0, Math.Min(a, b));
            t1 = Math.Min(t1, Math.Max(a, b));
        }
        near = t0;
        return t1 - t0 > 1e-12;
    }
}
