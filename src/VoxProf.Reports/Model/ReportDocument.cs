using System.Text.Json.Serialization;
using VoxProf.Reports.Calibration;
using VoxProf.Reports.Metrics;

namespace VoxProf.Reports.Model;

// report.json, as written by `trace` and read by `compare`. Counts are deterministic; everything that is not
// (timings, thread count) lives in Timings so two reports can be compared field by field without it.
// Bump SchemaVersion on any change a reader must know about.

/// <param name="Metrics">Every metric the strategies' values are keyed by, in report order (docs/reports.md).</param>
public sealed record ReportDocument(
    int SchemaVersion,
    string ToolVersion,
    SceneInfo Scene,
    TreeInfo Tree,
    CameraInfo Camera,
    RunInfo Run,
    IReadOnlyList<MetricDescriptor> Metrics,
    IReadOnlyList<StrategyReport> Strategies,
    EnvironmentInfo Environment,
    TimingInfo Timings)
{
    /// <summary>2: one metric list keyed by name (schema 1 had a record per counter and per lockstep group).</summary>
    public const int CurrentSchema = 2;

    /// <summary>Reasons the numbers may mislead (a Debug build, say); empty when there are none.</summary>
    public IReadOnlyList<string> Warnings { get; init; } = [];

    /// <summary>The git commit the tool was built from, or "unknown".</summary>
    public string ToolCommit { get; init; } = "unknown";

    /// <summary>Files of the whole run (report.json, summaries, preview, report.html); each strategy lists its own.</summary>
    public IReadOnlyList<string> Files { get; init; } = [];

    /// <summary>The command's arguments (the program name left out), so a reader can run the same trace again.</summary>
    public IReadOnlyList<string> CommandLine { get; init; } = [];

    /// <summary>The calibration predicted-ms comes from (trace --calibration); left out of the file without one.</summary>
    [JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)]
    public CalibrationInfo? Calibration { get; init; }
}

public sealed record SceneInfo(string Name, string? File, string? Sha256, int[] Extent);

public sealed record TreeInfo(int Branching, int Depth, long Nodes, long SolidVoxels, long Bytes, long[] NodesPerLevel)
{
    public int RootSize { get; init; }
}

public sealed record CameraInfo(string Name, float[] Eye, float[] Target, float[] Up, float FovDegrees);

/// <param name="Counters">Every counter measured (each strategy reports metrics of all of them).</param>
public sealed record RunInfo(int Width, int Height, int PrepassBlock, string[] Strategies, string[] Counters)
{
    public int Branching { get; init; }

    /// <summary>Heatmaps drawn: counter names, and subgroup names for the per-tile maximum maps.</summary>
    public string[] Heatmaps { get; init; } = [];

    /// <summary>"linear" or "log".</summary>
    public string Scale { get; init; } = "linear";

    /// <summary>The fixed heatmap range, when one was given.</summary>
    public double? RangeMin { get; init; }

    public double? RangeMax { get; init; }

    /// <summary>The strategy summary.md's ratios are relative to (the --baseline one, or the first tree strategy traced).</summary>
    public string? Baseline { get; init; }

    /// <summary>The subgroup sizes modelled, with their tiles over this image.</summary>
    public IReadOnlyList<SubgroupInfo> Subgroups { get; init; } = [];

    /// <summary>The range each heatmap was drawn with (fixed, or the one chosen from the data), one per strategy and map.</summary>
    public IReadOnlyList<HeatmapRange> HeatmapRanges { get; init; } = [];

    /// <summary>The memory model's cache (docs/counters.md, "Memory traffic"); null when the trace ran with --memory off.</summary>
    [JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)]
    public MemoryInfo? Memory { get; init; }

    /// <summary>Whether pixels-STRATEGY.bin.gz files were written (false with --no-pixels); absent in older reports, so true.</summary>
    public bool PixelData { get; init; } = true;
}

/// <summary>The memory model's settings: cache lines of <paramref name="LineBytes"/> bytes, a <paramref name="CacheBytes"/>-byte
/// cache with <paramref name="Ways"/> lines per set, replayed in lockstep groups of <paramref name="GroupLanes"/> lanes.</summary>
public sealed record MemoryInfo(int LineBytes, int CacheBytes, int Ways, int GroupLanes, int NodeRecordBytes)
{
    /// <summary>"64-byte lines, 16 KiB 4-way LRU, 32-lane steps".</summary>
    public string Describe() => string.Create(System.Globalization.CultureInfo.InvariantCulture,
        $"{LineBytes}-byte lines, {CacheBytes / 1024.0:0.##} KiB {Ways}-way LRU, {GroupLanes}-lane steps, {NodeRecordBytes}-byte node records");
}

/// <summary>The scale one heatmap image was drawn with: values at or above <paramref name="Max"/> take the top colour.</summary>
/// <param name="Scale">"linear" or "log".</param>
public sealed record HeatmapRange(string Strategy, string Map, string File, string Scale, double Min, double Max);

/// <summary>A subgroup size laid over the image: <paramref name="Tiles"/> tiles of TileWidth × TileHeight pixels, partial edge tiles included.</summary>
public sealed record SubgroupInfo(string Name, int Lanes, int TileWidth, int TileHeight, int Tiles);

/// <param name="Values">Every metric's value by metric name; null where nothing was measured (mismatch without grid).</param>
/// <param name="Files">Files written for this strategy, relative to the report directory.</param>
public sealed record StrategyReport(string Name, IReadOnlyDictionary<string, double?> Values, IReadOnlyList<string> Files)
{
    /// <summary>The metric's value; null when the strategy has none or nothing was measured.</summary>
    public double? Value(string metric) => Values.TryGetValue(metric, out double? v) ? v : null;
}

public sealed record EnvironmentInfo(string Runtime, int ProcessorCount, string Configuration, string Os);

/// <param name="TraceSeconds">Per strategy, its tracing's wall time (with the memory model on, recording each node read,
/// but not the model's pass over the reads).</param>
public sealed record TimingInfo(double TreeBuildSeconds, IReadOnlyDictionary<string, double> TraceSeconds)
{
    /// <summary>Worker threads used; counts do not depend on it, so it lives with the timings.</summary>
    public int Threads { get; init; }

    /// <summary>Per strategy, the wall time of the memory model's passes over its reads; null with the model off.</summary>
    [JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)]
    public IReadOnlyDictionary<string, double>? MemorySeconds { get; init; }
}
