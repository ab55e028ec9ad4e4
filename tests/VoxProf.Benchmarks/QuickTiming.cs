using System.Diagnostics;
using VoxProf.Core.Memory;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Benchmarks;

/// <summary>
/// The tool's own timing: `dotnet run -c Release --project tests/VoxProf.Benchmarks -- quick SCENE [WxH]` traces
/// every camera of a scene with every strategy, once with counters, once with counting compiled out and once with
/// counters and the memory model, and prints wall time, rays per second and loop iterations per second per core. Faster to run than the BenchmarkDotNet suite.
/// </summary>
public static class QuickTiming
{
    public static void Run(Scene scene, int width, int height, int branching, int prepass, TextWriter output)
    {
        var sw = Stopwatch.StartNew();
        BrickTree tree = TreeBuilder.Build(scene, branching);
        output.WriteLine($"scene {scene.Name}: extent {scene.ExtentX}x{scene.ExtentY}x{scene.ExtentZ}, N={branching}, " +
            $"build {sw.Elapsed.TotalSeconds:F2} s, {tree.Stats.NodeCount} nodes, cores {Environment.ProcessorCount}");
        int cores = Environment.ProcessorCount;
        // CPU seconds as well as wall time: on a shared machine the CPU figure is the steadier per-core measure.
        output.WriteLine("camera,strategy,prepass,wall_s_counting,wall_s_uncounted,mrays_per_s,iterations_per_pixel,m_iterations_per_s_per_core_counting,m_iterations_per_s_per_core_uncounted,m_iterations_per_cpu_s_counting,m_iterations_per_cpu_s_uncounted,wall_s_memory_model");
        foreach (CameraSpec cam in scene.Cameras)
        {
            foreach (StrategyDefinition s in BuiltInStrategies.All)
            {
                // Warm up the JIT's optimised code for this kernel before timing.
                Tracer.Run(new TraceRequest(scene, tree, cam, 160, 90, [s], prepass));
                Tracer.Run(new TraceRequest(scene, tree, cam, 160, 90, [s], prepass, CountWork: false));
                TimeSpan cpu0 = Process.GetCurrentProcess().TotalProcessorTime;
                TraceRun counted = Tracer.Run(new TraceRequest(scene, tree, cam, width, height, [s], prepass));
                TimeSpan cpu1 = Process.GetCurrentProcess().TotalProcessorTime;
                TraceRun bare = Tracer.Run(new TraceRequest(scene, tree, cam, width, height, [s], prepass, CountWork: false));
                TimeSpan cpu2 = Process.GetCurrentProcess().TotalProcessorTime;
                Tracer.Run(new TraceRequest(scene, tree, cam, 160, 90, [s], prepass, Memory: MemorySettings.Default));
                TraceRun modelled = Tracer.Run(new TraceRequest(scene, tree, cam, width, height, [s], prepass, Memory: MemorySettings.Default));
                double tc = counted.Results[0].Elapsed.TotalSeconds, tu = bare.Results[0].Elapsed.TotalSeconds;
                long iterations = counted.Results[0].Counters[(int)Counter.Iterations].Sum(v => (long)v)
                    + counted.Results[0].Counters[(int)Counter.PrepassIterations].Sum(v => (long)v);
                double pixels = (double)width * height;
                output.WriteLine(FormattableString.Invariant(
                    $"{cam.Name},{s.Name},{prepass},{tc:F3},{tu:F3},{pixels / tc / 1e6:F2},{iterations / pixels:F1},{iterations / tc / cores / 1e6:F1},{iterations / tu / cores / 1e6:F1},{iterations / (cpu1 - cpu0).TotalSeconds / 1e6:F1},{iterations / (cpu2 - cpu1).TotalSeconds / 1e6:F1},{modelled.Results[0].Elapsed.TotalSeconds:F3}"));
            }
        }
    }
}
