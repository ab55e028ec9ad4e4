using VoxProf.Core;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Model;

namespace VoxProf.Tests.Compare;

public class GateRuleTests
{
    private static ReportComparison Compare(ReportDocument a, ReportDocument b) =>
        ReportComparison.Create(new("base/report.json", a), new("candidate/report.json", b));

    [Theory]
    [InlineData("dda-mask.iterations.mean:5%", "dda-mask", "iterations", "mean", 5, LimitKind.Relative)]
    [InlineData("all.wave32.tile-max:+10", "all", "wave32", "tile-max", 10, LimitKind.Absolute)]
    [InlineData("*.node-fetches.p99:2.5%", "all", "node-fetches", "p99", 2.5, LimitKind.Relative)]
    [InlineData("HDDA.Iterations.MAX:0", "hdda", "iterations", "max", 0, LimitKind.Absolute)]
    [InlineData("dda.wave64.efficiency:-3%", "dda", "wave64", "efficiency", -3, LimitKind.Relative)]
    public void Valid_rules_parse_into_their_parts(string text, string strategy, string group, string stat, double limit, LimitKind kind)
    {
        var rule = GateRule.Parse(text);

        rule.Should().BeEquivalentTo(new { Strategy = strategy, Group = group, Statistic = stat, Limit = limit, Kind = kind });
    }

    [Theory]
    [InlineData("dda.iterations.mean")]
    [InlineData("dda.iterations:5%")]
    [InlineData("dda.iterations.mean:five%")]
    [InlineData("dda.iterations.mean<=5%")]
    [InlineData("dda.iterations.mean:5%%")]
    [InlineData("dda.iterations.mean:1,5%")]
    [InlineData("a.b.c.d:5%")]
    public void Malformed_rules_are_refused_with_the_expected_shape(string text)
    {
        var act = () => GateRule.Parse(text);

        act.Should().Throw<InputException>().Which.Message.Should()
            .StartWith($"rule '{text}'").And.Contain("STRATEGY.COUNTER.STATISTIC:LIMIT");
    }

    [Fact]
    public void A_rule_naming_an_unknown_strategy_lists_the_strategies_in_both_reports()
    {
        var doc = ReportFixtures.Standard();
        var act = () => GateRules.Evaluate(Compare(doc, doc), GateRules.Parse(["dda-masked.iterations.mean:5%"]));

        act.Should().Throw<InputException>().Which.Message.Should()
            .Contain("unknown strategy 'dda-masked'").And.Contain("grid, dda, dda-mask");
    }

    [Fact]
    public void A_rule_naming_an_unknown_counter_lists_the_counters_and_wave_groups()
    {
        var doc = ReportFixtures.Standard();
        var act = () => GateRules.Evaluate(Compare(doc, doc), GateRules.Parse(["all.iteration.mean:5%"]));

        act.Should().Throw<InputException>().Which.Message.Should()
            .Contain("unknown counter or wave group 'iteration'").And.Contain("iterations, node-fetches, wave32, wave64");
    }

    [Fact]
    public void A_rule_naming_an_unknown_statistic_lists_the_valid_ones_for_that_group()
    {
        var doc = ReportFixtures.Standard();
        var counter = () => GateRules.Evaluate(Compare(doc, doc), GateRules.Parse(["dda.iterations.p95:5%"]));
        var wave = () => GateRules.Evaluate(Compare(doc, doc), GateRules.Parse(["dda.wave32.mean:5%"]));

        counter.Should().Throw<InputException>().Which.Message.Should()
            .Contain("unknown statistic 'p95' of 'iterations'").And.Contain("total, mean, p50, p90, p99, max");
        wave.Should().Throw<InputException>().Which.Message.Should()
            .Contain("unknown statistic 'mean' of 'wave32'").And.Contain("tile-max, efficiency");
    }

    [Fact]
    public void A_tight_rule_breaks_and_a_loose_one_holds_on_a_ten_percent_rise()
    {
        var cmp = Compare(ReportFixtures.Standard(), ReportFixtures.Standard(1.1));

        var verdict = GateRules.Evaluate(cmp, GateRules.Parse(["dda.iterations.mean:5%", "dda.iterations.mean:15%", "dda.iterations.mean:+1.5"]));

        verdict.Passed.Should().BeFalse();
        verdict.Outcomes.Select(o => o.Holds).Should().Equal(false, true, true);
        var broken = verdict.BrokenRules.Single().Broken.Single().Change;
        broken.Base.Should().Be(12);
        broken.Candidate.Should().BeApproximately(13.2, 1e-9);
    }

    [Fact]
    public void A_change_of_exactly_the_limit_holds()
    {
        // 1.1 * 20 is not exactly 22 in binary floating point; the rule must still read as "at most 10%".
        var cmp = Compare(ReportFixtures.Standard(), ReportFixtures.Standard(1.1));

        GateRules.Evaluate(cmp, GateRules.Parse(["all.iterations.mean:10%", "dda.wave32.tile-max:10%"])).Passed.Should().BeTrue();
        GateRules.Evaluate(cmp, GateRules.Parse(["all.iterations.mean:9.99%"])).Passed.Should().BeFalse();
    }

    [Fact]
    public void A_limit_on_efficiency_bounds_its_fall()
    {
        var a = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10, efficiency32: 0.5));
        var b = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10, efficiency32: 0.45));

        GateRules.Evaluate(Compare(a, b), GateRules.Parse(["dda.wave32.efficiency:5%"])).Passed.Should().BeFalse();
        GateRules.Evaluate(Compare(a, b), GateRules.Parse(["dda.wave32.efficiency:10%"])).Passed.Should().BeTrue();
        GateRules.Evaluate(Compare(b, a), GateRules.Parse(["dda.wave32.efficiency:0%"])).Passed.Should().BeTrue("a rise in efficiency is a gain");
    }

    [Fact]
    public void More_distance_skipped_by_the_prepass_is_a_gain_and_less_a_regression()
    {
        StrategyReport With(double skip) => ReportFixtures.Strategy("dda", 10) with
        {
            Counters = [ReportFixtures.Counter("iterations", 10), ReportFixtures.Counter("prepass-skip", skip)],
        };
        var less = ReportFixtures.Report(With(100));
        var more = ReportFixtures.Report(With(150));

        GateRules.Evaluate(Compare(less, more), GateRules.Parse(["dda.prepass-skip.mean:0%"])).Passed.Should().BeTrue("skipping more is better");
        GateRules.Evaluate(Compare(more, less), GateRules.Parse(["dda.prepass-skip.mean:10%"])).Passed.Should().BeFalse("a third less skipped is a regression");
    }

    [Fact]
    public void A_negative_limit_demands_a_gain()
    {
        var cmp = Compare(ReportFixtures.Standard(), ReportFixtures.Standard(0.9));

        GateRules.Evaluate(cmp, GateRules.Parse(["dda.iterations.mean:-5%"])).Passed.Should().BeTrue();
        GateRules.Evaluate(cmp, GateRules.Parse(["dda.iterations.mean:-15%"])).Passed.Should().BeFalse();
    }

    [Fact]
    public void A_wildcard_rule_checks_every_strategy()
    {
        var cmp = Compare(ReportFixtures.Standard(), ReportFixtures.Standard(1.02));

        var verdict = GateRules.Evaluate(cmp, GateRules.Parse(["all.iterations.all:5%"]));

        verdict.Outcomes.Single().Checks.Should().HaveCount(3 * 6);
        verdict.Passed.Should().BeTrue();
    }

    [Fact]
    public void Without_rules_the_default_set_is_used()
    {
        var cmp = Compare(ReportFixtures.Standard(), ReportFixtures.Standard(1.06));

        var verdict = GateRules.Evaluate(cmp, []);

        verdict.UsedDefaultRules.Should().BeTrue();
        verdict.Outcomes.Select(o => o.Rule.Text).Should().Equal(GateRules.Default);
        verdict.Passed.Should().BeFalse("a 6% rise in mean iterations breaks the default 5% limit");
        GateRules.Evaluate(Compare(ReportFixtures.Standard(), ReportFixtures.Standard(1.04)), []).Passed.Should().BeTrue();
    }

    [Fact]
    public void Any_rise_from_zero_breaks_a_relative_limit_but_can_hold_an_absolute_one()
    {
        var zero = new CounterStats("ascents", 0, 0, 0, 0, 0, 0);
        var some = new CounterStats("ascents", 3, 0.003, 0, 0, 0, 1);
        var a = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10) with { Counters = [zero] });
        var b = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10) with { Counters = [some] });

        GateRules.Evaluate(Compare(a, b), GateRules.Parse(["dda.ascents.total:1000%"])).Passed.Should().BeFalse();
        GateRules.Evaluate(Compare(a, b), GateRules.Parse(["dda.ascents.total:3"])).Passed.Should().BeTrue();
    }
}
