using System.Globalization;
using VoxProf.Core.Calibration;
using VoxProf.Core.Memory;
using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;

namespace VoxProf.Reports.Metrics;

/// <summary>
/// The one list of metrics (docs/reports.md): six statistics of every measure (each counter and each derived
/// total), three of every subgroup size (five with the memory model), then the hit rate and the mismatch count, the
/// memory model's cache replay when it ran, and with a calibration the predicted GPU time. Names come from the measures and shapes themselves, so a new counter or subgroup size needs
/// no change here.
/// </summary>
public static class MetricCatalogue
{
    public const string HitRate = "hit-rate";
    public const string Mismatch = "mismatch";

    public const string TileMaxMean = "tile-max-mean";
    public const string TileMaxMax = "tile-max-max";
    public const string SimdEfficiency = "simd-efficiency";

    /// <summary>Distinct cache lines a lockstep group touched, mean over groups (memory model).</summary>
    public const string LinesPerGroup = "lines-per-group";
    public const string LinesPerGroupMax = "lines-per-group-max";

    /// <summary>The group of the cache replay's metrics: cache.accesses, cache.hit-rate, cache.bytes-fetched.</summary>
    public const string Cache = "cache";
    public const string CacheAccesses = "accesses";
    public const string CacheHitRate = "hit-rate";
    public const string CacheBytesFetched = "bytes-fetched";

    /// <summary>GPU time predicted by a calibration (docs/calibration.md).</summary>
    public const string PredictedMs = "predicted-ms";

    private sealed record Statistic(string Name, string Title, string Format, Func<CounterSummary, double> Of);

    // Percentiles follow Hyndman & Fan (1996) definition 7 (Core.Statistics.Quantile).
    private static readonly Statistic[] MeasureStatistics =
    [
        new("total", "sum over pixels", "0", s => s.Total),
        new("mean", "mean per pixel", "0.00", s => s.Mean),
        new("p50", "median pixel", "0.00", s => s.P50),
        new("p90", "90th percentile of pixels", "0.00", s => s.P90),
        new("p99", "99th percentile of pixels", "0.00", s => s.P99),
        new("max", "largest pixel", "0", s => s.Max),
    ];

    private sealed record Entry(MetricDescriptor Metric, Func<StrategyStatistics, double?> Value);

    /// <summary>"GROUP.STATISTIC".</summary>
    public static string Name(string group, string statistic) => $"{group}.{statistic}";

    /// <summary>
    /// Every metric of a run that measured <paramref name="measures"/> and modelled <paramref name="shapes"/>, ran
    /// the memory model with <paramref name="memory"/> if given, and priced them with <paramref name="calibration"/>
    /// if given, in report order.
    /// </summary>
    public static IReadOnlyList<MetricDescriptor> Describe(IEnumerable<MeasureDefinition> measures, IEnumerable<SubgroupShape> shapes,
        CostModel? calibration = null, MemorySettings? memory = null) =>
        Entries(measures, shapes, calibration, memory).Select(e => e.Metric).ToArray();

    /// <summary>The metrics of the measures and shapes every trace reports, with the memory model at its defaults (as `trace` runs it).</summary>
    public static IReadOnlyList<MetricDescriptor> Standard { get; } = Describe(Measures.All, SubgroupShape.Standard, memory: MemorySettings.Default);

    /// <summary>
    /// Every metric's value for one strategy, keyed by name in <see cref="Describe"/> order; null where nothing was
    /// measured (the mismatch count when the grid reference was not traced, the memory model's counters when it was off).
    /// </summary>
    public static IReadOnlyDictionary<string, double?> Values(StrategyStatistics s, CostModel? calibration = null)
    {
        var values = new Dictionary<string, double?>(StringComparer.Ordinal);
        foreach (Entry e in Entries(s.Measures.Select(m => m.Measure), s.Subgroups.Select(g => g.Shape), calibration, s.Memory?.Settings))
            values.Add(e.Metric.Name, e.Value(s));
        return values;
    }

    private static List<Entry> Entries(IEnumerable<MeasureDefinition> measures, IEnumerable<SubgroupShape> shapes, CostModel? calibration,
        MemorySettings? memory)
    {
        var entries = new List<Entry>();
        foreach (MeasureDefinition m in measures)
        {
            var better = m.LowerIsBetter ? Better.Lower : Better.Higher;
            string name = m.Name;
            // A counter of the memory model is 0 when the model was off: not measured, rather than no traffic.
            bool needsModel = m.Parts.Any(c => c.NeedsMemoryModel());
            foreach (Statistic st in MeasureStatistics)
            {
                entries.Add(new(new MetricDescriptor(Name(name, st.Name), $"{m.Description}: {st.Title}", m.Unit, st.Format, better),
                    s => needsModel && s.Memory is null ? null : st.Of(s[name])));
            }
        }
        foreach (SubgroupShape shape in shapes)
        {
            string g = shape.Name;
            string tile = $"{shape.TileWidth}×{shape.TileHeight}-pixel tiles ({shape.Lanes} lanes)";
            SubgroupSummary Of(StrategyStatistics s) => s.Subgroups.First(x => x.Shape == shape);
            entries.Add(new(new MetricDescriptor(Name(g, TileMaxMean), $"mean over {tile} of the tile's largest loop iterations", "iterations", "0.00", Better.Lower),
                s => Of(s).MeanTileMax));
            entries.Add(new(new MetricDescriptor(Name(g, TileMaxMax), $"largest loop iterations in any of the {tile}", "iterations", "0", Better.Lower),
                s => Of(s).MaxTileMax));
            // Aila & Laine (2009): the share of lane slots doing useful work; a fall is the regression.
            entries.Add(new(new MetricDescriptor(Name(g, SimdEfficiency), $"SIMD efficiency of {shape.Lanes}-lane subgroups: lane iterations over lane slots", "ratio", "0.0000", Better.Higher),
                s => Of(s).SimdEfficiency));
            if (memory is not null)
            {
                GroupLines? Lines(StrategyStatistics s) => s.Memory?.Of(shape);
                entries.Add(new(new MetricDescriptor(Name(g, LinesPerGroup), $"mean over {tile} of the distinct {memory.LineBytes}-byte cache lines the tile's node reads touched",
                    "lines", "0.00", Better.Lower), s => Lines(s)?.Mean));
                entries.Add(new(new MetricDescriptor(Name(g, LinesPerGroupMax), $"most distinct {memory.LineBytes}-byte cache lines any of the {tile} touched",
                    "lines", "0", Better.Lower), s => Lines(s)?.Max));
            }
        }
        // A change of hit rate is a change of what the camera sees, not of cost: neither better nor worse.
        entries.Add(new(new MetricDescriptor(HitRate, "share of pixels whose ray hit a voxel", "fraction", "0.0000", Better.Neutral),
            s => s.HitRate));
        entries.Add(new(new MetricDescriptor(Mismatch, "pixels whose hit differs from the grid reference's; not checked when grid was not traced", "pixels", "0", Better.Lower),
            s => s.MismatchPixels));
        if (memory is not null)
        {
            string cache = string.Create(CultureInfo.InvariantCulture,
                $"{memory.CacheBytes / 1024.0:0.##} KiB, {memory.Ways}-way LRU, {memory.LineBytes}-byte lines, empty at each {Tracer.TileSize}×{Tracer.TileSize}-pixel tile");
            entries.Add(new(new MetricDescriptor(Name(Cache, CacheAccesses), $"line requests of {memory.Group.Lanes}-lane lockstep steps replayed through the simulated cache ({cache})",
                "requests", "0", Better.Lower), s => s.Memory?.Accesses));
            entries.Add(new(new MetricDescriptor(Name(Cache, CacheHitRate), $"share of its line requests the simulated cache served ({cache})", "ratio", "0.0000", Better.Higher),
                s => s.Memory?.HitRate));
            entries.Add(new(new MetricDescriptor(Name(Cache, CacheBytesFetched), $"bytes the simulated cache's misses fetched from the next level ({cache})",
                "bytes", "0", Better.Lower), s => s.Memory?.BytesFetched));
        }
        if (calibration is not null)
        {
            entries.Add(new(new MetricDescriptor(PredictedMs, $"GPU time predicted by the calibration for {calibration.Device}: Σ cost × frame total",
                "ms", "0.000", Better.Lower), s => calibration.PredictMs(s)));
        }
        return entries;
    }
}
