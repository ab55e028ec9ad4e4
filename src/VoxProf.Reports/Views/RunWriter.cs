using System.Globalization;
using System.Text.Json;
using CsvHelper;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Reports.Export;
using VoxProf.Reports.Images;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;
using VoxProf.Reports.Tables;

namespace VoxProf.Reports.Views;

/// <summary>What a run knows before its views are read: the same for every shard of it and for the run traced whole.</summary>
/// <param name="Html">Whether the run writes report.html.</param>
public sealed record RunHeader(string ToolVersion, string ToolCommit, SceneInfo Scene, IReadOnlyList<string> CommandLine,
    IReadOnlyList<RunView> Views, bool Html, EnvironmentInfo Environment)
{
    /// <summary>Absolute URL summary.md's links start with (--link-base); null for relative links.</summary>
    public Uri? LinkBase { get; init; }
}

/// <summary>
/// Writes the run level of a run of several views into its folder (the views' folders are written already):
/// report.json, summary.csv, views.csv, summary.md, worst-views.png and report.html. Used by trace and by merge alike,
/// from the views' report.json as written, so both give the same bytes.
/// </summary>
public static class RunWriter
{
    public const string ViewsCsv = "views.csv";

    /// <summary>Reads the report.json of every view this folder holds (in run order) from the working folder.</summary>
    public static IReadOnlyList<ViewReport> ReadViews(OutputDirectory output, IEnumerable<RunView> held) =>
        held.Select(v => new ViewReport(v, Compare.ReportLoader.Load(Path.Combine(output.WorkingPath, v.Folder, OutputNames.ReportJson)).Document)).ToArray();

    public static RunDocument Build(RunHeader header, IReadOnlyList<ViewReport> views, RunShard? shard, RunTimings timings)
    {
        IReadOnlyList<MetricDescriptor> metrics = RunSummary.Metrics(views);
        string? baseline = views.Count > 0 ? views[0].Document.Run.Baseline : null;
        ContactSheetInfo? sheet = ContactSheet.Choose(views, metrics, baseline);
        var files = new List<string> { OutputNames.ReportJson, OutputNames.SummaryCsv, ViewsCsv, OutputNames.SummaryMarkdown };
        if (sheet is not null)
            files.Add(ContactSheet.FileName);
        if (header.Html)
            files.Add(OutputNames.ReportHtml);
        return new RunDocument(RunDocument.RunKind, RunDocument.CurrentSchema, header.ToolVersion, header.ToolCommit, header.Scene,
            header.CommandLine, header.Views, metrics, RunSummary.Distributions(views, metrics), RunSummary.Worst(views, metrics),
            files, header.Environment, timings)
        {
            Shard = shard,
            Baseline = baseline,
            LinkBase = header.LinkBase?.AbsoluteUri,
            ContactSheet = sheet,
        };
    }

    /// <summary>Writes every run-level file; returns the failures (the others are still written).</summary>
    public static IReadOnlyList<ExportFailure> Write(OutputDirectory output, RunDocument run, IReadOnlyList<ViewReport> views)
    {
        Uri? linkBase = run.LinkBase is { } lb ? new Uri(lb) : null;
        var failures = new List<ExportFailure>();
        void Try(string name, Action write)
        {
            try
            {
                write();
            }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or ImageFormatException or InvalidOperationException)
            {
                failures.Add(new ExportFailure(name, ex));
            }
        }
        Try(OutputNames.ReportJson, () => output.WriteText(OutputNames.ReportJson, w => w.Write(Serialize(run))));
        Try(OutputNames.SummaryCsv, () => output.WriteText(OutputNames.SummaryCsv, w => WriteDistributionCsv(run, w)));
        Try(ViewsCsv, () => output.WriteText(ViewsCsv, w => WriteViewsCsv(run, views, w)));
        Try(OutputNames.SummaryMarkdown, () => output.WriteText(OutputNames.SummaryMarkdown, w => w.Write(RunMarkdown.Render(run, linkBase))));
        if (run.ContactSheet is { } sheet)
        {
            Try(ContactSheet.FileName, () =>
            {
                MetricDescriptor metric = run.Metrics.First(m => m.Name == sheet.Metric);
                using Image<Rgba32> image = ContactSheet.Render(sheet, views, metric, run.Scene.Name, output.WorkingPath);
                Png.AddText(image, "Software", $"VoxProf {run.ToolVersion}");
                output.Write(ContactSheet.FileName, s => Png.Save(image, s));
            });
        }
        if (run.Files.Contains(OutputNames.ReportHtml))
            Try(OutputNames.ReportHtml, () => output.WriteText(OutputNames.ReportHtml, w => RunHtml.Write(run, views, output.WorkingPath, w)));
        return failures;
    }

    public static string Serialize(RunDocument run) => JsonSerializer.Serialize(run, ReportJson.Options) + "\n";

    /// <summary>summary.csv of a run: a record per strategy and statistic over the views, a column per metric.</summary>
    private static void WriteDistributionCsv(RunDocument run, TextWriter writer)
    {
        using var csv = CsvWriter.Create(writer, null, leaveOpen: true);
        csv.WriteHeader(["strategy", "over-views", .. run.Metrics.Select(m => m.Name)]);
        foreach (RunStrategy s in run.Strategies)
        {
            foreach (var (statistic, pick) in Statistics)
            {
                var fields = new List<string> { s.Name, statistic };
                fields.AddRange(run.Metrics.Select(m => s.Distribution.TryGetValue(m.Name, out var d) ? SummaryCsv.Number(pick(d)) : ""));
                csv.WriteRecord(fields.ToArray());
            }
        }
        csv.Flush();
    }

    /// <summary>views.csv: a record per view and strategy, a column per metric, for a spreadsheet.</summary>
    private static void WriteViewsCsv(RunDocument run, IReadOnlyList<ViewReport> views, TextWriter writer)
    {
        using var csv = CsvWriter.Create(writer, null, leaveOpen: true);
        csv.WriteHeader(["view", "strategy", .. run.Metrics.Select(m => m.Name)]);
        foreach (ViewReport v in views)
        {
            foreach (StrategyReport s in v.Document.Strategies)
                csv.WriteRecord([v.View.Name, s.Name, .. run.Metrics.Select(m => SummaryCsv.Number(s.Value(m.Name)))]);
        }
        csv.Flush();
    }

    /// <summary>The statistics over views, in column order.</summary>
    public static IReadOnlyList<(string Name, Func<ViewDistribution, double> Pick)> Statistics { get; } =
    [
        ("mean", d => d.Mean),
        ("p50", d => d.P50),
        ("p90", d => d.P90),
        ("max", d => d.Max),
    ];

    internal static string Format(MetricDescriptor m, double v) => m.Format(v);

    internal static CultureInfo Inv => CultureInfo.InvariantCulture;
}
