using System.Numerics;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;

namespace VoxProf.Tests.Scenes;

public class CameraChecksTests
{
    private static readonly Vector3 Eye = new(10, 20, 30);

    [Theory]
    [InlineData(1.0)]
    [InlineData(60.0)]
    [InlineData(179.0)]
    public void A_field_of_view_from_1_to_179_degrees_is_accepted(double fov)
    {
        CameraChecks.Check(Eye, Eye + Vector3.UnitZ, Vector3.UnitY, (float)fov).Should().BeNull();
    }

    [Theory]
    [InlineData(0.999)]
    [InlineData(179.01)]
    [InlineData(double.NaN)]
    public void A_field_of_view_outside_1_to_179_degrees_is_the_fov_at_fault(double fov)
    {
        CameraChecks.Check(Eye, Eye + Vector3.UnitZ, Vector3.UnitY, (float)fov)!.Part.Should().Be(CameraPart.Fov);
    }

    [Fact]
    public void Up_just_across_the_sine_limit_is_accepted_and_just_inside_it_is_refused()
    {
        // View along +z; up leaning towards the view by an angle whose sine is 1.1e-3 and 0.9e-3 of the 1e-3 limit.
        Vector3 At(double sine) => new((float)0, (float)sine, (float)Math.Sqrt(1 - sine * sine));

        CameraChecks.Check(Eye, Eye + new Vector3(0, 0, 5), At(1.1e-3), 60).Should().BeNull();
        CameraChecks.Check(Eye, Eye + new Vector3(0, 0, 5), At(0.9e-3), 60)!.Part.Should().Be(CameraPart.Up);
    }

    [Fact]
    public void Looking_straight_down_with_the_default_up_blames_the_target_and_with_a_given_up_blames_up()
    {
        var down = Eye - new Vector3(0, 10, 0);

        CameraChecks.Check(Eye, down, Vector3.UnitY, 60, upIsDefault: true)!.Part.Should().Be(CameraPart.Target);
        CameraChecks.Check(Eye, down, -Vector3.UnitY, 60)!.Part.Should().Be(CameraPart.Up);
        CameraChecks.Check(Eye, down, Vector3.UnitZ, 60).Should().BeNull();
    }

    // What the checks protect: the tracer's own camera (Core.Rays.Camera) gives finite unit rays for every camera the
    // checks accept, including ones near each limit, and NaN for the tiny vectors they refuse.
    [Theory]
    [InlineData(0, 20, 0, 32, 20, 32, 0, 1, 0, true)]
    [InlineData(0, 20, 0, 32, 20, 32, 1e-30, 1e-30, 0, false)]
    [InlineData(0, 0, 0, 1e-30, 0, 0, 0, 1, 0, false)]
    [InlineData(0, 20, 0, 32, 20, 32, 1, 0.003, 1, true)]
    [InlineData(5, 5, 5, 5.001, 5, 5, 0, 1, 0, true)]
    [InlineData(0, 0, 0, 1e-20, 0, 0, 0, 1, 0, true)] // short, but float still normalises it
    public void Accepted_cameras_give_finite_unit_rays_and_refused_tiny_ones_would_not(
        float ex, float ey, float ez, float tx, float ty, float tz, float ux, float uy, float uz, bool accepted)
    {
        var spec = new CameraSpec("c", new(ex, ey, ez), new(tx, ty, tz), new(ux, uy, uz), 60);

        var problem = CameraChecks.Check(spec.Eye, spec.Target, spec.Up, spec.FovYDegrees);

        (problem is null).Should().Be(accepted, problem?.Message);
        var camera = new Camera(spec, 16, 9);
        bool finiteUnit = Enumerable.Range(0, 16 * 9).Select(i => camera.Direction(i % 16, i / 16))
            .All(d => float.IsFinite(d.X) && float.IsFinite(d.Y) && float.IsFinite(d.Z) && Math.Abs(d.Length() - 1) < 1e-5);
        if (accepted)
            finiteUnit.Should().BeTrue();
        else if (spec.Up.Length() < 1e-20 || (spec.Target - spec.Eye).Length() < 1e-19)
            finiteUnit.Should().BeFalse("normalising a vector this short in float gives NaN or infinity");
    }
}
