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
    ];

    /// <summary>Statistics, report document, then every file into <paramref name="directory"/>, swapped in whole.</summary>
    public static ReportResult WriteAll(TraceRun run, ReportOptions options, string directory)
    {
        using OutputDirectory output = OutputDirectory.Open(directory);
        return WriteAll(run, options, output);
    }

    /// <summary>
    /// The trace command's entry point: statistics, report document, every file, then <see cref="OutputDirectory.Commit"/>.
    /// The folder is committed with the files that were written even when an exporter failed: it then holds one
    /// run's files, and the failures are reported.
    /// </summary>
    public static ReportResult WriteAll(TraceRun run, ReportOptions options, OutputDirectory output)
    {
        IReadOnlyList<StrategyStatistics> stats = StrategyStatistics.Compute(run);
        var context = new ReportContext(run, stats, ReportBuilder.Build(run, stats, options), options);
        ReportResult result = new ReportWriter(DefaultExporters()).Write(context, output);
        output.Commit();
        return result;
    }

    public ReportResult Write(ReportContext context, OutputDirectory output)
    {
        var failures = new List<ExportFailure>();
        foreach (IReportExporter exporter in _exporters)
        {
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
