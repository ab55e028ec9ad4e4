using System.Numerics;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;

namespace VoxProf.Tests.Rays;

/// <summary>
/// The camera against its definition in docs/strategies.md ("Rays"), which is the project's own definition of a pixel's
/// ray: the formula is evaluated here independently, in double, and the camera's float directions must agree with it
/// to within float rounding.
/// </summary>
public class CameraFormulaTests
{
    /// <summary>
    /// Float rounding allowance for one direction: each of the roughly two dozen float operations between the camera
    /// spec and a normalised direction adds at most 2^-24 relative error; 64·2^-24 (about 3.8e-6) bounds their sum
    /// with room to spare, up to 120° fields of view.
    /// </summary>
    private const double FloatTolerance = 64.0 / (1 << 24);

    private static (double X, double Y, double Z) Sub((double X, double Y, double Z) a, (double X, double Y, double Z) b) =>
        (a.X - b.X, a.Y - b.Y, a.Z - b.Z);

    private static (double X, double Y, double Z) Cross((double X, double Y, double Z) a, (double X, double Y, double Z) b) =>
        (a.Y * b.Z - a.Z * b.Y, a.Z * b.X - a.X * b.Z, a.X * b.Y - a.Y * b.X);

    private static (double X, double Y, double Z) Normalize((double X, double Y, double Z) a)
    {
        double l = Math.Sqrt(a.X * a.X + a.Y * a.Y + a.Z * a.Z);
        return (a.X / l, a.Y / l, a.Z / l);
    }

    private static (double X, double Y, double Z) D(Vector3 v) => (v.X, v.Y, v.Z);

    /// <summary>docs/strategies.md, evaluated in double from the spec's values.</summary>
    private static (double X, double Y, double Z) FormulaDirection(CameraSpec spec, int w, int h, int x, int y)
    {
        var forward = Normalize(Sub(D(spec.Target), D(spec.Eye)));
        var right = Normalize(Cross(forward, D(spec.Up)));
        var trueUp = Cross(right, forward);
        double tanHalf = Math.Tan(spec.FovYDegrees * Math.PI / 360.0);
        double u = (2 * (x + 0.5) / w - 1) * tanHalf * w / h;
        double v = (1 - 2 * (y + 0.5) / h) * tanHalf;
        return Normalize((forward.X + u * right.X + v * trueUp.X, forward.Y + u * right.Y + v * trueUp.Y,
            forward.Z + u * right.Z + v * trueUp.Z));
    }

    private static double Angle((double X, double Y, double Z) a, Vector3 b)
    {
        var c = Cross(a, D(b));
        double dot = a.X * b.X + a.Y * b.Y + a.Z * b.Z;
        return Math.Atan2(Math.Sqrt(c.X * c.X + c.Y * c.Y + c.Z * c.Z), dot);
    }

    [Fact]
    public void Every_pixel_direction_follows_the_documented_formula_within_float_rounding()
    {
        var rng = new Random(4242);
        double worst = 0;
        for (int c = 0; c < 40; c++)
        {
            var eye = new Vector3((float)(rng.NextDouble() * 4000 - 2000), (float)(rng.NextDouble() * 500), (float)(rng.NextDouble() * 4000 - 2000));
            var target = eye + new Vector3((float)(rng.NextDouble() * 200 - 100), (float)(rng.NextDouble() * 100 - 50), (float)(rng.NextDouble() * 200 - 100));
            // Keep up at least 10° off the view direction, where the cross product keeps its digits in float.
            Vector3 up = Math.Abs(Vector3.Normalize(target - eye).Y) > 0.98f ? Vector3.UnitX : Vector3.UnitY;
            float fov = 1 + (float)rng.NextDouble() * 119;
            int w = 16 + rng.Next(200), h = 9 + rng.Next(120);
            var spec = new CameraSpec("c", eye, target, up, fov);
            var camera = new Camera(spec, w, h);
            foreach ((int x, int y) in new[] { (0, 0), (w - 1, 0), (0, h - 1), (w - 1, h - 1), (w / 2, h / 2), (rng.Next(w), rng.Next(h)) })
            {
                Vector3 actual = camera.Direction(x, y);
                double angle = Angle(FormulaDirection(spec, w, h, x, y), actual);
                angle.Should().BeLessThan(FloatTolerance, $"camera {c} ({fov}°, {w}x{h}) pixel ({x},{y})");
                Math.Abs((double)actual.Length() - 1).Should().BeLessThan(FloatTolerance, "a direction is normalised so t is a distance in voxels");
                worst = Math.Max(worst, angle);
            }
        }
        worst.Should().BeGreaterThan(0, "float and double evaluations cannot agree bit for bit on every pixel");
    }

    [Fact]
    public void Row_zero_is_the_top_and_column_zero_the_left_of_the_image()
    {
        // docs/strategies.md: pixel (0, 0) is the top-left pixel. Looking along +z with up +y, right is -x.
        var spec = new CameraSpec("c", new Vector3(0, 0, 0), new Vector3(0, 0, 10), Vector3.UnitY, 60);
        var camera = new Camera(spec, 64, 48);
        Vector3 topLeft = camera.Direction(0, 0), bottomRight = camera.Direction(63, 47);
        topLeft.Y.Should().BeGreaterThan(0);
        topLeft.X.Should().BeGreaterThan(0, "forward × up = (0,0,1) × (0,1,0) = (-1,0,0) is right, so the left is +x");
        bottomRight.Y.Should().BeLessThan(0);
        bottomRight.X.Should().BeLessThan(0);
        // The top edge of the image is fov/2 above the axis: the top row's centre is half a pixel below it.
        double expectedUp = Math.Tan(30 * Math.PI / 180) * (1 - 1.0 / 48);
        ((double)camera.Direction(32, 0).Y / camera.Direction(32, 0).Z).Should().BeApproximately(expectedUp, 1e-6);
    }
}
