namespace VoxProf.Reports.Model;

// report.json, as written by `trace` and read by `compare`. Counts are deterministic; everything that is not
// (timings, environment) lives in its own objects so two reports can be compared field by field without them.
// Bump SchemaVersion on any change a reader must know about.

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
}

public sealed record SceneInfo(string Name, string? File, string? Sha256, int[] Extent);

public sealed record TreeInfo(int Branching, int Depth, long Nodes, long SolidVoxels, long Bytes, long[] NodesPerLevel);

public sealed record CameraInfo(string Name, float[] Eye, float[] Target, float[] Up, float FovDegrees);

public sealed record RunInfo(int Width, int Height, int PrepassBlock, string[] Strategies, string[] Counters);

public sealed record StrategyReport(
    string Name,
    double HitRate,
    long MismatchPixels,
    IReadOnlyList<CounterStats> Counters,
    IReadOnlyList<WaveStats> Waves,
    IReadOnlyList<string> Files);

/// <summary>Percentiles follow Hyndman &amp; Fan (1996) definition 7.</summary>
public sealed record CounterStats(string Counter, long Total, double Mean, double P50, double P90, double P99, long Max);

/// <summary>Lockstep-group statistics of loop iterations for one group size.</summary>
public sealed record WaveStats(int Lanes, int TileWidth, int TileHeight, int Tiles, double MeanTileMax, double SimdEfficiency);

public sealed record EnvironmentInfo(string Runtime, int ProcessorCount, string Configuration, string Os);

public sealed record TimingInfo(double TreeBuildSeconds, IReadOnlyDictionary<string, double> TraceSeconds);
