using VoxProf.Core.Traversal;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Compare;

/// <summary>A metric's value in one strategy of one report.</summary>
public readonly record struct MetricValue(MetricDescriptor Metric, double Value);

/// <summary>The metrics a report holds, as <see cref="MetricDescriptor"/>s: six per counter, two per wave group.</summary>
public static class Metrics
{
    public const string TileMax = "tile-max";
    public const string Efficiency = "efficiency";

    public static string WaveGroup(int lanes) => $"wave{lanes}";

    /// <summary>Every metric of one strategy, in a stable order: counters as the report lists them, then wave groups.</summary>
    public static IEnumerable<MetricValue> Of(StrategyReport strategy)
    {
        foreach (var c in strategy.Counters)
        {
            // Totals and maxima are whole counts; the rest are averages or interpolated percentiles.
            var unit = c.Unit;
            yield return new(Counter(c.Counter, "total", unit, "0"), c.Total);
            yield return new(Counter(c.Counter, "mean", unit, "0.###"), c.Mean);
            yield return new(Counter(c.Counter, "p50", unit, "0.###"), c.P50);
            yield return new(Counter(c.Counter, "p90", unit, "0.###"), c.P90);
            yield return new(Counter(c.Counter, "p99", unit, "0.###"), c.P99);
            yield return new(Counter(c.Counter, "max", unit, "0"), c.Max);
        }
        foreach (var w in strategy.Waves)
        {
            var group = WaveGroup(w.Lanes);
            yield return new(new MetricDescriptor(group, TileMax, "iterations", LowerIsBetter: true, "0.###"), w.MeanTileMax);
            // Efficiency is the share of lanes doing useful work: a fall is the regression.
            yield return new(new MetricDescriptor(group, Efficiency, "ratio", LowerIsBetter: false, "0.0000"), w.SimdEfficiency);
        }
    }

    private static MetricDescriptor Counter(string name, string statistic, string unit, string format) =>
        new(name, statistic, unit, LowerIsBetter: CounterNames.LowerIsBetter(name), format);
}
