using System.Numerics;
using VoxProf.Core.Scenes.Paths;

namespace VoxProf.Tests.Scenes.Paths;

public sealed class CatmullRomTests
{
    // Worked by hand from the published definition: Yuksel, Schaefer & Keyser, "Parameterization and applications of
    // Catmull-Rom curves" (Computer-Aided Design 43(7), 2011), centripetal knots t(i+1) = t(i) + |P(i+1) - P(i)|^0.5,
    // evaluated with the Barry-Goldman pyramid their eq. 1-3 give.
    // P0 = (0,0), P1 = (4,0), P2 = (4,1), P3 = (4,5): |P1-P0| = 4, |P2-P1| = 1, |P3-P2| = 4, so t = 0, 2, 3, 5.
    // Halfway along the middle segment, t = 2.5:
    //   A1 = (-0.5/2) P0 + (2.5/2) P1 = (5, 0)      A2 = 0.5 P1 + 0.5 P2 = (4, 0.5)      A3 = (2.5/2) P2 + (-0.5/2) P3 = (4, 0)
    //   B1 = (0.5/3) A1 + (2.5/3) A2 = (25/6, 5/12)  B2 = (2.5/3) A2 + (0.5/3) A3 = (4, 5/12)
    //   C  = 0.5 B1 + 0.5 B2 = (49/12, 5/12)
    // A quarter along, t = 2.25:
    //   A1 = (-0.25/2) P0 + (2.25/2) P1 = (4.5, 0)  A2 = 0.75 P1 + 0.25 P2 = (4, 0.25)   A3 = (2.75/2) P2 + (-0.75/2) P3 = (4, -0.5)
    //   B1 = (0.75/3) A1 + (2.25/3) A2 = (4.125, 0.1875)   B2 = (2.75/3) A2 + (0.25/3) A3 = (4, 0.1875)
    //   C  = 0.75 B1 + 0.25 B2 = (4.09375, 0.1875)
    private static readonly Vector3 P0 = new(0, 0, 0), P1 = new(4, 0, 0), P2 = new(4, 1, 0), P3 = new(4, 5, 0);

    [Theory]
    [InlineData(0.5, 49.0 / 12, 5.0 / 12)]
    [InlineData(0.25, 4.09375, 0.1875)]
    public void Centripetal_segment_matches_the_hand_worked_Barry_Goldman_pyramid(double s, double x, double y)
    {
        Vector3 p = CatmullRom.Segment(P0, P1, P2, P3, s);

        ((double)p.X).Should().BeApproximately(x, 1e-5);
        ((double)p.Y).Should().BeApproximately(y, 1e-5);
        p.Z.Should().Be(0);
    }

    [Fact]
    public void Segment_passes_through_its_end_keys()
    {
        CatmullRom.Segment(P0, P1, P2, P3, 0).Should().Be(P1);
        (CatmullRom.Segment(P0, P1, P2, P3, 1) - P2).Length().Should().BeLessThan(1e-5f);
    }

    [Fact]
    public void A_path_frame_halfway_between_keys_is_the_hand_worked_point()
    {
        // Seven frames over four keys: frame 3 lies at key parameter 1.5, the middle of the segment worked above.
        var path = new CameraPath("walk", [new(P0, P0 + Vector3.UnitZ * 10), new(P1, P1 + Vector3.UnitZ * 10),
            new(P2, P2 + Vector3.UnitZ * 10), new(P3, P3 + Vector3.UnitZ * 10)], 7, PathInterpolation.CatmullRom, Vector3.UnitY, 60);

        var frame = path.Frame(3);

        frame.Name.Should().Be("walk#003");
        ((double)frame.Eye.X).Should().BeApproximately(49.0 / 12, 1e-5);
        ((double)frame.Eye.Y).Should().BeApproximately(5.0 / 12, 1e-5);
        // The targets are the eyes moved along z: the curve moves with them (same knots, affine invariance).
        ((double)frame.Target.Z).Should().BeApproximately(10, 1e-5);
    }

    [Theory]
    [InlineData(PathInterpolation.CatmullRom)]
    [InlineData(PathInterpolation.Linear)]
    public void Evenly_spaced_collinear_keys_give_evenly_spaced_frames(PathInterpolation interpolation)
    {
        var direction = Vector3.Normalize(new Vector3(3, 1, -2));
        var keys = Enumerable.Range(0, 5).Select(i => new PathKey(new Vector3(10, 20, 30) + direction * (12 * i), new Vector3(500, 20, 30))).ToArray();
        var path = new CameraPath("line", keys, 33, interpolation, Vector3.UnitY, 60);

        var eyes = path.AllFrames().Select(f => f.Eye).ToArray();
        var steps = eyes.Zip(eyes.Skip(1), (a, b) => (b - a).Length()).ToArray();

        // 4 gaps of 12 voxels over 32 frame steps: 1.5 voxels each.
        steps.Should().AllSatisfy(d => ((double)d).Should().BeApproximately(1.5, 1e-3));
        eyes[0].Should().Be(keys[0].Eye);
        (eyes[^1] - keys[^1].Eye).Length().Should().BeLessThan(1e-3f);
        // On the line: no frame leaves it.
        eyes.Should().AllSatisfy(e => Vector3.Cross(e - keys[0].Eye, direction).Length().Should().BeLessThan(1e-3f));
    }

    [Fact]
    public void A_short_turn_between_long_edges_bulges_far_less_than_the_uniform_curve()
    {
        // Keys on three sides of a long thin rectangle. The uniform curve (tangents (P(i+1) - P(i-1)) / 2, the
        // original Catmull-Rom spline, from memory) swings well past x = 100 on the short edge; the centripetal one,
        // whose knots shrink with the short edge, barely leaves it (Yuksel et al. 2011, section 4).
        Vector3[] keys = [new(0, 0, 0), new(100, 0, 0), new(100, 2, 0), new(0, 2, 0)];
        double centripetal = 0, uniform = 0;
        for (int i = 0; i <= 100; i++)
        {
            double s = i / 100.0;
            centripetal = Math.Max(centripetal, CatmullRom.Segment(keys[0], keys[1], keys[2], keys[3], s).X - 100);
            uniform = Math.Max(uniform, Uniform(keys[0], keys[1], keys[2], keys[3], s).X - 100);
        }

        uniform.Should().BeGreaterThan(5);
        centripetal.Should().BeLessThan(uniform / 10);
    }

    private static Vector3 Uniform(Vector3 p0, Vector3 p1, Vector3 p2, Vector3 p3, double s)
    {
        // Cubic Hermite between p1 and p2 with the uniform tangents.
        float t = (float)s, t2 = t * t, t3 = t2 * t;
        Vector3 m1 = (p2 - p0) / 2, m2 = (p3 - p1) / 2;
        return (2 * t3 - 3 * t2 + 1) * p1 + (t3 - 2 * t2 + t) * m1 + (-2 * t3 + 3 * t2) * p2 + (t3 - t2) * m2;
    }

    [Fact]
    public void Frame_names_are_zero_padded_to_the_width_of_the_last()
    {
        var keys = new PathKey[] { new(Vector3.Zero, Vector3.UnitX), new(Vector3.UnitZ, Vector3.UnitX + Vector3.UnitZ) };

        new CameraPath("walk", keys, 120, PathInterpolation.Linear, Vector3.UnitY, 60).FrameName(7).Should().Be("walk#007");
        new CameraPath("walk", keys, 120, PathInterpolation.Linear, Vector3.UnitY, 60).FrameName(119).Should().Be("walk#119");
        new CameraPath("walk", keys, 1001, PathInterpolation.Linear, Vector3.UnitY, 60).FrameName(7).Should().Be("walk#0007");
    }

    [Fact]
    public void A_key_that_repeats_its_neighbour_keeps_the_curve_finite()
    {
        Vector3[] keys = [new(0, 0, 0), new(0, 0, 0), new(10, 0, 0), new(10, 0, 0), new(20, 5, 0)];
        for (int i = 0; i <= 40; i++)
        {
            Vector3 p = CatmullRom.Point(keys, i / 10.0);
            float.IsFinite(p.X + p.Y + p.Z).Should().BeTrue();
        }
        CatmullRom.Point(keys, 0.5).Should().Be(Vector3.Zero);
    }
}
