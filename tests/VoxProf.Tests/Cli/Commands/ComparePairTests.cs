using System.Text.Json.Nodes;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>compare pairing different strategies (--pair, --within) and comparing runs of several views.</summary>
public sealed class ComparePairTests : IDisposable
{
    private const string Layers =
        "{'kind': 'box', 'material': 1, 'min': [0, 0, 0], 'max': [64, 6, 64]}," +
        "{'kind': 'sphere', 'material': 2, 'center': [30, 12, 34], 'radius': 9}";

    private const string Cameras =
        "{'name': 'yard', 'eye': [2, 20, 2], 'target': [40, 8, 40]}," +
        "{'name': 'walk', 'path': {'frames': 3, 'keys': [{'eye': [4, 12, 60], 'target': [30, 10, 30]}, {'eye': [60, 14, 40], 'target': [30, 10, 30]}]}}";

    private readonly CliScratch _scratch = new(Layers, Cameras);

    public void Dispose() => _scratch.Dispose();

    private string Out(string name) => _scratch.Out(name);

    private static (int Code, string Out, string Err) Run(params string[] args) => CliScratch.Run(args);

    private void Trace(string outDir, string camera = "yard") =>
        Run("trace", _scratch.Scene.Path, "--camera", camera, "--size", "24x14", "-q", "--no-html", "--strategy", "dda,dda-mask", "-o", outDir).Code.Should().Be(0);

    private static double Value(string reportFolder, string strategy, string metric) =>
        JsonNode.Parse(File.ReadAllText(Path.Combine(reportFolder, "report.json")))!["strategies"]!.AsArray()
            .First(s => s!["name"]!.GetValue<string>() == strategy)!["values"]![metric]!.GetValue<double>();

    private static JsonNode Change(string compareFolder, string strategy, string metric) =>
        JsonNode.Parse(File.ReadAllText(Path.Combine(compareFolder, "compare.json")))!["changes"]!.AsArray()
            .First(c => c!["strategy"]!.GetValue<string>() == strategy && c["metric"]!.GetValue<string>() == metric)!;

    [Fact]
    public void Within_compares_two_strategies_of_one_run_with_tables_and_difference_heatmaps()
    {
        Trace(Out("run"));

        var result = Run("compare", Out("run"), "--within", "dda,dda-mask", "--no-html", "-o", Out("cmp"));

        result.Code.Should().Be(0, result.Err);
        var change = Change(Out("cmp"), "dda=dda-mask", "iterations.mean");
        change["base"]!.GetValue<double>().Should().Be(Value(Out("run"), "dda", "iterations.mean"));
        change["candidate"]!.GetValue<double>().Should().Be(Value(Out("run"), "dda-mask", "iterations.mean"));
        File.Exists(Path.Combine(Out("cmp"), "diff-dda=dda-mask-iterations.png")).Should().BeTrue();
        File.ReadAllText(Path.Combine(Out("cmp"), "compare.md")).Should().Contain("strategies paired: base dda against candidate dda-mask");
    }

    [Fact]
    public void Pair_gates_a_strategy_of_the_candidate_against_another_of_the_base()
    {
        Trace(Out("a"));
        Trace(Out("b"));

        // Mask culling can never save all the work: demanding a 100% saving breaks the rule.
        var result = Run("compare", Out("a"), Out("b"), "--pair", "dda=dda-mask", "--fail-on", "dda=dda-mask.iterations.mean:-100%", "--no-html", "-o", Out("cmp"));

        result.Code.Should().Be(1);
        result.Out.Should().Contain("dda=dda-mask iterations.mean");
        Change(Out("cmp"), "dda=dda-mask", "iterations.mean")["candidate"]!.GetValue<double>()
            .Should().Be(Value(Out("b"), "dda-mask", "iterations.mean"));
    }

    [Theory]
    [InlineData("--pair", "dda=zigzag", "no strategy 'zigzag' in the candidate report for the pair dda=zigzag; it holds dda, dda-mask")]
    [InlineData("--pair", "dda", "--pair: 'dda' is not valid, expected BASE=CANDIDATE strategy names (e.g. dda=dda-mask)")]
    public void A_bad_pair_is_refused_in_one_line(string option, string value, string expected)
    {
        Trace(Out("a"));

        var result = Run("compare", Out("a"), Out("a"), option, value, "-o", Out("cmp"));

        result.Code.Should().Be(2);
        result.Err.Should().Contain(expected).And.EndWith("\n").And.NotContain("\n   at ");
    }

    [Fact]
    public void Two_runs_of_several_views_compare_by_each_metrics_mean_over_the_views()
    {
        Trace(Out("a"), "all");
        Trace(Out("b"), "all");
        Trace(Out("single"));

        var result = Run("compare", Out("a"), Out("b"), "--no-html", "-o", Out("cmp"));

        result.Code.Should().Be(0, result.Err);
        double mean = JsonNode.Parse(File.ReadAllText(Path.Combine(Out("a"), "report.json")))!["strategies"]!.AsArray()
            .First(s => s!["name"]!.GetValue<string>() == "dda")!["distribution"]!["iterations.mean"]!["mean"]!.GetValue<double>();
        Change(Out("cmp"), "dda", "iterations.mean")["base"]!.GetValue<double>().Should().Be(mean);
        File.ReadAllText(Path.Combine(Out("cmp"), "compare.md")).Should().Contain("mean over 4 views");
        Run("compare", Out("a"), Out("b"), "--within", "dda,dda-mask", "-o", Out("cmp2")).Code.Should().Be(2, "--within takes one report");
        Run("compare", Out("a"), "--within", "dda,dda-mask", "--no-html", "-o", Out("cmp2")).Code.Should().Be(0);
        Run("compare", Out("a"), Out("single"), "-o", Out("cmp3")).Err.Should().Contain("cannot compare a run of 4 views");
    }
}
