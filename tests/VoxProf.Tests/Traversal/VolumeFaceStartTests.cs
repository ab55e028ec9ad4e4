using System.Numerics;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// An eye exactly on a face of the volume, for every strategy with and without the prepass. Documented rule
/// (docs/strategies.md, "Rays"): voxels are half-open, so an eye on a low face (x, y or z = 0) is inside the voxel above
/// it and a ray from there starts inside (t = 0, no entry face) whichever way it points; an eye on a high face is
/// outside, a ray moving in enters the voxel below through that face at t = 0, and a ray moving away misses.
/// </summary>
public class VolumeFaceStartTests
{
    private const int Size = 32;

    private static readonly BrickTree[] Trees = [Full(2), Full(4)];

    private static BrickTree Full(int branching) => DenseTree.Build(Size, Size, Size, (_, _, _) => 5, branching);

    private static Vector3 Along(int axis, float value, float a, float b) => axis switch
    {
        0 => new Vector3(value, a, b),
        1 => new Vector3(a, value, b),
        _ => new Vector3(a, b, value),
    };

    private static IEnumerable<TraceRun> Runs(int axis, float faceValue, float lookSign)
    {
        // The eye sits on the face; the other two coordinates are inside voxel 14 and 20.
        Vector3 eye = Along(axis, faceValue, 14.25f, 20.75f);
        Vector3 up = axis == 1 ? Vector3.UnitX : Vector3.UnitY;
        var cam = new CameraSpec("face", eye, eye + Along(axis, 10 * lookSign, 0, 0), up, 60);
        Scene scene = DenseTree.SceneOf(Size, Size, Size);
        foreach (BrickTree tree in Trees)
            foreach (int prepass in new[] { 0, 2 })
                yield return Tracer.Run(new TraceRequest(scene, tree, cam, 12, 8, BuiltInStrategies.All, prepass, 1));
    }

    private static (int X, int Y, int Z) Expected(int axis, int faceVoxel)
    {
        Vector3 v = Along(axis, faceVoxel, 14, 20);
        return ((int)v.X, (int)v.Y, (int)v.Z);
    }

    [Theory]
    [InlineData(0, 1f)]
    [InlineData(0, -1f)]
    [InlineData(1, 1f)]
    [InlineData(1, -1f)]
    [InlineData(2, 1f)]
    [InlineData(2, -1f)]
    public void An_eye_on_a_low_face_starts_inside_the_voxel_above_it(int axis, float lookSign)
    {
        (int x, int y, int z) = Expected(axis, 0);
        foreach (TraceRun run in Runs(axis, 0f, lookSign))
            foreach (StrategyResult r in run.Results)
                r.Hits.Should().OnlyContain(h => h.Hit && h.X == x && h.Y == y && h.Z == z && h.T == 0 && h.Face == HitFace.None,
                    $"{r.Strategy.Name} (branching {run.Settings.Branching}, prepass {run.Settings.PrepassBlock}) starts inside solid voxel ({x},{y},{z})");
    }

    [Theory]
    [InlineData(0)]
    [InlineData(1)]
    [InlineData(2)]
    public void An_eye_on_a_high_face_enters_through_it_at_distance_zero_or_misses_moving_away(int axis)
    {
        (int x, int y, int z) = Expected(axis, Size - 1);
        var face = (HitFace)(2 + 2 * axis);
        foreach (TraceRun run in Runs(axis, Size, -1f))
            foreach (StrategyResult r in run.Results)
                r.Hits.Should().OnlyContain(h => h.Hit && h.X == x && h.Y == y && h.Z == z && h.T == 0 && h.Face == face,
                    $"{r.Strategy.Name} enters voxel ({x},{y},{z}) through its +{"xyz"[axis]} face");
        foreach (TraceRun run in Runs(axis, Size, 1f))
            foreach (StrategyResult r in run.Results)
            {
                r.Hits.Should().OnlyContain(h => !h.Hit, $"{r.Strategy.Name} moves away from the volume");
                r.Get(Counter.Iterations).ToArray().Should().OnlyContain(v => v == 0);
            }
    }
}
