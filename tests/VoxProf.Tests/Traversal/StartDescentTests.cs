using VoxProf.Core.Rays;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// A descent made before the walk's first step takes the start voxel's ancestor (<see cref="DdaState.DescendToStart"/>)
/// instead of searching the crossing order (<see cref="DdaState.Descend"/>); from the root down to voxels, both must give
/// the same cell and the same next-plane times, for starts at the eye, at the volume's faces and at a prepass distance,
/// including rays through edges and corners and eyes on planes.
/// </summary>
public class StartDescentTests
{
    private const int Size = 64;

    private static IEnumerable<(RaySetup Ray, double TMin)> Rays()
    {
        var random = new Random(20261203);
        double[] eyes = [0, 7.5, 16, 31.999999, 32, 40.25];
        foreach (double ex in eyes)
            foreach (double ey in new[] { 3.0, 12.5, 63.75 })
                foreach (double ez in new[] { -10.0, 0.5, 48 })
                {
                    // Corner and edge directions (exact ties on two or three axes), then random ones.
                    yield return (new RaySetup(ex, ey, ez, 1, 1, 1), 0);
                    yield return (new RaySetup(ex, ey, ez, -1, 1, 0), 0);
                    yield return (new RaySetup(ex, ey, ez, 0.5, -0.5, 0.25), 7);
                    for (int i = 0; i < 12; i++)
                    {
                        double dx = random.NextDouble() * 2 - 1, dy = random.NextDouble() * 2 - 1, dz = random.NextDouble() * 2 - 1;
                        double length = Math.Sqrt(dx * dx + dy * dy + dz * dz);
                        yield return (new RaySetup(ex, ey, ez, dx / length, dy / length, dz / length), i % 3 == 0 ? random.NextDouble() * 40 : 0);
                    }
                }
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    public void Descending_to_the_start_voxel_matches_the_crossing_search_at_every_level(int branching)
    {
        var view = new TreeView(DenseTree.Build(Size, Size, Size, (_, _, _) => 0, branching));
        int compared = 0;
        foreach ((RaySetup ray, double tMin) in Rays())
        {
            var counters = new NoCounters();
            if (!RayStart.Clip(view, ray, tMin, ref counters, out RayStart start))
                continue;
            var searched = DdaState.Start(ray, start.T, start.FaceAxis, start.X >> view.RootShift, start.Y >> view.RootShift,
                start.Z >> view.RootShift, view.RootShift);
            var direct = searched;
            while (searched.Shift > 0)
            {
                if (branching == 2)
                {
                    searched.Descend<Branching2>(ray);
                    direct.DescendToStart<Branching2>(ray, start.X, start.Y, start.Z);
                }
                else
                {
                    searched.Descend<Branching4>(ray);
                    direct.DescendToStart<Branching4>(ray, start.X, start.Y, start.Z);
                }
                direct.Should().Be(searched, $"eye ({ray.Ox}, {ray.Oy}, {ray.Oz}), direction ({ray.Dx}, {ray.Dy}, {ray.Dz}), start t {start.T}");
                compared++;
            }
            (direct.X, direct.Y, direct.Z).Should().Be((start.X, start.Y, start.Z), "at voxel level the walk is in its start voxel");
        }
        compared.Should().BeGreaterThan(500);
    }
}
