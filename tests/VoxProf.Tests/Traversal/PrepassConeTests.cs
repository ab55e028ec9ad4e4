using System.Numerics;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Traversal;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// The prepass cone is measured at a block's four corner pixels only. Against every pixel of the block, each taken as
/// the float direction it traces with: the corner cone, with its rounding allowance, must be at least as wide and as
/// long, and no wider than the allowance intends.
/// </summary>
public class PrepassConeTests
{
    public static TheoryData<float, int, int> Cameras() => new()
    {
        { 1, 1280, 720 }, { 10, 1280, 720 }, { 60, 1280, 720 }, { 120, 160, 90 }, { 170, 160, 90 }, { 179, 64, 48 },
        { 45, 37, 53 }, { 90, 53, 37 },
    };

    [Theory]
    [MemberData(nameof(Cameras))]
    public void The_corner_cone_holds_every_pixel_ray_of_its_block(float fov, int width, int height)
    {
        var rng = new Random((int)fov * 7919 + width);
        int checkedBlocks = 0;
        for (int c = 0; c < 3; c++)
        {
            var eye = new Vector3(rng.NextSingle() * 100, rng.NextSingle() * 100, rng.NextSingle() * 100);
            var target = eye + new Vector3(rng.NextSingle() * 2 - 1, rng.NextSingle() * 2 - 1, rng.NextSingle() * 2 - 1);
            var camera = new Camera(new CameraSpec("c", eye, target, Vector3.UnitY, fov), width, height);
            foreach (int block in new[] { 2, 4, 8 })
            {
                for (int y0 = 0; y0 < height; y0 += block)
                {
                    for (int x0 = 0; x0 < width; x0 += block)
                    {
                        int x1 = Math.Min(width, x0 + block), y1 = Math.Min(height, y0 + block);
                        Vector3 centre = camera.Direction((x0 + x1) * 0.5f, (y0 + y1) * 0.5f);
                        double length = Math.Sqrt((double)centre.X * centre.X + (double)centre.Y * centre.Y + (double)centre.Z * centre.Z);
                        double ax = centre.X / length, ay = centre.Y / length, az = centre.Z / length;
                        double slope = PrepassMap.Cone(camera, ax, ay, az, x0, y0, x1, y1);
                        (double exact, double exactLongest) = EveryPixel(camera, ax, ay, az, x0, y0, x1, y1);

                        slope.Should().BeGreaterThanOrEqualTo(exact, "block ({0}, {1}) of {2}", x0, y0, block);
                        PrepassMap.LongestDirection.Should().BeGreaterThanOrEqualTo(exactLongest);
                        if (!double.IsPositiveInfinity(slope))
                        {
                            // The widening is the angle allowance (twice the rounding bound) and nothing more:
                            // tan(θ + e) − tan θ is about e·(1 + tan²θ).
                            double allowance = 2 * camera.DirectionAngleError;
                            (slope - exact).Should().BeLessThanOrEqualTo(2 * allowance * (1 + slope * slope));
                        }
                        PrepassMap.LongestDirection.Should().BeLessThanOrEqualTo(exactLongest + 2 * PrepassMap.LengthAllowance);
                        checkedBlocks++;
                    }
                }
            }
        }
        checkedBlocks.Should().BeGreaterThan(0);
    }

    /// <summary>The cone as it was measured before: over every pixel of the block, with no allowance.</summary>
    private static (double Slope, double Longest) EveryPixel(Camera camera, double ax, double ay, double az, int x0, int y0, int x1, int y1)
    {
        double slope = 0, longest = 0;
        for (int y = y0; y < y1; y++)
        {
            for (int x = x0; x < x1; x++)
            {
                Vector3 p = camera.Direction(x, y);
                double px = p.X, py = p.Y, pz = p.Z;
                double cx = ay * pz - az * py, cy = az * px - ax * pz, cz = ax * py - ay * px;
                double dot = ax * px + ay * py + az * pz;
                slope = Math.Max(slope, dot > 0 ? Math.Sqrt(cx * cx + cy * cy + cz * cz) / dot : double.PositiveInfinity);
                longest = Math.Max(longest, Math.Sqrt(px * px + py * py + pz * pz));
            }
        }
        return (slope, longest);
    }
}
