using VoxProf.Core.Rays;
using VoxProf.Core.Traversal;

namespace VoxProf.Tests.Traversal;

public class SlabTestTests
{
    private static bool Hit(RaySetup r, out SlabHit h) =>
        SlabTest.Intersect(r, 1, 1, 1, 2, 2, 2, 0, double.PositiveInfinity, out h);

    [Fact]
    public void Axis_parallel_ray_through_the_box_enters_and_leaves_at_its_faces()
    {
        // Williams, Barrus, Morley & Shirley (2005): a ray along +x through the box's interior meets x = 1 and x = 2.
        Hit(new RaySetup(-3, 1.5, 1.5, 1, 0, 0), out SlabHit h).Should().BeTrue();
        h.Near.Should().Be(4);
        h.Far.Should().Be(5);
        h.NearAxis.Should().Be(0);
        h.FarAxis.Should().Be(0);
    }

    [Fact]
    public void Exit_is_the_far_time_of_the_full_test_on_any_box_and_ray()
    {
        // Exit must decide exactly as Intersect's far side (the coarse prepass's conservativeness rests on it): rays
        // with zero components, boxes the ray misses, boxes behind it and a parallel ray outside a slab included.
        var rng = new Random(41);
        double Coordinate() => rng.Next(4) == 0 ? rng.Next(-3, 4) : rng.NextDouble() * 8 - 4;
        double Component() => rng.Next(5) == 0 ? (rng.Next(2) == 0 ? 0.0 : -0.0) : rng.NextDouble() * 2 - 1;
        int checkedBoxes = 0;
        for (int i = 0; i < 5000; i++)
        {
            double dx = Component(), dy = Component(), dz = Component();
            if (dx == 0 && dy == 0 && dz == 0)
                continue;
            var ray = new RaySetup(Coordinate(), Coordinate(), Coordinate(), dx, dy, dz);
            double lx = Coordinate(), ly = Coordinate(), lz = Coordinate();
            double hx = lx + rng.NextDouble() * 3, hy = ly + rng.NextDouble() * 3, hz = lz + rng.NextDouble() * 3;
            SlabTest.Intersect(ray, lx, ly, lz, hx, hy, hz, double.NegativeInfinity, double.PositiveInfinity, out SlabHit full);
            SlabTest.Exit(ray, lx, ly, lz, hx, hy, hz).Should().Be(full.Far, $"ray {i}");
            checkedBoxes++;
        }
        checkedBoxes.Should().BeGreaterThan(4900);
    }

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void Negative_and_positive_zero_components_give_the_same_finite_interval(bool negativeZero)
    {
        double zero = negativeZero ? -0.0 : 0.0;
        // Williams et al. (2005) branch on the sign of the reciprocal so that -0.0 (reciprocal -∞) is handled; our
        // parallel-axis rule must give the same answer for both zeros and never a NaN.
        Hit(new RaySetup(1.5, 1.5, 5, zero, zero, -1), out SlabHit h).Should().BeTrue();
        h.Near.Should().Be(3);
        h.Far.Should().Be(4);
        double.IsNaN(h.Near).Should().BeFalse();
        Hit(new RaySetup(2.5, 1.5, 5, zero, zero, -1), out _).Should().BeFalse("x = 2.5 lies outside the x slab");
    }

    public static TheoryData<int, bool, int, double> FacePlanes()
    {
        var data = new TheoryData<int, bool, int, double>();
        for (int axis = 0; axis < 3; axis++)
            foreach (bool low in new[] { true, false })
                for (int along = 0; along < 3; along++)
                    if (along != axis)
                        foreach (double zero in new[] { 0.0, -0.0 })
                            data.Add(axis, low, along, zero);
        return data;
    }

    [Theory]
    [MemberData(nameof(FacePlanes))]
    public void A_ray_lying_in_a_face_plane_is_inside_at_the_low_face_and_outside_at_the_high_face(int axis, bool low, int along, double zero)
    {
        // Documented rule (docs/strategies.md): half-open slabs, as voxel x owns [x, x+1). The naive formula forms
        // 0·∞ = NaN here and answers differently per axis; the rule answers the same on all six faces.
        var o = new double[] { 1.5, 1.5, 1.5 };
        var d = new double[] { zero, zero, zero };
        o[axis] = low ? 1 : 2;
        o[along] = -4;
        d[along] = 1;
        var ray = new RaySetup(o[0], o[1], o[2], d[0], d[1], d[2]);
        bool hit = Hit(ray, out SlabHit h);
        hit.Should().Be(low);
        if (hit)
        {
            h.Near.Should().Be(5);
            h.Far.Should().Be(6);
        }
    }
}
