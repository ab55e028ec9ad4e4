using VoxProf.Reports.Model;

namespace VoxProf.Tests.Compare;

/// <summary>Hand-made reports: small, with numbers chosen so the expected changes are known by hand.</summary>
internal static class ReportFixtures
{
    public static CounterStats Counter(string name, double mean, long max = 100) =>
        new(name, Total: (long)(mean * 1000), Mean: mean, P50: mean, P90: mean * 1.5, P99: mean * 2, Max: max);

    public static WaveStats Wave(int lanes, double meanTileMax, double efficiency) =>
        new(lanes, 8, lanes / 8, 125, meanTileMax, efficiency);

    public static StrategyReport Strategy(string name, double iterationsMean, double tileMax32 = 20, double efficiency32 = 0.5) =>
        new(name, HitRate: 0.75, MismatchPixels: 0,
            [Counter("iterations", iterationsMean), Counter("node-fetches", iterationsMean * 2)],
            [Wave(32, tileMax32, efficiency32), Wave(64, tileMax32 * 1.2, efficiency32 * 0.9)],
            [$"{name}-iterations.png"]);

    public static ReportDocument Report(params StrategyReport[] strategies) => Report("abc123", strategies);

    public static ReportDocument Report(string sceneHash, params StrategyReport[] strategies) =>
        new(ReportDocument.CurrentSchema, "0.1.0",
            new SceneInfo("harbour", "harbour.json", sceneHash, [256, 64, 256]),
            new TreeInfo(4, 5, 1200, 50000, 65536, [1, 8, 64, 300, 827]),
            new CameraInfo("pier", [10f, 20f, -30f], [128f, 16f, 128f], [0f, 1f, 0f], 60f),
            new RunInfo(40, 25, 0, strategies.Select(s => s.Name).ToArray(), ["iterations", "node-fetches"]),
            strategies,
            new EnvironmentInfo(".NET 10.0", 2, "Release", "Linux"),
            new TimingInfo(0.5, strategies.ToDictionary(s => s.Name, _ => 0.25)));

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
        }
        catch (IOException)
        {
            // A leftover temp directory is harmless; never fail a test over cleanup.
        }
    }
}
