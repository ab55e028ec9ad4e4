using System.Text.Json;
using VoxProf.Core;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Export;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Views;

/// <summary>
/// A run of several views read as one report for compare: each strategy's value of a metric is its mean over the
/// views (each view weighs the same), so one verdict gates the whole run with the usual rules. The views themselves
/// are compared view folder by view folder, which also draws their difference heatmaps.
/// </summary>
public static class RunReports
{
    /// <summary>Whether report.json's text is the run level of a run of several views.</summary>
    public static bool IsRun(ReadOnlyMemory<byte> json)
    {
        try
        {
            using var doc = JsonDocument.Parse(json);
            return doc.RootElement.ValueKind == JsonValueKind.Object && doc.RootElement.TryGetProperty("kind", out JsonElement kind)
                && kind.ValueKind == JsonValueKind.String && kind.GetString() == RunDocument.RunKind;
        }
        catch (JsonException)
        {
            return false;
        }
    }

    /// <summary>The run at <paramref name="file"/> as one report: metric values averaged over its views.</summary>
    public static LoadedReport Load(string file, ReadOnlyMemory<byte> json, ReportManifest? manifest)
    {
        string folder = Path.GetDirectoryName(Path.GetFullPath(file)) ?? ".";
        RunDocument run;
        try
        {
            run = JsonSerializer.Deserialize<RunDocument>(json.Span, ReportJson.Options)
                ?? throw new InputException($"{file}: expected a run report, found null");
        }
        catch (JsonException ex)
        {
            throw new InputException($"{file}: {ReportLoader.Where(ex)}: {ReportLoader.Problem(ex)}", ex);
        }
        if (run.Shard is { } shard)
            throw new InputException($"{file}: shard {shard.Index} of {shard.Count} holds only part of the run; merge the shards first (voxprof merge)");
        var views = new List<ViewReport>();
        foreach (RunView v in run.Views)
        {
            string viewFile = Path.Combine(folder, v.Folder, OutputNames.ReportJson);
            if (manifest is not null && File.Exists(viewFile))
                manifest.Verify(folder, v.Folder + "/" + OutputNames.ReportJson, File.ReadAllBytes(viewFile));
            views.Add(new ViewReport(v, ReportLoader.Load(viewFile).Document));
        }
        if (views.Count == 0)
            throw new InputException($"{file}: a run of no views; nothing to compare");
        return new LoadedReport(file, Aggregate(run, views)) { Manifest = manifest, Views = run.Views };
    }

    /// <summary>One report whose values are each strategy's mean over the views.</summary>
    public static ReportDocument Aggregate(RunDocument run, IReadOnlyList<ViewReport> views)
    {
        ReportDocument first = views[0].Document;
        var metrics = RunSummary.Metrics(views);
        var strategies = RunSummary.Distributions(views, metrics).Select(s => new StrategyReport(s.Name,
            metrics.ToDictionary(m => m.Name, m => s.Distribution.TryGetValue(m.Name, out var d) ? d.Mean : (double?)null), [])).ToArray();
        return first with
        {
            ToolVersion = run.ToolVersion,
            ToolCommit = run.ToolCommit,
            Scene = run.Scene,
            Camera = new CameraInfo(MeanName(views.Count), [0, 0, 0], [0, 0, 0], [0, 0, 0], 0),
            Run = first.Run with { PixelData = false, HeatmapRanges = [], Strategies = strategies.Select(s => s.Name).ToArray() },
            Metrics = metrics,
            Strategies = strategies,
            Warnings = views.SelectMany(v => v.Document.Warnings).Distinct().ToArray(),
            Files = [],
        };
    }

    /// <summary>The camera name of a run read as one report: "mean over 8 views".</summary>
    public static string MeanName(int views) => $"mean over {views} {(views == 1 ? "view" : "views")}";
}
