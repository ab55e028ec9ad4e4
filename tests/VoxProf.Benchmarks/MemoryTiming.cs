using System.Diagnostics;
using VoxProf.Core.Memory;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Benchmarks;

/// <summary>
/// `memory SCENE CAMERA WxH REPS [STRATEGY ...]`: what the memory model adds to a trace, one thread, each strategy
/// traced with the model off and on in turn, REPS times. Prints the fewest process CPU seconds of each (the steadier
/// figure on a machine whose wall clock other jobs stretch) and the difference in nanoseconds a pixel: the model's cost (recording the reads, the pixels' lines, the group unions and the replay),
/// which `trace` pays by default. Then the same split the way `trace` reports it: the fewest wall seconds of the
/// tracing (report.json's trace seconds, which with the model on include recording the reads) off and on, and of the
/// model's own passes (its memory seconds). Also the model's totals, so two builds can be checked to give the same
/// answers.
/// </summary>
public static class MemoryTiming
{
    public static void Run(Scene scene, string camera, int width, int height, int reps, IReadOnlyList<string> names, TextWriter output)
    {
        BrickTree tree = TreeBuilder.Build(scene, 4);
        CameraSpec cam = scene.Cameras.FirstOrDefault(c => c.Name == camera) ?? throw new ArgumentException($"no camera '{camera}'");
        StrategyDefinition[] strategies = names.Count == 0
            ? [BuiltInStrategies.DdaMask, BuiltInStrategies.Dda]
            : [.. names.Select(n => BuiltInStrategies.All.FirstOrDefault(d => d.Name == n) ?? throw new ArgumentException($"unknown strategy {n}"))];
        output.WriteLine(FormattableString.Invariant($"scene {scene.Name}, camera {camera}, {width}x{height}, {reps} runs each, one thread"));
        foreach (StrategyDefinition s in strategies)
        {
            // The JIT's optimised code for both counter types before timing.
            Tracer.Run(new TraceRequest(scene, tree, cam, 160, 90, [s], Threads: 1));
            Tracer.Run(new TraceRequest(scene, tree, cam, 160, 90, [s], Threads: 1, Memory: MemorySettings.Default));
            double off = double.MaxValue, on = double.MaxValue;
            double tracingOff = double.MaxValue, tracingOn = double.MaxValue, model = double.MaxValue;
            MemoryResult? result = null;
            for (int r = 0; r < reps; r++)
            {
                GC.Collect();
                TimeSpan cpu0 = Process.GetCurrentProcess().TotalProcessorTime;
                StrategyResult plain = Tracer.Run(new TraceRequest(scene, tree, cam, width, height, [s], Threads: 1)).Results[0];
                off = Math.Min(off, (Process.GetCurrentProcess().TotalProcessorTime - cpu0).TotalSeconds);
                tracingOff = Math.Min(tracingOff, plain.Elapsed.TotalSeconds);
                GC.Collect();
                cpu0 = Process.GetCurrentProcess().TotalProcessorTime;
                StrategyResult modelled = Tracer.Run(new TraceRequest(scene, tree, cam, width, height, [s], Threads: 1, Memory: MemorySettings.Default)).Results[0];
                on = Math.Min(on, (Process.GetCurrentProcess().TotalProcessorTime - cpu0).TotalSeconds);
                tracingOn = Math.Min(tracingOn, modelled.Elapsed.TotalSeconds);
                model = Math.Min(model, modelled.MemoryElapsed.TotalSeconds);
                result = modelled.Memory;
            }
            double pixels = (double)width * height;
            string groups = string.Join(" ", result!.Groups.Select(g => FormattableString.Invariant($"{g.Shape.Name} {g.Lines.Sum(v => (long)v)}")));
            output.WriteLine(FormattableString.Invariant(
                $"{s.Name}: model off {off:F3} s, on {on:F3} s, the model {(on - off) / pixels * 1e9:F0} ns a pixel ({on / off:F2}x); accesses {result.Accesses}, hits {result.Hits}, group lines {groups}"));
            output.WriteLine(FormattableString.Invariant(
                $"{s.Name}: trace seconds off {tracingOff:F3} s, on {tracingOn:F3} s ({tracingOn / tracingOff:F2}x: recording the reads), memory seconds {model:F3} s"));
        }
    }
}
