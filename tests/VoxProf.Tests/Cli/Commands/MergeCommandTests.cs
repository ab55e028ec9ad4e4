using System.Text.Json.Nodes;
using VoxProf.Tests.Scenes;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>A run of several views traced whole, traced in shards and merged: the same folder but for timings.</summary>
public sealed class MergeCommandTests : IDisposable
{
    internal const string Layers =
        "{'kind': 'box', 'material': 1, 'min': [0, 0, 0], 'max': [64, 6, 64]}," +
        "{'kind': 'sphere', 'material': 2, 'center': [30, 12, 34], 'radius': 9}," +
        "{'kind': 'box', 'material': 3, 'min': [44, 6, 10], 'max': [52, 20, 18]}";

    private const string Cameras =
        "{'name': 'yard', 'eye': [2, 20, 2], 'target': [40, 8, 40]}," +
        "{'name': 'walk', 'path': {'frames': 6, 'interpolation': 'catmull-rom', 'keys': [" +
        "{'eye': [4, 12, 60], 'target': [30, 10, 30]}, {'eye': [30, 16, 62], 'target': [30, 8, 30]}, {'eye': [60, 14, 40], 'target': [30, 10, 30]}]}}," +
        "{'name': 'top', 'eye': [32, 60, 33], 'target': [32, 0, 32], 'up': [0, 0, 1]}";

    private readonly CliScratch _scratch = new(Layers, Cameras);

    public void Dispose() => _scratch.Dispose();

    private string Out(string name) => _scratch.Out(name);

    private static (int Code, string Out, string Err) Run(params string[] args) => CliScratch.Run(args);

    private (int Code, string Out, string Err) Trace(string outDir, params string[] more) =>
        Run(["trace", _scratch.Scene.Path, "--camera", "all", "--size", "24x14", "--quiet", "--out", outDir, .. more]);

    // For the refusals: no page, no pixel files, one strategy.
    private (int Code, string Out, string Err) Quick(string outDir, params string[] more) =>
        Trace(outDir, ["--no-html", "--no-pixels", "--strategy", "dda", .. more]);

    [Fact]
    public void Merged_shards_equal_the_run_traced_whole_but_for_timings()
    {
        // The whole run on two threads, the shards on one: the counts may not depend on either.
        Trace(Out("whole"), "--threads", "2").Code.Should().Be(0);
        for (int i = 1; i <= 3; i++)
            Trace(Out($"s{i}"), "--shard", $"{i}/3", "--threads", "1").Code.Should().Be(0);

        var merged = Run("merge", Out("s3"), Out("s1"), Out("s2"), "--out", Out("merged"));

        merged.Code.Should().Be(0, merged.Err);
        merged.Out.Should().Contain("merged 3 shards").And.Contain("(8 views)");
        RunFolders.ShouldMatchButForTimings(Out("merged"), Out("whole"));
        RunFolders.Files(Out("whole")).Should().Contain(["views/walk_005/report.json", "views/top/heatmap-dda-iterations.png", "worst-views.png", "views.csv", "report.html"]);
    }

    [Fact]
    public void A_shard_holds_every_nth_view_and_says_so()
    {
        Trace(Out("s2"), "--shard", "2/3").Code.Should().Be(0);

        var run = JsonNode.Parse(File.ReadAllText(Path.Combine(Out("s2"), "report.json")))!;
        run["kind"]!.GetValue<string>().Should().Be("run");
        run["shard"]!["views"]!.AsArray().Select(v => v!.GetValue<string>()).Should().Equal("walk#000", "walk#003", "top");
        run["views"]!.AsArray().Should().HaveCount(8);
        run["commandLine"]!.AsArray().Select(v => v!.GetValue<string>()).Should().NotContain(["--shard", "2/3", "--out", "--quiet"]);
        Directory.GetDirectories(Path.Combine(Out("s2"), "views")).Select(Path.GetFileName).Should().BeEquivalentTo("walk_000", "walk_003", "top");

        // More shards than views: the last holds none, and says so.
        Quick(Out("s9"), "--shard", "9/9").Out.Should().Contain("shard 9 of 9: 0 of 8 views");
        JsonNode.Parse(File.ReadAllText(Path.Combine(Out("s9"), "report.json")))!["shard"]!["views"]!.AsArray().Should().BeEmpty();
    }

    [Fact]
    public void Shards_of_different_options_are_refused()
    {
        Quick(Out("s1"), "--shard", "1/2").Code.Should().Be(0);
        Quick(Out("s2"), "--shard", "2/2", "--branching", "2").Code.Should().Be(0);

        var merged = Run("merge", Out("s1"), Out("s2"), "--out", Out("merged"));

        merged.Code.Should().Be(2);
        merged.Err.Should().StartWith($"voxprof: error: {Out("s2")}: the trace options differs from {Out("s1")}'s").And.EndWith("expected shards of one run\n");
        Directory.Exists(Out("merged")).Should().BeFalse();
    }

    [Fact]
    public void A_missing_or_repeated_shard_is_refused()
    {
        Quick(Out("s1"), "--shard", "1/3").Code.Should().Be(0);
        Quick(Out("s3"), "--shard", "3/3").Code.Should().Be(0);

        Run("merge", Out("s1"), Out("s3"), "--out", Out("m")).Err.Should().Be("voxprof: error: merge: shard 2 of 3 missing; expected all 3 shard folders\n");
        Run("merge", Out("s1"), Out("s3"), Out("s1"), "--out", Out("m")).Err.Should().Contain("shard 1 of 3 is given twice");
    }

    [Fact]
    public void A_shard_of_another_scene_or_a_single_view_report_is_refused()
    {
        Quick(Out("s1"), "--shard", "1/2").Code.Should().Be(0);
        using var other = TempScene.With(Layers.Replace("radius': 9", "radius': 8", StringComparison.Ordinal), Cameras);
        Run("trace", other.Path, "--camera", "all", "--size", "24x14", "-q", "--no-html", "--no-pixels", "--strategy", "dda", "--shard", "2/2", "-o", Out("s2")).Code.Should().Be(0);
        Run("trace", _scratch.Scene.Path, "--camera", "yard", "--size", "24x14", "-q", "--no-html", "-o", Out("single")).Code.Should().Be(0);

        Run("merge", Out("s1"), Out("s2"), "-o", Out("m")).Err.Should().Contain("the scene differs");
        Run("merge", Out("s1"), Out("single"), "-o", Out("m")).Err.Should().Contain("the report of a single view");
    }

    [Fact]
    public void The_run_level_gives_each_metrics_distribution_over_the_views()
    {
        Trace(Out("whole")).Code.Should().Be(0);
        var run = JsonNode.Parse(File.ReadAllText(Path.Combine(Out("whole"), "report.json")))!;
        string metric = "iterations.mean";
        var perView = Directory.GetDirectories(Path.Combine(Out("whole"), "views"))
            .Select(d => JsonNode.Parse(File.ReadAllText(Path.Combine(d, "report.json")))!)
            .Select(r => r["strategies"]!.AsArray().First(s => s!["name"]!.GetValue<string>() == "dda")!["values"]![metric]!.GetValue<double>())
            .ToArray();
        var distribution = run["strategies"]!.AsArray().First(s => s!["name"]!.GetValue<string>() == "dda")!["distribution"]![metric]!;

        // Oracle: MathNet.Numerics' quantile definition R7, the same as Hyndman & Fan's definition 7.
        distribution["views"]!.GetValue<int>().Should().Be(8);
        distribution["mean"]!.GetValue<double>().Should().BeApproximately(perView.Average(), 1e-9);
        distribution["p50"]!.GetValue<double>().Should().BeApproximately(MathNet.Numerics.Statistics.Statistics.QuantileCustom(perView, 0.5, MathNet.Numerics.Statistics.QuantileDefinition.R7), 1e-9);
        distribution["p90"]!.GetValue<double>().Should().BeApproximately(MathNet.Numerics.Statistics.Statistics.QuantileCustom(perView, 0.9, MathNet.Numerics.Statistics.QuantileDefinition.R7), 1e-9);
        distribution["max"]!.GetValue<double>().Should().Be(perView.Max());
        var worst = run["worst"]!.AsArray().First(w => w!["metric"]!.GetValue<string>() == metric && w["strategy"]!.GetValue<string>() == "dda")!;
        worst["views"]![0]!["value"]!.GetValue<double>().Should().Be(perView.Max());
        File.ReadAllText(Path.Combine(Out("whole"), "summary.md")).Should().Contain("# VoxProf run: test, 8 views").And.Contain("![worst views](worst-views.png)");
    }
}
