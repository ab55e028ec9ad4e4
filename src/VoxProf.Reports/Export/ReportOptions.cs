using VoxProf.Core.Statistics;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Calibration;
using VoxProf.Reports.Images;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Export;

/// <summary>How a trace is written out. The defaults are the trace command's.</summary>
public sealed record ReportOptions
{
    public ScaleKind Scale { get; init; } = ScaleKind.Linear;

    /// <summary>Fixed heatmap range; null for each counter's own 0..max over all strategies.</summary>
    public double? RangeMin { get; init; }

    public double? RangeMax { get; init; }

    /// <summary>Heatmaps per strategy: counter and subgroup names (see <see cref="HeatmapNames"/>).</summary>
    public IReadOnlyList<string> Heatmaps { get; init; } = HeatmapNames.Default;

    /// <summary>Also write pixels-STRATEGY.csv.</summary>
    public bool PerPixel { get; init; }

    /// <summary>The strategy summary.md's ratios are relative to; null for the first tree strategy traced.</summary>
    public StrategyDefinition? Baseline { get; init; }

    /// <summary>Write pixels-STRATEGY.bin.gz (false with --no-pixels: compare then has no per-pixel differences).</summary>
    public bool PixelData { get; init; } = true;

    /// <summary>Write report.html (false with --no-html).</summary>
    public bool Html { get; init; } = true;

    /// <summary>Absolute URL that summary.md's image links start with (--link-base); null for links relative to the file.</summary>
    public Uri? LinkBase { get; init; }

    public int Threads { get; init; }

    /// <summary>The calibration behind predicted-ms and the predicted-cost map; null for none.</summary>
    public AppliedCalibration? Calibration { get; init; }

    public string ToolVersion { get; init; } = ToolInfo.Version;

    public string ToolCommit { get; init; } = ToolInfo.Commit;

    /// <summary>The arguments the command was run with, as report.json records them (the program name left out).</summary>
    public IReadOnlyList<string> CommandLine { get; init; } = [];

    public EnvironmentInfo Environment { get; init; } = ToolInfo.CurrentEnvironment();
}

/// <summary>Heatmap names accepted by --counters: every counter, plus the per-tile maxima of each subgroup size.</summary>
public static class HeatmapNames
{
    public static IReadOnlyList<string> Default { get; } = [Counter.Iterations.Name(), .. SubgroupShape.Standard.Select(s => s.Name)];

    public static IReadOnlyList<string> All { get; } =
        [.. CounterNames.All.Select(c => c.Name()), .. SubgroupShape.Standard.Select(s => s.Name), .. SubgroupShape.Standard.Select(LinesOf)];

    /// <summary>"lines-per-group32": each pixel shows the distinct cache lines its lockstep group of that shape touched.</summary>
    public static string LinesOf(SubgroupShape shape) => $"lines-per-group{shape.Lanes}";

    public static string ValidList => string.Join(", ", All);

    /// <summary>Every heatmap name a run of <paramref name="strategies"/> can draw: <see cref="All"/>, then each
    /// counter a strategy declares for itself.</summary>
    public static IReadOnlyList<string> For(IEnumerable<StrategyDefinition> strategies) =>
        [.. All, .. strategies.SelectMany(s => s.ExtraCounters).Select(c => c.Name).Distinct(StringComparer.OrdinalIgnoreCase)];

    /// <summary>
    /// Whether a strategy with these counters has the map: every strategy has the built-in counters and the subgroup
    /// and predicted-cost maps; a counter of a strategy's own is drawn for that strategy only.
    /// </summary>
    public static bool AppliesTo(string map, StrategyDefinition strategy) =>
        map == PredictedCost || IsSubgroup(map, out _) || IsGroupLines(map, out _) || strategy.CounterNames.Contains(map, StringComparer.OrdinalIgnoreCase);

    /// <summary>
    /// Each pixel's GPU time predicted by a calibration, in picoseconds: drawn with --calibration, not a --counters
    /// choice (there is nothing to draw without one).
    /// </summary>
    public const string PredictedCost = "predicted-cost";

    public static bool TryParse(string text, out string name)
    {
        name = All.FirstOrDefault(n => string.Equals(n, text, StringComparison.OrdinalIgnoreCase)) ?? "";
        return name.Length > 0;
    }

    /// <summary>True for a lockstep-group map of the memory model (each pixel shows its group's distinct cache lines).</summary>
    public static bool IsGroupLines(string name, out SubgroupShape shape)
    {
        shape = SubgroupShape.Standard.FirstOrDefault(s => LinesOf(s) == name);
        return shape.Lanes > 0;
    }

    /// <summary>True for a map drawn from the memory model, which a trace with --memory off has nothing for.</summary>
    public static bool NeedsMemoryModel(string name) =>
        IsGroupLines(name, out _) || (CounterNames.TryParse(name, out Counter c) && c.NeedsMemoryModel());

    /// <summary>True for a subgroup map (each pixel shows its tile's largest loop iterations).</summary>
    public static bool IsSubgroup(string name, out SubgroupShape shape)
    {
        foreach (SubgroupShape s in SubgroupShape.Standard)
        {
            if (s.Name == name)
            {
                shape = s;
                return true;
            }
        }
        shape = default;
        return false;
    }
}
