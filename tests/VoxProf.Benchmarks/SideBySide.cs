using System.Diagnostics;
using System.Globalization;
using System.Text.RegularExpressions;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Benchmarks;

/// <summary>
/// `side REFBRICK SCENE CAMERA WxH ROUNDS`: VoxProf's `dda`, `dda-mask` and `hdda` against the C reference
/// (../shared/perf/refbrick.c, run as a process with `--mode both`) on the same scene and camera, interleaved
/// (VoxProf first in even rounds, the reference first in odd ones) so a drifting machine speed hits both alike.
/// Both sides are timed in CPU seconds on one thread, counting on for VoxProf as in `voxprof trace`: on a shared machine
/// CPU time is the steadier measure of work per core. VoxProf's CPU time is the process's during one
/// <see cref="Tracer.Run"/>, which also holds the allocation and first touch of the result buffers (about 70 MB at
/// 1280×720, which this virtual machine hands out slowly: the ratios understate VoxProf's tracing). A second set of ratios
/// times VoxProf's tracing alone: the wall time of the strategy's timed region on one thread, its buffers allocated
/// before it, as the reference allocates its hit array before its own timing (its first pass still touches those pages).
/// Each side of a round is the fastest of <see cref="Repetitions"/> traces (the reference's own `--reps`): this machine
/// slows whole processes at random, and a slowdown only ever adds time, so the fastest of a few is the figure least
/// moved by it. Prints each round, the medians of the pairwise ratios, and whether both did the same iterations.
/// Also prints the CPU seconds of a `dda-mask` trace at <c>SHARE_SIZE</c>, the fastest of 3 (for the share of a whole
/// run's CPU). On VoxProf's side each round also runs the reference's own loop written in C# (<see cref="ReferenceLoop"/>),
/// so each ratio splits into what the JIT costs on that loop (loop ÷ C) and what VoxProf's kernels cost on top of it
/// (VoxProf ÷ loop).
/// </summary>
public static partial class SideBySide
{
    private static readonly StrategyDefinition[] Strategies = [BuiltInStrategies.Dda, BuiltInStrategies.DdaMask, BuiltInStrategies.Hdda];

    /// <summary>Traces per side of a round, of which the fastest counts.</summary>
    public const int Repetitions = 3;

    public static int Run(string refbrick, string scenePath, string camera, int width, int height, int rounds,
        (int Width, int Height)? shareSize, TextWriter output)
    {
        Scene scene = SceneLoader.Load(scenePath);
        BrickTree tree = TreeBuilder.Build(scene, 4);
        CameraSpec cam = scene.Cameras.FirstOrDefault(c => c.Name == camera)
            ?? throw new ArgumentException($"no camera '{camera}' in {scenePath}");
        foreach (StrategyDefinition s in Strategies)
            Tracer.Run(new TraceRequest(scene, tree, cam, 160, 90, [s], Threads: 1));

        double pixels = (double)width * height;
        var ratios = Strategies.ToDictionary(s => s, _ => new List<double>());
        var tracingRatios = Strategies.ToDictionary(s => s, _ => new List<double>());
        var voxIterations = new Dictionary<StrategyDefinition, long>();
        var cIterations = new Dictionary<string, long>();
        var image = new Camera(cam, width, height);
        var loopRatios = new Dictionary<string, List<double>> { ["dda"] = [], ["mask"] = [] };
        var overLoop = Strategies.ToDictionary(s => s, _ => new List<double>());
        var loopIterations = new Dictionary<string, long>();
        var laneRatios = new Dictionary<string, List<double>> { ["dda"] = [], ["mask"] = [] };
        var laneIterations = new Dictionary<string, long>();
        for (int r = 0; r < rounds; r++)
        {
            Dictionary<StrategyDefinition, double> vox = [];
            Dictionary<StrategyDefinition, double> voxTracing = [];
            Dictionary<string, double> c = [];
            Dictionary<string, double> loop = [];
            Dictionary<string, double> lanes = [];
            for (int side = 0; side < 2; side++)
            {
                if ((side == 0) == (r % 2 == 0))
                {
                    foreach (StrategyDefinition s in Strategies)
                    {
                        var traces = Enumerable.Range(0, Repetitions).Select(_ => TraceCpu(scene, tree, cam, width, height, s)).ToList();
                        (double cpu, double tracing, long iterations) = (traces.Min(t => t.Cpu), traces.Min(t => t.Tracing), traces[0].Iterations);
                        vox[s] = pixels / cpu;
                        voxTracing[s] = pixels / tracing;
                        voxIterations[s] = iterations;
                    }
                    foreach (string mode in new[] { "dda", "mask" })
                    {
                        var runs = Enumerable.Range(0, Repetitions).Select(_ => ReferenceLoop.Run(tree, image, mode == "mask")).ToList();
                        loop[mode] = pixels / runs.Min(t => t.Cpu);
                        loopIterations[mode] = runs[0].Iterations;
                        if (LaneLoop.IsSupported && LaneLoop.Takes(width, height))
                        {
                            var laneRuns = Enumerable.Range(0, Repetitions).Select(_ => LaneLoop.Run(tree, image, mode == "mask")).ToList();
                            lanes[mode] = pixels / laneRuns.Min(t => t.Cpu);
                            laneIterations[mode] = laneRuns[0].Iterations;
                        }
                    }
                }
                else
                {
                    foreach ((string mode, double cpu, long iterations) in Reference(refbrick, scenePath, camera, width, height))
                    {
                        c[mode] = pixels / cpu;
                        cIterations[mode] = iterations;
                    }
                }
            }
            ratios[BuiltInStrategies.Dda].Add(vox[BuiltInStrategies.Dda] / c["dda"]);
            ratios[BuiltInStrategies.DdaMask].Add(vox[BuiltInStrategies.DdaMask] / c["mask"]);
            ratios[BuiltInStrategies.Hdda].Add(vox[BuiltInStrategies.Hdda] / c["dda"]);
            tracingRatios[BuiltInStrategies.Dda].Add(voxTracing[BuiltInStrategies.Dda] / c["dda"]);
            tracingRatios[BuiltInStrategies.DdaMask].Add(voxTracing[BuiltInStrategies.DdaMask] / c["mask"]);
            tracingRatios[BuiltInStrategies.Hdda].Add(voxTracing[BuiltInStrategies.Hdda] / c["dda"]);
            loopRatios["dda"].Add(loop["dda"] / c["dda"]);
            loopRatios["mask"].Add(loop["mask"] / c["mask"]);
            foreach ((string mode, double rate) in lanes)
                laneRatios[mode].Add(rate / c[mode]);
            overLoop[BuiltInStrategies.Dda].Add(vox[BuiltInStrategies.Dda] / loop["dda"]);
            overLoop[BuiltInStrategies.DdaMask].Add(vox[BuiltInStrategies.DdaMask] / loop["mask"]);
            overLoop[BuiltInStrategies.Hdda].Add(vox[BuiltInStrategies.Hdda] / loop["dda"]);
            output.WriteLine(Invariant($"round {r + 1}: M rays per CPU second: dda {vox[BuiltInStrategies.Dda] / 1e6:F3}, dda-mask {vox[BuiltInStrategies.DdaMask] / 1e6:F3}, hdda {vox[BuiltInStrategies.Hdda] / 1e6:F3}; C dda {c["dda"] / 1e6:F3}, C mask {c["mask"] / 1e6:F3}; C's loop in C# dda {loop["dda"] / 1e6:F3}, mask {loop["mask"] / 1e6:F3}"));
        }

        long worst = Math.Max(Math.Max(Math.Abs(voxIterations[BuiltInStrategies.Dda] - cIterations["dda"]), Math.Abs(voxIterations[BuiltInStrategies.Hdda] - cIterations["dda"])),
            Math.Abs(voxIterations[BuiltInStrategies.DdaMask] - cIterations["mask"]));
        output.WriteLine(Invariant($"check: iterations dda {voxIterations[BuiltInStrategies.Dda]}, hdda {voxIterations[BuiltInStrategies.Hdda]}, C dda {cIterations["dda"]}; dda-mask {voxIterations[BuiltInStrategies.DdaMask]}, C mask {cIterations["mask"]}: {(worst == 0 ? "same work" : $"totals differ by up to {worst} ({100.0 * worst / cIterations["mask"]:G2}%)")}"));
        output.WriteLine(Invariant($"ratio dda-mask / C mask = {Median(ratios[BuiltInStrategies.DdaMask]):F2} (rounds {Range(ratios[BuiltInStrategies.DdaMask])})"));
        output.WriteLine(Invariant($"ratio dda / C dda = {Median(ratios[BuiltInStrategies.Dda]):F2} (rounds {Range(ratios[BuiltInStrategies.Dda])})"));
        output.WriteLine(Invariant($"ratio hdda / C dda = {Median(ratios[BuiltInStrategies.Hdda]):F2} (rounds {Range(ratios[BuiltInStrategies.Hdda])})"));
        output.WriteLine(Invariant($"tracing alone (VoxProf's timed region, wall seconds on one thread, result buffers allocated before it): dda-mask / C mask = {Median(tracingRatios[BuiltInStrategies.DdaMask]):F2} ({Range(tracingRatios[BuiltInStrategies.DdaMask])}), dda / C dda = {Median(tracingRatios[BuiltInStrategies.Dda]):F2} ({Range(tracingRatios[BuiltInStrategies.Dda])}), hdda / C dda = {Median(tracingRatios[BuiltInStrategies.Hdda]):F2} ({Range(tracingRatios[BuiltInStrategies.Hdda])})"));
        bool loopSame = loopIterations["dda"] == cIterations["dda"] && loopIterations["mask"] == cIterations["mask"];
        output.WriteLine(Invariant($"the reference's loop in C# / C (what the JIT makes of the same loop): dda {Median(loopRatios["dda"]):F2} ({Range(loopRatios["dda"])}), mask {Median(loopRatios["mask"]):F2} ({Range(loopRatios["mask"])}); iterations {(loopSame ? "the same as C's" : $"dda {loopIterations["dda"]}, mask {loopIterations["mask"]}: NOT the same as C's")}"));
        output.WriteLine(Invariant($"VoxProf / the reference's loop in C#: dda-mask {Median(overLoop[BuiltInStrategies.DdaMask]):F2} ({Range(overLoop[BuiltInStrategies.DdaMask])}), dda {Median(overLoop[BuiltInStrategies.Dda]):F2} ({Range(overLoop[BuiltInStrategies.Dda])}), hdda {Median(overLoop[BuiltInStrategies.Hdda]):F2} ({Range(overLoop[BuiltInStrategies.Hdda])})"));
        if (laneRatios["dda"].Count > 0)
        {
            bool laneSame = laneIterations["dda"] == cIterations["dda"] && laneIterations["mask"] == cIterations["mask"];
            output.WriteLine(Invariant($"the reference's loop in C#, eight rays in lockstep (LaneLoop, an experiment) / C: dda {Median(laneRatios["dda"]):F2} ({Range(laneRatios["dda"])}), mask {Median(laneRatios["mask"]):F2} ({Range(laneRatios["mask"])}); iterations {(laneSame ? "the same as C's" : $"dda {laneIterations["dda"]}, mask {laneIterations["mask"]}: NOT the same as C's")}"));
        }
        if (shareSize is (int sw, int sh))
        {
            var cpus = Enumerable.Range(0, 3).Select(_ => TraceCpu(scene, tree, cam, sw, sh, BuiltInStrategies.DdaMask).Cpu).ToList();
            output.WriteLine(Invariant($"traversal cpu seconds dda-mask {sw}x{sh} = {cpus.Min():F3}"));
        }
        return 0;
    }

    /// <summary>
    /// Process CPU seconds of one single-threaded trace (buffer allocation included), the wall seconds of its timed
    /// region (tracing alone), and its total iterations.
    /// </summary>
    private static (double Cpu, double Tracing, long Iterations) TraceCpu(Scene scene, BrickTree tree, CameraSpec cam, int width, int height, StrategyDefinition s)
    {
        // The previous trace's buffers are garbage now; collect them first, so their collection is not charged here.
        GC.Collect();
        GC.WaitForPendingFinalizers();
        TimeSpan before = Process.GetCurrentProcess().TotalProcessorTime;
        TraceRun run = Tracer.Run(new TraceRequest(scene, tree, cam, width, height, [s], Threads: 1));
        double cpu = (Process.GetCurrentProcess().TotalProcessorTime - before).TotalSeconds;
        return (cpu, run.Results[0].Elapsed.TotalSeconds, run.Results[0].Counters[(int)Counter.Iterations].Sum(v => (long)v));
    }

    /// <summary>Runs the reference once with both modes; its own CPU clock times each trace.</summary>
    private static List<(string Mode, double Cpu, long Iterations)> Reference(string refbrick, string scene, string camera, int width, int height)
    {
        var info = new ProcessStartInfo(refbrick)
        {
            RedirectStandardOutput = true,
            UseShellExecute = false,
        };
        foreach (string a in new[] { "--scene", scene, "--camera", camera, "--size", $"{width}x{height}", "--mode", "both", "--reps",
                     Repetitions.ToString(CultureInfo.InvariantCulture), "--quiet" })
            info.ArgumentList.Add(a);
        using Process p = Process.Start(info) ?? throw new InvalidOperationException($"could not start {refbrick}");
        string text = p.StandardOutput.ReadToEnd();
        p.WaitForExit();
        if (p.ExitCode != 0)
            throw new InvalidOperationException($"{refbrick} exited with {p.ExitCode}");
        var results = new List<(string, double, long)>();
        foreach (Match m in ReferenceLine().Matches(text))
            results.Add((m.Groups[1].Value, double.Parse(m.Groups[2].Value, CultureInfo.InvariantCulture), long.Parse(m.Groups[3].Value, CultureInfo.InvariantCulture)));
        if (results.Count != 2 * Repetitions)
            throw new InvalidOperationException($"unexpected output from {refbrick}: {text}");
        return [.. results.GroupBy(r => r.Item1).Select(g => (g.Key, g.Min(r => r.Item2), g.First().Item3))];
    }

    // "refbrick dda  rep 0: trace 2.5615 s wall 0.3562 s cpu, ..., iterations 26087874 (28.31/px), ..."
    [GeneratedRegex(@"^refbrick (dda|mask)\s+rep \d+: trace [0-9.]+ s wall ([0-9.]+) s cpu,.*?iterations (\d+)", RegexOptions.Multiline)]
    private static partial Regex ReferenceLine();

    private static double Median(List<double> values)
    {
        var sorted = values.OrderBy(v => v).ToArray();
        return sorted.Length % 2 == 1 ? sorted[sorted.Length / 2] : (sorted[sorted.Length / 2 - 1] + sorted[sorted.Length / 2]) / 2;
    }

    private static string Range(List<double> values) => Invariant($"{values.Min():F2}–{values.Max():F2}");

    private static string Invariant(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}
