using System.Diagnostics;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Paths;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Reports.Export;
using VoxProf.Reports.Views;

namespace VoxProf.Benchmarks;

/// <summary>
/// The tool's own timing of a run of several views: `dotnet run -c Release --project tests/VoxProf.Benchmarks --
/// views SCENE CAMERAS [WxH]` does what `voxprof trace --camera CAMERAS` does (the tree built once, each view traced
/// with every strategy, counting on, and its reports written into a scratch folder that is thrown away), and prints
/// the build, each view's trace and report times, and the totals in wall and process CPU time.
/// </summary>
public static class ViewsTiming
{
    public static void Run(Scene scene, string cameras, int width, int height, TextWriter output)
    {
        IReadOnlyList<CameraSpec> views = ViewSelection.Resolve(scene, cameras);
        var process = Process.GetCurrentProcess();
        var wall = Stopwatch.StartNew();
        TimeSpan cpu0 = process.TotalProcessorTime;
        BrickTree tree = TreeBuilder.Build(scene, 4);
        double build = wall.Elapsed.TotalSeconds;
        output.WriteLine($"scene {scene.Name}: {views.Count} views at {width}x{height}, {BuiltInStrategies.All.Count} strategies, build {build:F2} s, cores {Environment.ProcessorCount}");
        output.WriteLine("view,trace_s,reports_s");
        string scratch = Path.Combine(Path.GetTempPath(), $"voxprof-views-timing-{Guid.NewGuid():N}");
        double traceTotal = 0, reportTotal = 0;
        using (OutputDirectory folder = OutputDirectory.Open(scratch))
        {
            foreach (CameraSpec view in views)
            {
                var step = Stopwatch.StartNew();
                TraceRun run = Tracer.Run(new TraceRequest(scene, tree, view, width, height, BuiltInStrategies.All));
                double trace = step.Elapsed.TotalSeconds;
                ReportWriter.WriteFiles(run, new ReportOptions(), folder.Folder("views/" + ViewFolders.Safe(view.Name)));
                double reports = step.Elapsed.TotalSeconds - trace;
                traceTotal += trace;
                reportTotal += reports;
                output.WriteLine(FormattableString.Invariant($"{view.Name},{trace:F3},{reports:F3}"));
            }
        }
        process.Refresh();
        double cpu = (process.TotalProcessorTime - cpu0).TotalSeconds;
        output.WriteLine(FormattableString.Invariant(
            $"total: wall {wall.Elapsed.TotalSeconds:F1} s (build {build:F1}, trace {traceTotal:F1}, reports {reportTotal:F1}), CPU {cpu:F1} s, {traceTotal / views.Count:F2} s trace per view"));
    }
}
