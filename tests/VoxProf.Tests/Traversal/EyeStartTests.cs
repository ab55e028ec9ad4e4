using VoxProf.Core.Rays;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// A ray that starts at an eye inside the volume takes its first voxel from the eye's coordinates when the eye lies
/// strictly between planes (RayStart's shortcut); it must be the voxel the crossing order's general search finds, for
/// eyes on planes, just off them, on the volume's faces and for directions with zero and negative-zero components.
/// </summary>
public class EyeStartTests
{
    private const int Size = 16;

    private static readonly double[] Coordinates = [0, 0.5, 3, 3.0000001, 2.9999999, 7.25, 15.999999, 8 + 1e-12, 8 - 1e-12];
    private static readonly double[] Components = [1, -1, 0.5, -0.25, 1e-9, -1e-9, 0, -0.0];

    private static readonly TreeView View = new(DenseTree.Build(Size, Size, Size, (_, _, _) => 0, 4));

    [Fact]
    public void The_start_voxel_at_the_eye_is_the_one_the_general_search_finds()
    {
        int checkedRays = 0;
        foreach (double ox in Coordinates)
            foreach (double oy in new[] { 0.5, 4, 9.75 })
                foreach (double oz in new[] { 1e-9, 6, 12.5 })
                    foreach (double dx in Components)
                        foreach (double dy in Components)
                            foreach (double dz in new[] { 0.75, -1, 0 })
                            {
                                if (dx == 0 && dy == 0 && dz == 0)
                                    continue;
                                if (StartsAsTheSearchSays(new RaySetup(ox, oy, oz, dx, dy, dz)))
                                    checkedRays++;
                            }
        // Every eye above is inside the volume, so nearly every ray starts at it (t = 0): the shortcut's own case.
        checkedRays.Should().BeGreaterThan(4000);
    }

    /// <summary>
    /// A direction far from unit length: 1/d is so small that the time of a plane just above the eye rounds to 0,
    /// which the crossing order reads as "not crossed yet" moving down, so the eye's voxel is the one above ⌊o⌋.
    /// </summary>
    [Fact]
    public void A_direction_whose_plane_times_underflow_is_left_to_the_general_search()
    {
        var ray = new RaySetup(0.9999999999999999, 4.5, 4.5, -1.7e308, 0.5, 0.5);
        CrossingOrder.Time(1, ray.Ox, ray.Ix).Should().Be(0, "the premise: the plane above the eye is at time 0");
        StartsAsTheSearchSays(ray).Should().BeTrue();
    }

    /// <summary>Clips the ray and checks its start voxel against <see cref="CrossingOrder.Cell"/>; false when it misses.</summary>
    private static bool StartsAsTheSearchSays(RaySetup ray)
    {
        var counters = new NoCounters();
        if (!RayStart.Clip(View, ray, 0, ref counters, out RayStart start))
            return false;
        int a = start.FaceAxis;
        double t = start.T;
        int x = CrossingOrder.Cell(ray.Ox, ray.Dx, ray.Ix, ray.ParallelX, 0, t, a, -1, Size + 2, 0, out _, out _) - 1;
        int y = CrossingOrder.Cell(ray.Oy, ray.Dy, ray.Iy, ray.ParallelY, 1, t, a, -1, Size + 2, 0, out _, out _) - 1;
        int z = CrossingOrder.Cell(ray.Oz, ray.Dz, ray.Iz, ray.ParallelZ, 2, t, a, -1, Size + 2, 0, out _, out _) - 1;
        (start.X, start.Y, start.Z).Should().Be((x, y, z), $"eye ({ray.Ox}, {ray.Oy}, {ray.Oz}), direction ({ray.Dx}, {ray.Dy}, {ray.Dz})");
        return true;
    }
}
