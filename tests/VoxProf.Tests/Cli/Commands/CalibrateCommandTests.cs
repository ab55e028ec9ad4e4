using System.Globalization;
using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;
using CsvHelper;
using VoxProf.Cli;
using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Export;
using VoxProf.Tests.Calibration;
using VoxProf.Tests.Compare;
using VoxProf.Tests.Reports;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>
/// calibrate on real reports of ring-post (three cameras, every strategy, two sizes, with and without the prepass)
/// against GPU times made from known costs, then trace and compare with the calibration it wrote.
/// </summary>
public sealed class CalibrateCommandTests : IClassFixture<RingPostViews>, IDisposable
{
    private readonly RingPostViews _views;
    private readonly TempDir _tmp = new();
    private readonly StringWriter _out = new();
    private readonly StringWriter _err = new();

    public CalibrateCommandTests(RingPostViews views) => _views = views;

    public void Dispose() => _tmp.Dispose();

    private string P(params string[] parts) => Path.Combine([_tmp.Path, .. parts]);

    // Made-up costs in ns: per pixel, per total iteration, per total node fetch, per slab test.
    private static readonly (string Name, double Ns)[] Truth = [("pixels", 2.5), ("total-iterations", 0.8), ("total-node-fetches", 1.7), ("slab-tests", 0.35)];

    private static double TrueMs(StrategyStatistics s) =>
        (Truth[0].Ns * s.Pixels + Truth.Skip(1).Sum(t => t.Ns * s[t.Name].Total)) / 1e6;

    private int Run(params string[] args) => VoxProf.Cli.Cli.Run(args, _out, _err);

    /// <summary>report.json of every run, one directory each; returns the directories.</summary>
    private List<string> WriteReports()
    {
        var dirs = new List<string>();
        for (int i = 0; i < _views.Runs.Count; i++)
        {
            TraceRun run = _views.Runs[i];
            var stats = StrategyStatistics.Compute(run);
            var options = TestRuns.Options;
            var context = new ReportContext(run, stats, ReportBuilder.Build(run, stats, options), options);
            string dir = P("runs", $"{run.Camera.Name}-{i}");
            using (OutputDirectory output = OutputDirectory.Open(dir))
            {
                new ReportWriter([new ReportJsonExporter()]).Write(context, output).Failures.Should().BeEmpty();
                output.Commit();
            }
            dirs.Add(dir);
        }
        return dirs;
    }

    /// <summary>The times CSV, one record per strategy of every run, with prepass and size columns to tell runs apart.</summary>
    private string WriteTimes(Func<StrategyStatistics, double> ms, int? take = null)
    {
        var sb = new StringBuilder("scene,camera,strategy,prepass,size,gpu-ms,note\r\n");
        var views = _views.Runs.SelectMany(run => StrategyStatistics.Compute(run).Select(s => (Run: run, Stats: s)));
        foreach (var (run, s) in views.Take(take ?? int.MaxValue))
        {
            sb.Append(CultureInfo.InvariantCulture,
                $"ring-post,{run.Camera.Name},{s.Name},{(run.Settings.PrepassBlock == 0 ? "off" : "4")},{run.Settings.Width}x{run.Settings.Height},{ms(s):R},\"median, 20 frames\"\r\n");
        }
        string path = P("times.csv");
        File.WriteAllText(path, sb.ToString());
        return path;
    }

    private static double Cost(JsonElement calibration, string feature) =>
        calibration.GetProperty("costs").EnumerateArray().Single(c => c.GetProperty("feature").GetString() == feature).GetProperty("nanoseconds").GetDouble();

    private static double SummaryValue(string dir, string strategy, string metric)
    {
        using var csv = CsvReader.FromFile(Path.Combine(dir, "summary.csv"));
        while (csv.Read())
        {
            if (csv.GetString("strategy") == strategy)
                return double.Parse(csv.GetString(metric), CultureInfo.InvariantCulture);
        }
        throw new InvalidOperationException($"no {strategy} in {dir}");
    }

    [Fact]
    public void Calibrate_recovers_known_costs_and_trace_and_compare_then_use_them()
    {
        var reports = WriteReports();
        string times = WriteTimes(TrueMs);

        int code = Run(["calibrate", times, .. reports, "--device", "lab card A, driver 9.1", "--out", P("calib")]);

        code.Should().Be(ExitCodes.Ok, _err.ToString());
        _err.ToString().Should().BeEmpty();
        _out.ToString().Should().Contain("calibration for lab card A, driver 9.1 from 45 views (branching 4; 32x24, 48x32)")
            // The share moves with the counts of the runs with the prepass (its grid look-ups): 30.1% before the coarse
            // ray stopped repeating look-ups it knew the answer to, 30.2% before the coarse rays ran level by level and
            // 30.1% until each started its search for an empty level where its enclosing block's ray would have.
            .And.Contain("\ntotal-iterations     0.8  count  30.2%\n");
        using (var json = JsonDocument.Parse(File.ReadAllText(P("calib", "calibration.json"))))
        {
            var root = json.RootElement;
            foreach (var (name, ns) in Truth)
                Cost(root, name).Should().BeApproximately(ns, ns * 1e-6, name);
            root.GetProperty("device").GetString().Should().Be("lab card A, driver 9.1");
            root.GetProperty("rows").GetArrayLength().Should().Be(45);
            root.GetProperty("rows")[0].GetProperty("line").GetInt32().Should().Be(2);
            root.GetProperty("rows")[0].GetProperty("note").GetString().Should().Be("median, 20 frames");
            root.GetProperty("fit").GetProperty("rSquared").GetDouble().Should().BeApproximately(1, 1e-9);
        }
        File.ReadAllText(P("calib", "calibration.md")).Should().StartWith("# VoxProf calibration: lab card A, driver 9.1");

        // A trace with the calibration predicts each strategy's time with the costs above.
        string scene = Path.Combine(AppContext.BaseDirectory, "samples", "ring-post.vpscene.json");
        string[] Trace(string outDir, string calibration, string size = "48x32") =>
            ["trace", scene, "--camera", "front", "--size", size, "--strategy", "dda,hdda", "--out", outDir, "--quiet", "--threads", "2", "--calibration", calibration];
        Run(Trace(P("base"), P("calib", "calibration.json"))).Should().Be(ExitCodes.Ok, _err.ToString());
        _err.ToString().Should().BeEmpty();
        var frontRun = _views.Runs.First(r => r.Camera.Name == "front" && r.Settings.PrepassBlock == 0 && r.Settings.Width == 48);
        var dda = StrategyStatistics.Compute(frontRun).Single(s => s.Name == "dda");
        SummaryValue(P("base"), "dda", "predicted-ms").Should().BeApproximately(TrueMs(dda), TrueMs(dda) * 1e-9);
        File.Exists(P("base", "heatmap-dda-predicted-cost.png")).Should().BeTrue();

        // compare gates on it: the same trace priced 20% dearer breaks a 5% rule and keeps a 25% one.
        var dearer = JsonNode.Parse(File.ReadAllText(P("calib", "calibration.json")))!;
        foreach (var c in dearer["costs"]!.AsArray())
            c!["nanoseconds"] = c["nanoseconds"]!.GetValue<double>() * 1.2;
        File.WriteAllText(P("dearer.json"), dearer.ToJsonString());
        Run(Trace(P("candidate"), P("dearer.json"))).Should().Be(ExitCodes.Ok, _err.ToString());
        Run("compare", P("base"), P("candidate"), "--out", P("cmp"), "--fail-on", "dda.predicted-ms:5%").Should().Be(ExitCodes.RuleBroken);
        _out.ToString().Should().Contain("broken: dda.predicted-ms:5%").And.Contain("calibration differs");
        Run("compare", P("base"), P("candidate"), "--out", P("cmp"), "--fail-on", "dda.predicted-ms:25%").Should().Be(ExitCodes.Ok);

        // Another size: one warning line on stderr, and the same in report.json.
        _err.GetStringBuilder().Clear();
        Run(Trace(P("wide"), P("calib"), "64x24")).Should().Be(ExitCodes.Ok);
        _err.ToString().Should().Be("voxprof: warning: calibration for lab card A, driver 9.1 was fitted on 32x24 or 48x32 images, " +
            "this trace uses 64x24 images: predicted-ms may not hold\n");
        File.ReadAllText(P("wide", "report.json")).Should().Contain("this trace uses 64x24 images");
    }

    [Fact]
    public void Too_few_rows_for_the_costs_exit_2_with_one_line()
    {
        var reports = WriteReports();
        string times = WriteTimes(TrueMs, take: 4);

        Run(["calibrate", times, .. reports, "--device", "lab card", "--out", P("calib")]).Should().Be(ExitCodes.BadInput);

        _err.ToString().Should().Be($"voxprof: error: {times}: 4 rows for 4 costs (pixels, total-iterations, total-node-fetches, slab-tests); " +
            "calibrate needs at least 5, one more than the costs, from views whose counts differ (several cameras and strategies)\n");
        Directory.Exists(P("calib")).Should().BeFalse();
    }

    [Fact]
    public void Collinear_features_are_reported_and_the_calibration_still_written()
    {
        var reports = WriteReports();
        string times = WriteTimes(TrueMs);

        // Without the prepass, total-iterations is iterations itself: pricing both is an exact dependency. Keep only
        // the runs without the prepass, and their rows.
        var plain = reports.Where((_, i) => _views.Runs[i].Settings.PrepassBlock == 0).ToArray();
        File.WriteAllLines(times, File.ReadAllLines(times).Where(l => !l.Contains(",4,", StringComparison.Ordinal)));

        int code = Run(["calibrate", times, .. plain, "--device", "lab card", "--features", "total-iterations,iterations,node-fetches", "--out", P("calib")]);

        code.Should().Be(ExitCodes.Ok, _err.ToString());
        _err.ToString().Should().Contain("voxprof: warning: total-iterations, iterations are exactly collinear (one is a combination of the others)");
        File.ReadAllText(P("calib", "calibration.md")).Should().Contain("> **Warning:** total-iterations, iterations are exactly collinear");
        using var json = JsonDocument.Parse(File.ReadAllText(P("calib", "calibration.json")));
        json.RootElement.GetProperty("fit").GetProperty("conditionNumber").ValueKind.Should().Be(JsonValueKind.Null);
        json.RootElement.GetProperty("collinearity")[0].GetProperty("features").EnumerateArray().Select(f => f.GetString())
            .Should().Equal("total-iterations", "iterations");
    }

    [Fact]
    public void A_report_no_row_measures_is_named_in_a_warning()
    {
        var reports = WriteReports();
        string times = WriteTimes(TrueMs);
        File.WriteAllLines(times, File.ReadAllLines(times).Where(l => !l.Contains(",corner,", StringComparison.Ordinal)));

        Run(["calibrate", times, .. reports, "--device", "lab card", "--out", P("calib")]).Should().Be(ExitCodes.Ok, _err.ToString());

        _err.ToString().Split('\n', StringSplitOptions.RemoveEmptyEntries).Should().HaveCount(3)
            .And.OnlyContain(l => l.StartsWith("voxprof: warning: ", StringComparison.Ordinal) && l.Contains("/runs/corner-", StringComparison.Ordinal)
                && l.EndsWith(": no row of " + times + " measures this report's view; it was not used", StringComparison.Ordinal));
    }

    [Theory]
    [InlineData("--features", "total-iterations,dram-pages", "voxprof: error: --features: unknown measure 'dram-pages'; expected one of: iterations,")]
    [InlineData("--features", "prepass-skip", "voxprof: error: --features: unknown measure 'prepass-skip'")]
    [InlineData("--device", " ", "voxprof: error: --device: empty; expected the GPU and driver the times were measured on")]
    public void Bad_options_exit_2_with_one_line(string option, string value, string start)
    {
        var reports = WriteReports();
        string times = WriteTimes(TrueMs);
        string[] device = option == "--device" ? [] : ["--device", "lab card"];

        Run(["calibrate", times, .. reports, .. device, option, value, "--out", P("calib")]).Should().Be(ExitCodes.BadInput);

        _err.ToString().Should().StartWith(start);
        _err.ToString().TrimEnd('\n').Should().NotContain("\n");
    }

    [Fact]
    public void A_missing_device_is_a_usage_error_with_exit_2()
    {
        string times = WriteTimes(TrueMs);
        Run("calibrate", times, P("runs")).Should().Be(ExitCodes.BadInput);
        _err.ToString().Should().Contain("--device");
    }

    [Fact]
    public void A_bad_time_names_the_csv_line_and_a_bad_calibration_file_stops_a_trace()
    {
        var reports = WriteReports();
        string times = WriteTimes(TrueMs);
        var lines = File.ReadAllLines(times);
        lines[3] = lines[3].Replace(",\"median", "x,\"median", StringComparison.Ordinal);
        File.WriteAllLines(times, lines);

        Run(["calibrate", times, .. reports, "--device", "lab card", "--out", P("calib")]).Should().Be(ExitCodes.BadInput);
        _err.ToString().Should().StartWith($"voxprof: error: {times}: line 4: gpu-ms '").And.Contain("': expected a positive time in milliseconds");

        _err.GetStringBuilder().Clear();
        File.WriteAllText(P("broken.json"), "{\"schemaVersion\": 1, \"device\": ");
        string scene = Path.Combine(AppContext.BaseDirectory, "samples", "ring-post.vpscene.json");
        Run("trace", scene, "--size", "16x8", "--out", P("t"), "--quiet", "--calibration", P("broken.json")).Should().Be(ExitCodes.BadInput);
        _err.ToString().Should().StartWith($"voxprof: error: {P("broken.json")}: ").And.Contain("JSON");
        Directory.Exists(P("t")).Should().BeFalse();
    }
}
