using VoxProf.Core.Traversal;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Tables;

/// <summary>
/// What one column of the strategy table means. <paramref name="Group"/> is a counter name, "wave32"/"wave64", or
/// "strategy" for per-strategy facts; <paramref name="Format"/> is a .NET numeric format for people (CSV keeps full
/// precision); <paramref name="LowerIsBetter"/> is null for a descriptive figure that is neither better nor worse.
/// </summary>
public sealed record MetricDescriptor(string Group, string Statistic, string Title, string Unit, string Format, bool? LowerIsBetter)
{
    public string Id => $"{Group}.{Statistic}";
}

/// <summary>Strategies × metrics: the single table that summary.csv and summary.md both render.</summary>
public sealed class MetricTable
{
    public const string StrategyGroup = "strategy";

    private readonly double[] _values;

    public MetricTable(IReadOnlyList<string> rows, IReadOnlyList<MetricDescriptor> metrics, double[] values)
    {
        if (values.Length != rows.Count * metrics.Count)
            throw new ArgumentException("values must hold rows × metrics entries", nameof(values));
        Rows = rows;
        Metrics = metrics;
        _values = values;
    }

    public IReadOnlyList<string> Rows { get; }
    public IReadOnlyList<MetricDescriptor> Metrics { get; }

    /// <summary>NaN where a row has no value for the metric.</summary>
    public double this[int row, int metric] => _values[row * Metrics.Count + metric];

    public int IndexOf(string id)
    {
        for (int i = 0; i < Metrics.Count; i++)
        {
            if (Metrics[i].Id == id)
                return i;
        }
        return -1;
    }

    public int RowOf(string name)
    {
        for (int i = 0; i < Rows.Count; i++)
        {
            if (Rows[i] == name)
                return i;
        }
        return -1;
    }

    /// <summary>Groups in column order, each with the unit of its first cost figure (what its rows measure).</summary>
    public IReadOnlyList<(string Group, string Unit)> Groups =>
        Metrics.GroupBy(m => m.Group).Select(g => (g.Key, (g.FirstOrDefault(m => m.LowerIsBetter is not null) ?? g.First()).Unit)).ToList();

    public static MetricTable FromReport(ReportDocument report)
    {
        var metrics = new List<MetricDescriptor>();
        var getters = new List<Func<StrategyReport, double>>();
        void Add(MetricDescriptor d, Func<StrategyReport, double> get)
        {
            metrics.Add(d);
            getters.Add(get);
        }

        IReadOnlyList<CounterStats> counterOrder = report.Strategies.Count > 0 ? report.Strategies[0].Counters : [];
        foreach (CounterStats c0 in counterOrder)
        {
            string g = c0.Counter;
            bool work = CounterNames.LowerIsBetter(g);
            CounterStats Of(StrategyReport s) => s.Counters.First(c => c.Counter == g);
            Add(new(g, "total", $"{g} total", c0.Unit, "0", work), s => Of(s).Total);
            Add(new(g, "mean", $"{g} mean", c0.Unit, "0.00", work), s => Of(s).Mean);
            Add(new(g, "p50_hf7", $"{g} p50", c0.Unit, "0.00", work), s => Of(s).P50);
            Add(new(g, "p90_hf7", $"{g} p90", c0.Unit, "0.00", work), s => Of(s).P90);
            Add(new(g, "p99_hf7", $"{g} p99", c0.Unit, "0.00", work), s => Of(s).P99);
            Add(new(g, "max", $"{g} max", c0.Unit, "0", work), s => Of(s).Max);
        }

        IReadOnlyList<WaveStats> waveOrder = report.Strategies.Count > 0 ? report.Strategies[0].Waves : [];
        foreach (WaveStats w0 in waveOrder)
        {
            string g = w0.Name;
            WaveStats Of(StrategyReport s) => s.Waves.First(w => w.Lanes == w0.Lanes);
            Add(new(g, "lanes", $"{g} lanes", "lanes", "0", null), s => Of(s).Lanes);
            Add(new(g, "tile_width", $"{g} tile width", "pixels", "0", null), s => Of(s).TileWidth);
            Add(new(g, "tile_height", $"{g} tile height", "pixels", "0", null), s => Of(s).TileHeight);
            Add(new(g, "tiles", $"{g} tiles", "tiles", "0", null), s => Of(s).Tiles);
            Add(new(g, "mean_tile_max", $"{g} mean tile max", "iterations", "0.00", true), s => Of(s).MeanTileMax);
            Add(new(g, "max_tile_max", $"{g} max tile max", "iterations", "0", true), s => Of(s).MaxTileMax);
            Add(new(g, "simd_efficiency", $"{g} SIMD efficiency", "iterations", "0.0000", false), s => Of(s).SimdEfficiency);
        }

        Add(new(StrategyGroup, "hit_rate", "hit rate", "fraction", "0.0000", null), s => s.HitRate);
        Add(new(StrategyGroup, "mismatch_pixels", "mismatched pixels", "pixels", "0", true), s => s.MismatchPixels);

        var values = new double[report.Strategies.Count * metrics.Count];
        for (int r = 0; r < report.Strategies.Count; r++)
            for (int m = 0; m < metrics.Count; m++)
                values[r * metrics.Count + m] = getters[m](report.Strategies[r]);
        return new MetricTable(report.Strategies.Select(s => s.Name).ToList(), metrics, values);
    }
}
