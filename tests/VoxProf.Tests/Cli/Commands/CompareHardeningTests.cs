using System.Text.Json;
using VoxProf.Cli;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;
using VoxProf.Tests.Compare;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>compare never passes on nothing, names what one side lacks, and never leaves its folder half replaced.</summary>
public sealed class CompareHardeningTests : IDisposable
{
    private readonly TempDir _tmp = new();
    private readonly StringWriter _out = new();
    private readonly StringWriter _err = new();

    public void Dispose() => _tmp.Dispose();

    private string OutDir => Path.Combine(_tmp.Path, "cmp");

    private int Run(params string[] args) => VoxProf.Cli.Cli.Run(["compare", .. args, "--out", OutDir], _out, _err);

    private string Error => _err.ToString().TrimEnd('\n');

    private string Write(string name, params StrategyReport[] strategies) => ReportFixtures.Write(_tmp, name, ReportFixtures.Report(strategies));

    [Fact]
    public void Reports_with_no_strategy_in_common_exit_2_naming_what_each_side_holds()
    {
        string a = Write("base", ReportFixtures.Strategy("dda", 10), ReportFixtures.Strategy("hdda", 9));
        string b = Write("cand", ReportFixtures.Strategy("grid", 40));

        Run(a, b).Should().Be(ExitCodes.BadInput);

        Error.Should().Be($"voxprof: error: nothing to compare: no strategy is in both reports (base {a}/report.json holds dda, hdda; candidate {b}/report.json holds grid); trace both with a strategy in common");
        _out.ToString().Should().NotContain("verdict: pass");
    }

    [Fact]
    public void A_candidate_with_no_strategies_is_not_a_pass()
    {
        string a = Write("base", ReportFixtures.Strategy("dda", 10));
        string b = Write("cand");

        Run(a, b).Should().Be(ExitCodes.BadInput);

        Error.Should().Contain("nothing to compare").And.Contain("holds dda;").And.Contain("holds none)");
    }

    [Fact]
    public void A_rule_naming_a_strategy_of_one_report_only_says_so()
    {
        string a = Write("base", ReportFixtures.Strategy("dda", 10), ReportFixtures.Strategy("hdda", 9));
        string b = Write("cand", ReportFixtures.Strategy("dda", 10));

        Run(a, b, "--fail-on", "hdda.iterations.mean:5%").Should().Be(ExitCodes.BadInput);

        Error.Should().Be("voxprof: error: rule 'hdda.iterations.mean:5%': strategy 'hdda' is in the base report only (the candidate holds dda), so the rule cannot be checked");
    }

    [Fact]
    public void A_rule_naming_a_metric_of_one_report_only_says_so()
    {
        string a = Write("base", ReportFixtures.Strategy("dda", 10));
        string b = Write("cand", ReportFixtures.Strategy("dda", 10).With(ReportFixtures.Counter("ascents", 2)));

        Run(a, b, "--fail-on", "dda.ascents.mean:5%").Should().Be(ExitCodes.BadInput);

        Error.Should().Be("voxprof: error: rule 'dda.ascents.mean:5%': metric ascents.mean is in the candidate report only, so the rule cannot be checked");
    }

    [Fact]
    public void A_rule_limit_of_400_nines_exits_2_and_the_previous_compare_folder_stays_whole()
    {
        string a = Write("base", ReportFixtures.Strategy("dda", 10));
        string b = Write("cand", ReportFixtures.Strategy("dda", 12));
        Run(a, b, "--fail-on", "dda.iterations.mean:50%").Should().Be(ExitCodes.Ok);
        string before = File.ReadAllText(Path.Combine(OutDir, "compare.json"));

        Run(a, b, "--fail-on", "dda.iterations.mean:" + new string('9', 400)).Should().Be(ExitCodes.BadInput);

        Error.Split('\n').Last().Should().StartWith("voxprof: error: rule 'dda.iterations.mean:99999").And.EndWith("is too large; expected at most 1e15");
        File.ReadAllText(Path.Combine(OutDir, "compare.json")).Should().Be(before);
    }

    [Fact]
    public void A_relative_change_from_a_base_near_zero_is_no_ratio_rather_than_infinity_and_compare_json_is_written()
    {
        var change = new MetricChange("dda", MetricCatalogue.Standard.First(m => m.Name == "iterations.mean"), 5e-324, 1e18);

        change.RelativeChange.Should().BeNull();
        change.RelativeWorsening.Should().Be(double.PositiveInfinity, "a cost appearing from (nearly) nothing breaks any relative limit");

        string a = Write("base", ReportFixtures.Strategy("dda", 10).With(new Dictionary<string, double?> { ["ascents.mean"] = 5e-324, ["ascents.max"] = 1 }));
        string b = Write("cand", ReportFixtures.Strategy("dda", 10).With(new Dictionary<string, double?> { ["ascents.mean"] = 1, ["ascents.max"] = 1 }));
        Run(a, b, "--fail-on", "dda.iterations.mean:5%").Should().Be(ExitCodes.Ok);
        using var json = JsonDocument.Parse(File.ReadAllBytes(Path.Combine(OutDir, "compare.json")));
        json.RootElement.GetProperty("changes").EnumerateArray()
            .Single(c => c.GetProperty("metric").GetString() == "ascents.mean").GetProperty("relativeChange").ValueKind.Should().Be(JsonValueKind.Null);
    }

    [Fact]
    public void An_empty_out_path_exits_2_with_one_line()
    {
        string a = Write("base", ReportFixtures.Strategy("dda", 10));

        VoxProf.Cli.Cli.Run(["compare", a, a, "--out", ""], _out, _err).Should().Be(ExitCodes.BadInput);

        Error.Should().Be("voxprof: error: --out: empty; expected an output folder path");
    }
}
