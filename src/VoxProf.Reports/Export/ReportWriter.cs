using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Export;

/// <summary>An exporter that failed; the others still ran.</summary>
public sealed record ExportFailure(string Exporter, Exception Error)
{
    public string Message => $"{Exporter}: {Error.Message}";
}

public sealed record ReportResult(string Directory, ReportDocument Document, IReadOnlyList<StrategyStatistics> Statistics,
    IReadOnlyList<string> Files, IReadOnlyList<ExportFailure> Failures);

/// <summary>Runs every exporter; a failure of one is recorded and the rest still write their files.</summary>
public sealed class ReportWriter
{
    private readonly IReadOnlyList<IReportExporter> _exporters;

    public ReportWriter(IEnumerable<IReportExporter> exporters) => _exporters = exporters.ToList();

    public static IReadOnlyList<IReportExporter> DefaultExporters() =>
    [
        new ReportJsonExporter(), new SummaryCsvExporter(), new SummaryMarkdownExporter(), new HeatmapExporter(),
        new PreviewExporter(), new MismatchExporter(), new PixelDataExporter(), new PixelCsvExporter(),
        // Last: the page embeds the images the exporters above wrote.
        new Html.HtmlReportExporter(),
    ];

    /// <summary>Statistics, report document, then every file into <paramref name="directory"/>, swapped in whole.</summary>
    /// <param name="step">Told "statistics" and each exporter's name as it starts, for a progress display.</param>
    public static ReportResult WriteAll(TraceRun run, ReportOptions options, string directory, IProgress<string>? step = null)
    {
        using OutputDirectory output = OutputDirectory.Open(directory);
        return WriteAll(run, options, output, step);
    }

    /// <summary>
    /// The trace command's entry point: statistics, report document, every file, then <see cref="OutputDirectory.Commit"/>.
    /// The folder is committed with the files that were written even when an exporter failed: it then holds one
    /// run's files, and the failures are reported.
    /// </summary>
    public static ReportResult WriteAll(TraceRun run, ReportOptions options, OutputDirectory output, IProgress<string>? step = null)
    {
        ReportResult result = WriteFiles(run, options, output, step);
        output.Commit();
        return result;
    }

    /// <summary>Statistics, report document and every file, without the commit: one view of a run of several.</summary>
    public static ReportResult WriteFiles(TraceRun run, ReportOptions options, OutputDirectory output, IProgress<string>? step = null)
    {
        step?.Report("computing statistics");
        IReadOnlyList<StrategyStatistics> stats = StrategyStatistics.Compute(run);
        var context = new ReportContext(run, stats, ReportBuilder.Build(run, stats, options), options);
        return new ReportWriter(DefaultExporters()).Write(context, output, step);
    }

    public ReportResult Write(ReportContext context, OutputDirectory output, IProgress<string>? step = null)
    {
        var failures = new List<ExportFailure>();
        foreach (IReportExporter exporter in _exporters)
        {
            step?.Report($"writing {exporter.Name}");
            try
            {
                exporter.Export(context, output);
            }
            catch (Exception ex)
            {
                failures.Add(new ExportFailure(exporter.Name, ex is AggregateException { InnerExceptions.Count: 1 } a ? a.InnerExceptions[0] : ex));
            }
        }
        return new ReportResult(output.FullPath, context.Document, context.Statistics, output.Written, failures);
    }
}
