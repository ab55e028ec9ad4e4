namespace VoxProf.Reports.Model;

// report.json, as written by `trace` and read by `compare`. Counts are deterministic; everything that is not
// (timings, thread count) lives in Timings so two reports can be compared field by field without it.
// Bump SchemaVersion on any change a reader must know about. Members added after schema 1 are init-only
// properties with defaults, so the positional constructors stay as they were.

public sealed record ReportDocument(
    int SchemaVersion,
    string ToolVersion,
    SceneInfo Scene,
    TreeInfo Tree,
    CameraInfo Camera,
    RunInfo Run,
    IReadOnlyList<StrategyReport> Strategies,
    EnvironmentInfo Environment,
    TimingInfo Timings)
{
    public const int CurrentSchema = 1;

    /// <summary>Reasons the numbers may mislead (a Debug build, say); empty when there are none.</summary>
    public IReadOnlyList<string> Warnings { get; init; } = [];
}

public sealed record SceneInfo(string Name, string? File, string? Sha256, int[] Extent);

public sealed record TreeInfo(int Branching, int Depth, long Nodes, long SolidVoxels, long Bytes, long[] NodesPerLevel)
{
    public int RootSize { get; init; }
}

public sealed record CameraInfo(string Name, float[] Eye, float[] Target, float[] Up, float FovDegrees);

/// <param name="Counters">Every counter measured (each strategy reports statistics for all of them).</param>
public sealed record RunInfo(int Width, int Height, int PrepassBlock, string[] Strategies, string[] Counters)
{
    public int Branching { get; init; }

    /// <summary>Heatmaps drawn: counter names, and "wave32"/"wave64" for the per-tile maximum maps.</summary>
    public string[] Heatmaps { get; init; } = [];

    /// <summary>"linear" or "log".</summary>
    public string Scale { get; init; } = "linear";

    /// <summary>The fixed heatmap range, when one was given.</summary>
    public double? RangeMin { get; init; }

    public double? RangeMax { get; init; }

    /// <summary>The strategy summary.md is relative to (the --baseline one, or the slowest by wave32 mean tile max).</summary>
    public string? Baseline { get; init; }
}

/// <param name="Files">Files written for this strategy, relative to the report directory.</param>
public sealed record StrategyReport(
    string Name,
    double HitRate,
    long MismatchPixels,
    IReadOnlyList<CounterStats> Counters,
    IReadOnlyList<WaveStats> Waves,
    IReadOnlyList<string> Files);

/// <summary>Percentiles follow Hyndman &amp; Fan (1996) definition 7.</summary>
public sealed record CounterStats(string Counter, long Total, double Mean, double P50, double P90, double P99, long Max)
{
    public string Unit { get; init; } = "count";
}

/// <summary>Lockstep-group statistics of loop iterations for one group size (see docs/reports.md).</summary>
public sealed record WaveStats(int Lanes, int TileWidth, int TileHeight, int Tiles, double MeanTileMax, double SimdEfficiency)
{
    public long MaxTileMax { get; init; }

    /// <summary>"wave32" or "wave64": the name used in summary.csv and heatmap file names.</summary>
    public string Name => $"wave{Lanes}";
}

public sealed record EnvironmentInfo(string Runtime, int ProcessorCount, string Configuration, string Os);

public sealed record TimingInfo(double TreeBuildSeconds, IReadOnlyDictionary<string, double> TraceSeconds)
{
    /// <summary>Worker threads used; counts do not depend on it, so it lives with the timings.</summary>
    public int Threads { get; init; }
}
