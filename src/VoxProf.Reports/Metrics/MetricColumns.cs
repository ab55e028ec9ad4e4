using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;

namespace VoxProf.Reports.Metrics;

/// <summary>A metric shown in a short table.</summary>
/// <param name="Metric">The metric's name.</param>
/// <param name="Ratio">Show its ratio to the baseline strategy (not for counts of faults or descriptive figures).</param>
/// <param name="PrepassOnly">Show it only for a run with the prepass, where it differs from a total beside it.</param>
/// <param name="MemoryOnly">Show it only for a run with the memory model, the only runs that have it.</param>
public sealed record MetricColumn(string Metric, bool Ratio = true, bool PrepassOnly = false, bool MemoryOnly = false);

/// <summary>
/// The columns of the short tables a reviewer reads (summary.md and the trace console); every metric stays in
/// summary.csv and report.json. The predicted GPU time leads when a calibration gave one; then total work: it
/// includes the prepass's share, so a strategy with the prepass is never shown cheaper than it is.
/// </summary>
public static class MetricColumns
{
    private static string Of(MeasureDefinition m, string statistic) => MetricCatalogue.Name(m.Name, statistic);

    private static string Of(SubgroupShape s, string statistic) => MetricCatalogue.Name(s.Name, statistic);

    private static readonly MeasureDefinition PrepassIterations = Measures.Find("prepass-iterations")!;

    private static readonly MeasureDefinition CacheLines = Measures.Find(Counter.CacheLines.Name())!;

    private static string CacheMetric(string statistic) => MetricCatalogue.Name(MetricCatalogue.Cache, statistic);

    /// <summary>
    /// summary.md and report.html: what a reviewer weighs, the predicted GPU time first when a calibration gave one,
    /// then total work. The prepass's share is shown beside the total when the prepass ran; 64-lane subgroups, the
    /// hit rate and every other statistic stay in summary.csv.
    /// </summary>
    public static IReadOnlyList<MetricColumn> Summary { get; } =
    [
        new(MetricCatalogue.PredictedMs),
        new(Of(Measures.TotalIterations, "mean")),
        new(Of(Measures.TotalIterations, "p90")),
        new(Of(PrepassIterations, "mean"), PrepassOnly: true),
        new(Of(Measures.TotalNodeFetches, "mean")),
        new(Of(SubgroupShape.Lanes32, MetricCatalogue.TileMaxMean)),
        new(Of(SubgroupShape.Lanes32, MetricCatalogue.SimdEfficiency)),
        new(Of(CacheLines, "mean"), MemoryOnly: true),
        new(Of(SubgroupShape.Lanes32, MetricCatalogue.LinesPerGroup), MemoryOnly: true),
        new(CacheMetric(MetricCatalogue.CacheHitRate), Ratio: false, MemoryOnly: true),
        new(CacheMetric(MetricCatalogue.CacheBytesFetched), MemoryOnly: true),
        new(MetricCatalogue.Mismatch, Ratio: false),
    ];

    /// <summary>The table `voxprof trace` prints.</summary>
    public static IReadOnlyList<MetricColumn> Console { get; } =
    [
        new(MetricCatalogue.PredictedMs),
        new(Of(Measures.TotalIterations, "mean")),
        new(Of(Measures.TotalNodeFetches, "mean")),
        new(Of(SubgroupShape.Lanes32, MetricCatalogue.TileMaxMean)),
        new(Of(SubgroupShape.Lanes32, MetricCatalogue.SimdEfficiency)),
        new(Of(CacheLines, "mean"), MemoryOnly: true),
        new(CacheMetric(MetricCatalogue.CacheHitRate), Ratio: false, MemoryOnly: true),
        new(MetricCatalogue.HitRate, Ratio: false),
        new(MetricCatalogue.Mismatch, Ratio: false),
    ];

    /// <summary>The columns of <paramref name="columns"/> that apply to a run with or without the prepass and the memory model.</summary>
    public static IEnumerable<MetricColumn> For(IEnumerable<MetricColumn> columns, bool prepass, bool memory) =>
        columns.Where(c => (prepass || !c.PrepassOnly) && (memory || !c.MemoryOnly));
}
