using VoxProf.Core.Memory;
using VoxProf.Core.Scenes;
using VoxProf.Core.Statistics;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Images;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Export;

/// <summary>Turns a trace and its statistics into the report document every exporter reads.</summary>
public static class ReportBuilder
{
    public static ReportDocument Build(TraceRun run, IReadOnlyList<StrategyStatistics> stats, ReportOptions options)
    {
        var scene = run.Scene;
        var tree = run.Tree;
        var cam = run.Camera;
        var settings = run.Settings;
        string[] counters = CounterNames.All.Select(c => c.Name()).Concat(run.Results.SelectMany(r => r.CounterNames))
            .Distinct(StringComparer.OrdinalIgnoreCase).ToArray();

        var calibration = options.Calibration?.Model;
        var strategies = stats.Select(s => new StrategyReport(s.Name, MetricCatalogue.Values(s, calibration), FilesOf(s, options))).ToList();
        IReadOnlyList<MetricDescriptor> metrics = stats.Count > 0
            ? MetricCatalogue.Describe(stats.SelectMany(s => s.Measures.Select(m => m.Measure)).DistinctBy(m => m.Name, StringComparer.OrdinalIgnoreCase),
                stats[0].Subgroups.Select(g => g.Shape), calibration, stats[0].Memory?.Settings)
            : MetricCatalogue.Describe(Measures.All, SubgroupShape.Standard, calibration);

        var document = new ReportDocument(
            ReportDocument.CurrentSchema,
            options.ToolVersion,
            SceneOf(scene),
            new TreeInfo(tree.Branching, tree.Depth, tree.NodeCount, tree.SolidVoxels, tree.TotalBytes, tree.NodesPerLevel) { RootSize = tree.RootSize },
            CameraOf(cam),
            new RunInfo(settings.Width, settings.Height, settings.PrepassBlock, stats.Select(s => s.Name).ToArray(), counters)
            {
                Branching = settings.Branching,
                Heatmaps = options.Heatmaps.ToArray(),
                Scale = options.Scale == ScaleKind.Log ? "log" : "linear",
                RangeMin = options.RangeMin,
                RangeMax = options.RangeMax,
                Baseline = Baseline(stats, options.Baseline)?.Name,
                PixelData = options.PixelData,
                Memory = run.Results.Select(r => r.Memory?.Settings).FirstOrDefault(m => m is not null) is { } mem
                    ? new MemoryInfo(mem.LineBytes, mem.CacheBytes, mem.Ways, mem.Group.Lanes, NodeLayout.For(settings.Branching).RecordBytes)
                    : null,
                Subgroups = SubgroupShape.Standard.Select(g =>
                    new SubgroupInfo(g.Name, g.Lanes, g.TileWidth, g.TileHeight, g.TilesX(settings.Width) * g.TilesY(settings.Height))).ToArray(),
            },
            metrics,
            strategies,
            options.Environment,
            new TimingInfo(tree.BuildTime.TotalSeconds, run.Results.ToDictionary(r => r.Strategy.Name, r => r.Elapsed.TotalSeconds))
            {
                Threads = options.Threads != 0 ? options.Threads : settings.Threads,
                MemorySeconds = run.Results.Where(r => r.Memory is not null)
                    .ToDictionary(r => r.Strategy.Name, r => r.MemoryElapsed.TotalSeconds) is { Count: > 0 } model ? model : null,
            });
        var warnings = new List<string>();
        if (ToolInfo.IsDebug(options.Environment))
            warnings.Add(ToolInfo.DebugWarning);
        if (calibration?.ScopeWarning(settings.Branching, settings.Width, settings.Height) is { } scope)
            warnings.Add(scope);
        document = document with
        {
            ToolCommit = options.ToolCommit,
            Files = options.Html
                ? [OutputNames.ReportJson, OutputNames.SummaryCsv, OutputNames.SummaryMarkdown, OutputNames.Preview, OutputNames.ReportHtml]
                : [OutputNames.ReportJson, OutputNames.SummaryCsv, OutputNames.SummaryMarkdown, OutputNames.Preview],
            CommandLine = options.CommandLine.ToArray(),
            Warnings = warnings,
            Calibration = options.Calibration?.Info,
        };
        return document with { Run = document.Run with { HeatmapRanges = Ranges(new ReportContext(run, stats, document, options)) } };
    }

    /// <summary>The scene as report.json records it.</summary>
    public static SceneInfo SceneOf(Scene scene) =>
        new(scene.Name, scene.SourcePath is null ? null : Path.GetFileName(scene.SourcePath), scene.ContentHash, [scene.ExtentX, scene.ExtentY, scene.ExtentZ]);

    /// <summary>A camera as report.json records it.</summary>
    public static CameraInfo CameraOf(CameraSpec cam) =>
        new(cam.Name, [cam.Eye.X, cam.Eye.Y, cam.Eye.Z], [cam.Target.X, cam.Target.Y, cam.Target.Z], [cam.Up.X, cam.Up.Y, cam.Up.Z], cam.FovYDegrees);

    /// <summary>
    /// The requested baseline if it was traced, otherwise the first tree strategy traced: ratios to the grid
    /// reference, which costs an order of magnitude more, would all be tiny. Grid only when nothing else was traced.
    /// </summary>
    public static StrategyDefinition? Baseline(IReadOnlyList<StrategyStatistics> stats, StrategyDefinition? requested)
    {
        if (requested is { } r && stats.Any(s => s.Strategy == r))
            return r;
        return stats.FirstOrDefault(s => s.Strategy != BuiltInStrategies.Grid)?.Strategy ?? stats.FirstOrDefault()?.Strategy;
    }

    /// <summary>The scale of every heatmap as the heatmap writer draws it (<see cref="HeatmapExporter.ScaleFor"/>).</summary>
    private static HeatmapRange[] Ranges(ReportContext context)
    {
        var ranges = new List<HeatmapRange>();
        foreach (string map in context.Options.Heatmaps)
        {
            foreach (StrategyResult r in context.Run.Results.Where(r => HeatmapNames.AppliesTo(map, r.Strategy)))
            {
                HeatmapScale scale = HeatmapExporter.ScaleFor(map, context, r);
                ranges.Add(new HeatmapRange(r.Strategy.Name, map, OutputNames.Heatmap(r.Strategy.Name, map),
                    scale.Kind == ScaleKind.Log ? "log" : "linear", scale.Min, scale.Max));
            }
        }
        return ranges.ToArray();
    }

    private static List<string> FilesOf(StrategyStatistics s, ReportOptions options)
    {
        string name = s.Name;
        var files = options.Heatmaps.Where(h => HeatmapNames.AppliesTo(h, s.Strategy)).Select(h => OutputNames.Heatmap(name, h)).ToList();
        if (s.MismatchPixels > 0)
            files.Add(OutputNames.Mismatch(name));
        if (options.PixelData)
            files.Add(OutputNames.PixelData(name));
        if (options.PerPixel)
            files.Add(OutputNames.PixelCsv(name));
        return files;
    }
}
