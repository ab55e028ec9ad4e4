using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;

namespace VoxProf.Core.Traversal;

/// <summary>What to trace. <see cref="PrepassBlock"/> is 0 (off), 2, 4 or 8; <see cref="Threads"/> 0 means every processor.</summary>
public sealed record TraceRequest(
    Scene Scene,
    BrickTree Tree,
    CameraSpec Camera,
    int Width,
    int Height,
    IReadOnlyList<Strategy> Strategies,
    int PrepassBlock = 0,
    int Threads = 0);

/// <summary>Runs every requested strategy over the same rays.</summary>
public static class Tracer
{
    /// <param name="rowsDone">Reports image rows finished, summed over strategies (0 .. Height × Strategies.Count).</param>
    public static TraceRun Run(TraceRequest request, IProgress<int>? rowsDone = null, CancellationToken cancel = default) =>
        throw new NotImplementedException("tracer pending");
}
