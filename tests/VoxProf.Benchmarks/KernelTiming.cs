using System.Diagnostics;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Benchmarks;

/// <summary>
/// `kernels SCENE CAMERA WxH REPS [BRANCHING [nocount]]`: the tile loop of `dda`, `dda-mask` and `hdda` alone, one
/// thread, counting on (or compiled out), REPS times each in turn, printing the fastest and the median time of the traced tiles (result buffers
/// are allocated before the timed region) and the iterations done. The fastest of several runs is the figure least moved
/// by other jobs on a shared machine, so two builds of the kernels compare by it (run them one after the other).
/// </summary>
public static class KernelTiming
{
    private static readonly StrategyDefinition[] Strategies = [BuiltInStrategies.Dda, BuiltInStrategies.DdaMask, BuiltInStrategies.Hdda];

    public static void Run(Scene scene, string camera, int width, int height, int reps, int branching, bool count, TextWriter output)
    {
        BrickTree tree = TreeBuilder.Build(scene, branching);
        CameraSpec cam = scene.Cameras.FirstOrDefault(c => c.Name == camera) ?? throw new ArgumentException($"no camera '{camera}'");
        foreach (StrategyDefinition s in Strategies)
            Tracer.Run(new TraceRequest(scene, tree, cam, 160, 90, [s], Threads: 1));
        var times = Strategies.ToDictionary(s => s, _ => new List<double>());
        var iterations = new Dictionary<StrategyDefinition, long>();
        for (int r = 0; r < reps; r++)
        {
            foreach (StrategyDefinition s in Strategies)
            {
                GC.Collect();
                TraceRun run = Tracer.Run(new TraceRequest(scene, tree, cam, width, height, [s], Threads: 1, CountWork: count));
                times[s].Add(run.Results[0].Elapsed.TotalSeconds);
                iterations[s] = run.Results[0].Counters[(int)Counter.Iterations].Sum(v => (long)v);
            }
        }
        output.WriteLine(FormattableString.Invariant($"scene {scene.Name}, camera {camera}, {width}x{height}, branching {branching}, {reps} runs each, one thread, counting {(count ? "on" : "off")}"));
        foreach (StrategyDefinition s in Strategies)
        {
            List<double> t = [.. times[s].Order()];
            output.WriteLine(FormattableString.Invariant(
                $"{s.Name,-9} fastest {t[0]:F3} s  median {t[t.Count / 2]:F3} s  {width * height / t[0] / 1e6:F2} M rays/s  iterations {iterations[s]}"));
        }
    }
}
