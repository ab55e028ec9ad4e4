using System.Numerics;
using VoxProf.Core.Calibration;
using VoxProf.Core.Memory;
using VoxProf.Core.Scenes;
using VoxProf.Core.Statistics;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Reports.Calibration;
using VoxProf.Reports.Export;
using VoxProf.Reports.Model;

namespace VoxProf.Tests.Reports;

/// <summary>Hand-made traces, so report tests do not depend on the tracer.</summary>
internal static class TestRuns
{
    public static readonly EnvironmentInfo Environment = new("test-runtime", 2, "Release", "test-os");

    public static ReportOptions Options => new()
    {
        ToolVersion = "0.1.0-test",
        ToolCommit = "0123456789abcdef0123456789abcdef01234567",
        CommandLine = ["trace", "yard.json", "--size", "16x8"],
        Environment = Environment,
        Threads = 2,
    };

    /// <summary>A made-up calibration fitted on <see cref="Small"/>'s settings: 40 ns a pixel, 3 ns an iteration, 5 ns a node fetch.</summary>
    public static AppliedCalibration Calibration { get; } = new("/calibrations/lab.json", new CostModel("lab card A, driver 9.1",
        [new CostTerm(null, 40), new CostTerm(Measures.Find("iterations"), 3), new CostTerm(Measures.Find("node-fetches"), 5)],
        new FitScope([4], [new ImageSize(16, 8)])));

    /// <summary>
    /// A 16×8 image with a grid and a dda result. Grid iterations are x + y + 1; dda takes half as many, plus a
    /// spike of 40 at (3, 2); dda's hit at (5, 1) is a different voxel from the grid's. With <paramref name="memory"/>
    /// (as `trace` runs by default) each result carries a made-up memory model result (<see cref="Memory"/>).
    /// </summary>
    public static TraceRun Small(int width = 16, int height = 8, bool memory = true)
    {
        var camera = new CameraSpec("gate", new Vector3(1.5f, 20, -30), new Vector3(32, 8, 32), Vector3.UnitY, 50);
        var scene = new Scene(64, 32, 64, [], [camera], "yard", "/scenes/yard.json", "ab12cd");
        var tree = new TreeStats(4, 3, 64, [1, 6, 40], [6, 40, 900], [64, 384, 2560], 900, 3008, TimeSpan.FromMilliseconds(12.5));
        var settings = new TraceSettings(width, height, 4, 0, 2);
        return new TraceRun(scene, camera, settings, tree,
        [
            WithMemory(Result(BuiltInStrategies.Grid, width, height, (x, y) => (uint)(x + y + 1), hitShift: false, elapsedMs: 30), memory ? 3 : 0),
            WithMemory(Result(BuiltInStrategies.Dda, width, height, (x, y) => x == 3 && y == 2 ? 40u : (uint)(x + y + 1) / 2, hitShift: true, elapsedMs: 10), memory ? 1 : 0),
        ]);
    }

    /// <summary>
    /// The result with a made-up memory model result when <paramref name="scale"/> is above 0: group g of each shape
    /// touched scale × (g + 2) lines; scale × 100 requests of which scale × 60 hit; its passes took a fifth of the
    /// tracing's time.
    /// </summary>
    private static StrategyResult WithMemory(StrategyResult r, int scale)
    {
        if (scale == 0)
            return r;
        var groups = SubgroupShape.Standard.Select(s =>
            new GroupLines(s, Enumerable.Range(0, s.TilesX(r.Width) * s.TilesY(r.Height)).Select(g => (uint)(scale * (g + 2))).ToArray())).ToArray();
        return new StrategyResult(r.Strategy, r.Width, r.Height, r.Counters, r.Hits, r.Elapsed)
        {
            Memory = new MemoryResult(MemorySettings.Default, groups, 100L * scale, 60L * scale),
            MemoryElapsed = r.Elapsed / 5,
        };
    }

    public static StrategyResult Result(StrategyDefinition s, int width, int height, Func<int, int, uint> iterations, bool hitShift, double elapsedMs)
    {
        var counters = new uint[CounterNames.Count][];
        for (int c = 0; c < counters.Length; c++)
        {
            counters[c] = new uint[width * height];
            for (int y = 0; y < height; y++)
                for (int x = 0; x < width; x++)
                    counters[c][y * width + x] = c == 0 ? iterations(x, y) : (uint)((iterations(x, y) * (c + 1)) % 7);
        }
        var hits = new PixelHit[width * height];
        for (int y = 0; y < height; y++)
        {
            for (int x = 0; x < width; x++)
            {
                if (x >= width / 2 + y % 3)
                    continue;
                hits[y * width + x] = new PixelHit
                {
                    Hit = true,
                    X = x,
                    Y = 10 - y,
                    Z = 20 + (hitShift && x == 5 && y == 1 ? 1 : 0),
                    T = 12.25f + x,
                    Material = (byte)(1 + x % 3),
                    Face = (HitFace)(1 + (x + y) % 6),
                };
            }
        }
        return new StrategyResult(s, width, height, counters, hits, TimeSpan.FromMilliseconds(elapsedMs));
    }
}
