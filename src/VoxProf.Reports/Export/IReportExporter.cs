using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Export;

/// <summary>Everything an exporter may read: the trace, its statistics, the report document and the options.</summary>
public sealed record ReportContext(TraceRun Run, IReadOnlyList<StrategyStatistics> Statistics, ReportDocument Document, ReportOptions Options);

/// <summary>One output format. Exporters only read the context and write through the directory.</summary>
public interface IReportExporter
{
    /// <summary>Short name used in failure messages ("summary.csv", "heatmaps").</summary>
    string Name { get; }

    void Export(ReportContext context, OutputDirectory output);

    /// <summary>
    /// Whether the exporter reads files other exporters write (the page inlines the images), so it runs after them;
    /// the others run side by side.
    /// </summary>
    bool ReadsOtherOutputs => false;

    /// <summary>
    /// For an exporter that <see cref="ReadsOtherOutputs"/>: the part of its work that reads no file, run side by side
    /// with the other exporters before <see cref="Export"/>.
    /// </summary>
    void Prepare(ReportContext context)
    {
    }
}
