using System.Diagnostics;
using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;

namespace VoxProf.Benchmarks;

/// <summary>
/// `dotnet run -c Release --project tests/VoxProf.Benchmarks -- build SCENE [2|4]`: builds one tree and prints wall time,
/// CPU time, the tree's own bytes and the process's peak working set.
/// </summary>
public static class BuildTiming
{
    public static void Run(Scene scene, int branching, TextWriter output)
    {
        var process = Process.GetCurrentProcess();
        TimeSpan cpu0 = process.TotalProcessorTime;
        var sw = Stopwatch.StartNew();
        BrickTree tree = TreeBuilder.Build(scene, branching);
        sw.Stop();
        process.Refresh();
        TimeSpan cpu = process.TotalProcessorTime - cpu0;
        output.WriteLine(FormattableString.Invariant(
            $"{scene.Name} {scene.ExtentX}x{scene.ExtentY}x{scene.ExtentZ} N={branching}: wall {sw.Elapsed.TotalSeconds:F2} s, cpu {cpu.TotalSeconds:F2} s, {tree.Stats.NodeCount} nodes, {tree.Stats.SolidVoxels} solid voxels, tree {tree.Stats.TotalBytes / 1048576.0:F0} MiB, peak working set {process.PeakWorkingSet64 / 1048576.0:F0} MiB, {Environment.ProcessorCount} cores"));
    }
}
