using System.Text.Json.Serialization;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Views;

// report.json at the top of a run of several views (docs/reports.md, "Runs of several views"). Each view keeps its own
// folder with the report.json of one view; this file holds what only the whole run knows: the list of views, the
// distribution of each metric over them and the worst views. Everything but Environment and Timings is deterministic.

/// <param name="Kind">Always <see cref="RunKind"/>: tells this file from the report.json of one view.</param>
/// <param name="CommandLine">The command's arguments without those that change no number (--out, --shard, --threads,
/// --quiet), so every shard of a run and the run traced whole record the same command.</param>
/// <param name="Views">Every view of the run in trace order, also those of other shards.</param>
/// <param name="Shard">Which share of the views this folder holds; left out of a whole or merged run.</param>
/// <param name="Metrics">The metrics of the views' reports, in their order.</param>
public sealed record RunDocument(
    string Kind,
    int SchemaVersion,
    string ToolVersion,
    string ToolCommit,
    SceneInfo Scene,
    IReadOnlyList<string> CommandLine,
    IReadOnlyList<RunView> Views,
    IReadOnlyList<MetricDescriptor> Metrics,
    IReadOnlyList<RunStrategy> Strategies,
    IReadOnlyList<WorstViews> Worst,
    IReadOnlyList<string> Files,
    EnvironmentInfo Environment,
    RunTimings Timings)
{
    public const string RunKind = "run";

    public const int CurrentSchema = 1;

    [JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)]
    public RunShard? Shard { get; init; }

    /// <summary>The strategy the contact sheet shows and summary.md lists first (the views' baseline).</summary>
    public string? Baseline { get; init; }

    /// <summary>The --link-base summary.md's links start with; left out without one.</summary>
    [JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)]
    public string? LinkBase { get; init; }

    /// <summary>The metric the contact sheet ranks views by, and the heatmap it shows.</summary>
    [JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)]
    public ContactSheetInfo? ContactSheet { get; init; }
}

/// <summary>One view: its name (a camera, or a path's frame such as walk#007), its folder and its camera.</summary>
public sealed record RunView(string Name, string Folder, CameraInfo Camera);

/// <summary>Shard <paramref name="Index"/> of <paramref name="Count"/> (1-based), holding the named views.</summary>
public sealed record RunShard(int Index, int Count, IReadOnlyList<string> Views);

/// <summary>One strategy over the views: each metric's distribution, and each mean metric view by view.</summary>
/// <param name="PerView">For every metric whose statistic is the mean: its value in each view of the folder, in view order.</param>
public sealed record RunStrategy(string Name, IReadOnlyDictionary<string, ViewDistribution> Distribution,
    IReadOnlyDictionary<string, double?[]> PerView);

/// <summary>
/// A metric's values over the views that have one: their mean, median, 90th percentile (Hyndman &amp; Fan definition 7)
/// and maximum, with the view holding the maximum.
/// </summary>
public sealed record ViewDistribution(int Views, double Mean, double P50, double P90, double Max, string MaxView);

/// <summary>The views where a strategy does worst on a metric (highest cost, lowest efficiency), worst first.</summary>
public sealed record WorstViews(string Metric, string Strategy, IReadOnlyList<ViewValue> Views);

public sealed record ViewValue(string View, double Value);

/// <summary>What worst-views.png shows: the heatmap <paramref name="Map"/> of <paramref name="Strategy"/> in the views worst by <paramref name="Metric"/>.</summary>
public sealed record ContactSheetInfo(string File, string Strategy, string Map, string Metric, IReadOnlyList<string> Views);

/// <summary>Wall times: not deterministic, kept apart like a view's timings.</summary>
public sealed record RunTimings(double TreeBuildSeconds, double TraceSeconds, int Threads);
