using System.Collections.Concurrent;
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

    /// <summary>
    /// Runs every exporter. Those that read no other exporter's files run side by side, with the preparation of the
    /// rest, which then run in order: the pixel file's compression overlaps the heatmaps' encoding and the page's
    /// per-pixel copy (on two cores a 2560×1440 trace took 3.8–4.0 s instead of 4.6–5.7; docs/performance.md). Files do
    /// not depend on the order; the result lists the files by name and failures in the exporters' order.
    /// </summary>
    public ReportResult Write(ReportContext context, OutputDirectory output, IProgress<string>? step = null)
    {
        var failures = new ExportFailure?[_exporters.Count];
        void Attempt(int i, Action<IReportExporter> work)
        {
            try
            {
                work(_exporters[i]);
            }
            catch (Exception ex)
            {
                failures[i] = new ExportFailure(_exporters[i].Name, ex is AggregateException { InnerExceptions.Count: 1 } a ? a.InnerExceptions[0] : ex);
            }
        }
        void Run(int i)
        {
            step?.Report($"writing {_exporters[i].Name}");
            Attempt(i, e => e.Export(context, output));
        }
        int[] later = [.. Enumerable.Range(0, _exporters.Count).Where(i => _exporters[i].ReadsOtherOutputs)];
        // Preparations first (the page's is the longest single piece), taken one at a time in this order.
        (int Index, bool Prepare)[] first = [.. later.Select(i => (i, true)),
            .. Enumerable.Range(0, _exporters.Count).Except(later).Select(i => (i, false))];
        Parallel.ForEach(Partitioner.Create(first, EnumerablePartitionerOptions.NoBuffering), job =>
        {
            if (job.Prepare)
                Attempt(job.Index, e => e.Prepare(context));
            else
                Run(job.Index);
        });
        // An exporter whose preparation failed is not run: its failure is reported already.
        foreach (int i in later.Where(i => failures[i] is null))
            Run(i);
        return new ReportResult(output.FullPath, context.Document, context.Statistics, [.. output.Written.Order(StringComparer.Ordinal)],
            failures.OfType<ExportFailure>().ToList());
    }
}
