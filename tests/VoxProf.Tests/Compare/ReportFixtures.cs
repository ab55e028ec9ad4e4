using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;

namespace VoxProf.Tests.Compare;

/// <summary>Hand-made reports: small, with numbers chosen so the expected changes are known by hand.</summary>
internal static class ReportFixtures
{
    /// <summary>The six statistics of a measure: total = 1000 × mean (the fixtures' 40 × 25 pixels), p50 = mean, p90 = 1.5 × mean, p99 = 2 × mean.</summary>
    /// <remarks>The maximum defaults to 100, or 2 × mean when that is larger (a maximum below p99 is a damaged report).</remarks>
    public static Dictionary<string, double?> Counter(string name, double mean, long? max = null) => new()
    {
        [$"{name}.total"] = (long)(mean * 1000),
        [$"{name}.mean"] = mean,
        [$"{name}.p50"] = mean,
        [$"{name}.p90"] = mean * 1.5,
        [$"{name}.p99"] = mean * 2,
        [$"{name}.max"] = max ?? Math.Max(100, (long)Math.Ceiling(mean * 2)),
    };

    /// <summary>A subgroup size's three metrics; the costliest tile stays at 100.</summary>
    public static Dictionary<string, double?> Subgroup(int lanes, double tileMaxMean, double efficiency) => new()
    {
        [$"subgroup{lanes}.tile-max-mean"] = tileMaxMean,
        [$"subgroup{lanes}.tile-max-max"] = 100,
        [$"subgroup{lanes}.simd-efficiency"] = efficiency,
    };

    /// <summary>Hit rate and mismatch; a null mismatch was not checked (grid not traced).</summary>
    public static Dictionary<string, double?> Facts(double hitRate = 0.75, double? mismatch = 0) => new()
    {
        [MetricCatalogue.HitRate] = hitRate,
        [MetricCatalogue.Mismatch] = mismatch,
    };

    public static StrategyReport Strategy(string name, double iterationsMean, double tileMax32 = 20, double efficiency32 = 0.5) =>
        Make(name, Counter("iterations", iterationsMean), Counter("node-fetches", iterationsMean * 2, max: 200),
            Subgroup(32, tileMax32, efficiency32), Subgroup(64, tileMax32 * 1.2, efficiency32 * 0.9), Facts());

    /// <summary>A strategy holding exactly the given values.</summary>
    public static StrategyReport Make(string name, params Dictionary<string, double?>[] parts)
    {
        var values = new Dictionary<string, double?>();
        foreach (var part in parts)
        {
            foreach (var (k, v) in part)
                values[k] = v;
        }
        return new StrategyReport(name, values, [$"{name}-iterations.png"]);
    }

    /// <summary>The strategy with some values replaced or added.</summary>
    public static StrategyReport With(this StrategyReport s, params Dictionary<string, double?>[] parts) =>
        Make(s.Name, [new Dictionary<string, double?>(s.Values), .. parts]);

    public static ReportDocument Report(params StrategyReport[] strategies) => Report("abc123", strategies);

    /// <summary>A report whose metric list is the standard one, cut to the metrics its strategies hold.</summary>
    public static ReportDocument Report(string sceneHash, params StrategyReport[] strategies)
    {
        var held = strategies.SelectMany(s => s.Values.Keys).ToHashSet();
        return new(ReportDocument.CurrentSchema, "0.1.0",
            new SceneInfo("harbour", "harbour.json", sceneHash, [256, 64, 256]),
            new TreeInfo(4, 5, 1200, 50000, 65536, [1, 8, 64, 300, 827]),
            new CameraInfo("pier", [10f, 20f, -30f], [128f, 16f, 128f], [0f, 1f, 0f], 60f),
            new RunInfo(40, 25, 0, strategies.Select(s => s.Name).ToArray(), ["iterations", "node-fetches"]),
            MetricCatalogue.Standard.Where(m => held.Contains(m.Name)).ToArray(),
            strategies,
            new EnvironmentInfo(".NET 10.0", 2, "Release", "Linux"),
            new TimingInfo(0.5, strategies.ToDictionary(s => s.Name, _ => 0.25)));
    }

    /// <summary>The report traced at another image size: every total is its mean times the new pixel count.</summary>
    public static ReportDocument Resized(ReportDocument doc, int width, int height) => doc with
    {
        Run = doc.Run with { Width = width, Height = height },
        Strategies = doc.Strategies.Select(s => Make(s.Name, s.Values.ToDictionary(
            kv => kv.Key,
            kv => kv.Key.EndsWith(".total", StringComparison.Ordinal) && s.Value(kv.Key[..^".total".Length] + ".mean") is { } mean
                ? mean * width * height
                : kv.Value))).ToArray(),
    };

    public static ReportDocument Standard(double scale = 1.0) => Report(
        Strategy("grid", 40 * scale, 60 * scale, 0.6),
        Strategy("dda", 12 * scale, 20 * scale, 0.5),
        Strategy("dda-mask", 8 * scale, 15 * scale, 0.45));

    /// <summary>Writes the report into a fresh directory under <paramref name="root"/> and returns the directory.</summary>
    public static string Write(TempDir root, string name, ReportDocument doc)
    {
        var dir = Path.Combine(root.Path, name);
        Directory.CreateDirectory(dir);
        File.WriteAllText(Path.Combine(dir, "report.json"), ReportJson.Serialize(doc));
        return dir;
    }
}

/// <summary>A temporary directory removed at the end of the test.</summary>
internal sealed class TempDir : IDisposable
{
    public TempDir() => Directory.CreateDirectory(Path);

    public string Path { get; } = System.IO.Path.Combine(System.IO.Path.GetTempPath(), "voxprof-test-" + Guid.NewGuid().ToString("N"));

    public void Dispose()
    {
        try
        {
            Directory.Delete(Path, recursive: true);
            // The lock an output folder written straight into this directory leaves beside it.
            File.Delete(System.IO.Path.Combine(System.IO.Path.GetTempPath(), $".{System.IO.Path.GetFileName(Path)}.voxprof-lock"));
        }
        catch (IOException)
        {
            // A leftover temp directory is harmless; never fail a test over cleanup.
        }
    }
}
