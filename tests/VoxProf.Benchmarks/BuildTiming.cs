using System.Diagnostics;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;
using VoxProf.Core.Trees;

namespace VoxProf.Benchmarks;

/// <summary>
/// `dotnet run -c Release --project tests/VoxProf.Benchmarks -- build SCENE [2|4]`: loads a scene (files read, mesh
/// bins built), builds one tree, and prints the load and build wall times, CPU time, the tree's own bytes, the bytes
/// the mesh layers hold, and the process's peak working set.
/// </summary>
public static class BuildTiming
{
    public static void Run(string path, int branching, TextWriter output)
    {
        // A warm-up scene beside this one (NAME.warmup.vpscene.json) is loaded and built first, so JIT-compiled code and
        // the runtime's own buffers are part of the baseline rather than of the figure for this scene.
        string warmup = path.Replace(SceneLoader.Extension, ".warmup" + SceneLoader.Extension, StringComparison.Ordinal);
        if (warmup != path && File.Exists(warmup))
            TreeBuilder.Build(SceneLoader.Load(warmup), branching);
        GC.Collect();
        var process = Process.GetCurrentProcess();
        long baseline = process.WorkingSet64;
        TimeSpan cpu0 = process.TotalProcessorTime;
        var load = Stopwatch.StartNew();
        Scene scene = SceneLoader.Load(path);
        load.Stop();
        process.Refresh();
        double peakAfterLoad = process.PeakWorkingSet64 / 1048576.0;
        TimeSpan loadCpu = process.TotalProcessorTime - cpu0;
        var sw = Stopwatch.StartNew();
        BrickTree tree = TreeBuilder.Build(scene, branching);
        sw.Stop();
        process.Refresh();
        TimeSpan cpu = process.TotalProcessorTime - cpu0;
        long meshBytes = scene.Layers.OfType<MeshLayer>().Sum(m => m.Bytes);
        long triangles = scene.Layers.OfType<MeshLayer>().Sum(m => (long)m.TriangleCount);
        double peak = process.PeakWorkingSet64 / 1048576.0, tree0 = tree.Stats.TotalBytes / 1048576.0, mesh = meshBytes / 1048576.0;
        output.WriteLine(FormattableString.Invariant(
            $"{scene.Name} {scene.ExtentX}x{scene.ExtentY}x{scene.ExtentZ} N={branching}: load {load.Elapsed.TotalSeconds:F2} s (cpu {loadCpu.TotalSeconds:F2} s), build {sw.Elapsed.TotalSeconds:F2} s (cpu {(cpu - loadCpu).TotalSeconds:F2} s), {tree.Stats.NodeCount} nodes, {tree.Stats.SolidVoxels} solid voxels, tree {tree0:F0} MiB, peak working set {peak:F0} MiB ({peakAfterLoad:F0} MiB after loading), {Environment.ProcessorCount} cores"));
        if (triangles > 0)
        {
            output.WriteLine(FormattableString.Invariant(
                $"mesh layers: {triangles} triangles, {mesh:F1} MiB (vertices, triangles, bins); peak / (tree + mesh) = {peak / (tree0 + mesh):F2}, peak above the {baseline / 1048576.0:F0} MiB before loading (after the warm-up) / (tree + mesh) = {(peak - baseline / 1048576.0) / (tree0 + mesh):F2}"));
        }
    }
}
