using System.Diagnostics;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Benchmarks;

/// <summary>
/// `prepass SCENE [WxH] [K] [STRATEGY] [ROUNDS] [CAMERA|all] [THREADS]`: for every camera, traces without and with the coarse prepass,
/// interleaved (A B B A …) so a drifting machine speed hits both alike, and prints the median of the pairwise ratios
/// of wall time (prepass included) and of process CPU time, beside each trace's work per pixel. Counting is on, as in
/// `voxprof trace`.
/// </summary>
public static class PrepassTiming
{
    public static void Run(Scene scene, int width, int height, int block, StrategyDefinition strategy, int rounds, string? camera, int threads, TextWriter output)
    {
        BrickTree tree = TreeBuilder.Build(scene, 4);
        // The tree's first prepass builds its coarse grids; that is timed apart, once, like the tree's build.
        var grids = Stopwatch.StartNew();
        CoarseOccupancy coarse = tree.Coarse;
        output.WriteLine($"scene {scene.Name}: {tree.Stats.NodeCount} nodes; coarse grids {grids.Elapsed.TotalMilliseconds:F0} ms, " +
            $"{coarse.Bytes / 1048576.0:F1} MiB, finest level {coarse.FinestLevel} (cells of {1 << coarse.CellShift(coarse.FinestLevel)} voxels)");
        output.WriteLine("camera,strategy,K,wall_ratio,cpu_ratio,wall_s_plain,wall_s_prepass,prepass_map_cpu_s_1_thread,ns_per_coarse_iteration,own_iterations_plain,own_iterations_prepass,descents_plain,descents_prepass,prepass_iterations_per_pixel,prepass_fetches_per_pixel");
        foreach (CameraSpec cam in scene.Cameras.Where(c => camera is null || c.Name == camera))
        {
            var plainRequest = new TraceRequest(scene, tree, cam, width, height, [strategy], Threads: threads);
            if (Environment.GetEnvironmentVariable("VOXPROF_PROFILE_PREPASS") is string n)
            {
                // For a profiler: only the traces with the prepass, n times.
                for (int i = 0; i < int.Parse(n); i++)
                    Tracer.Run(plainRequest with { PrepassBlock = block });
                continue;
            }
            var fastRequest = plainRequest with { PrepassBlock = block };
            Tracer.Run(plainRequest with { Width = 160, Height = 90 });
            Tracer.Run(fastRequest with { Width = 160, Height = 90 });
            var wall = new List<double>();
            var cpu = new List<double>();
            var plainWall = new List<double>();
            var fastWall = new List<double>();
            TraceRun? plain = null, fast = null;
            for (int r = 0; r < rounds; r++)
            {
                (double pw, double pc, TraceRun p) = Timed(plainRequest, r % 2 == 1, fastRequest, out double fw, out double fc, out TraceRun f);
                plain = p;
                fast = f;
                wall.Add(fw / pw);
                cpu.Add(fc / pc);
                plainWall.Add(pw);
                fastWall.Add(fw);
            }
            // The coarse rays alone, on one thread: CPU nanoseconds per coarse-ray iteration.
            var one = new ParallelOptions { MaxDegreeOfParallelism = 1 };
            var image = new Camera(cam, width, height);
            TimeSpan m0 = Process.GetCurrentProcess().TotalProcessorTime;
            PrepassMap map = PrepassMap.Compute(tree, image, block, one);
            double mapSeconds = (Process.GetCurrentProcess().TotalProcessorTime - m0).TotalSeconds;
            long coarseIterations = map.TotalIterations;
            double pixels = (double)width * height;
            double Mean(TraceRun run, Counter c) => run.Results[0].Counters[(int)c].Sum(v => (long)v) / pixels;
            output.WriteLine(FormattableString.Invariant(
                $"{cam.Name},{strategy.Name},{block},{Median(wall):F3},{Median(cpu):F3},{Median(plainWall):F3},{Median(fastWall):F3},{mapSeconds:F3},{mapSeconds * 1e9 / coarseIterations:F1},{Mean(plain!, Counter.Iterations):F1},{Mean(fast!, Counter.Iterations):F1},{Mean(plain!, Counter.Descents):F2},{Mean(fast!, Counter.Descents):F2},{Mean(fast!, Counter.PrepassIterations):F2},{Mean(fast!, Counter.PrepassNodeFetches):F2}"));
        }
    }

    /// <summary>One pair, in the order given: returns the plain trace's wall and CPU seconds, the other's as out values.</summary>
    private static (double, double, TraceRun) Timed(TraceRequest plain, bool fastFirst, TraceRequest fast,
        out double fastWall, out double fastCpu, out TraceRun fastRun)
    {
        double pw = 0, pc = 0;
        TraceRun? p = null;
        fastWall = fastCpu = 0;
        fastRun = null!;
        for (int i = 0; i < 2; i++)
        {
            bool doFast = (i == 0) == fastFirst;
            TimeSpan c0 = Process.GetCurrentProcess().TotalProcessorTime;
            TraceRun run = Tracer.Run(doFast ? fast : plain);
            double c = (Process.GetCurrentProcess().TotalProcessorTime - c0).TotalSeconds;
            if (doFast)
            {
                fastWall = run.Results[0].Elapsed.TotalSeconds;
                fastCpu = c;
                fastRun = run;
            }
            else
            {
                pw = run.Results[0].Elapsed.TotalSeconds;
                pc = c;
                p = run;
            }
        }
        return (pw, pc, p!);
    }

    private static double Median(List<double> values)
    {
        var sorted = values.OrderBy(v => v).ToArray();
        return sorted.Length % 2 == 1 ? sorted[sorted.Length / 2] : (sorted[sorted.Length / 2 - 1] + sorted[sorted.Length / 2]) / 2;
    }
}
