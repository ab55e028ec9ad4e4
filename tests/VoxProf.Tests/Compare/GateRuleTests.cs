using VoxProf.Core;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Model;

namespace VoxProf.Tests.Compare;

public class GateRuleTests
{
    private static ReportComparison Compare(ReportDocument a, ReportDocument b) =>
        ReportComparison.Create(new("base/report.json", a), new("candidate/report.json", b));

    [Theory]
    [InlineData("dda-mask.iterations.mean:5%", "dda-mask", "iterations.mean", 5, LimitKind.Relative)]
    [InlineData("all.subgroup32.tile-max-mean:+10", "all", "subgroup32.tile-max-mean", 10, LimitKind.Absolute)]
    [InlineData("*.node-fetches.p99:2.5%", "all", "node-fetches.p99", 2.5, LimitKind.Relative)]
    [InlineData("HDDA.Iterations.MAX:0", "hdda", "iterations.max", 0, LimitKind.Absolute)]
    [InlineData("dda.subgroup64.simd-efficiency:-3%", "dda", "subgroup64.simd-efficiency", -3, LimitKind.Relative)]
    [InlineData("all.hit-rate:0.01", "all", "hit-rate", 0.01, LimitKind.Absolute)]
    [InlineData("dda.*:10%", "dda", "all", 10, LimitKind.Relative)]
    [InlineData("all.all.p90:10%", "all", "all.p90", 10, LimitKind.Relative)]
    public void Valid_rules_parse_into_their_parts(string text, string strategy, string metric, double limit, LimitKind kind)
    {
        var rule = GateRule.Parse(text);

        rule.Should().BeEquivalentTo(new { Strategy = strategy, Metric = metric, Limit = limit, Kind = kind });
    }

    [Theory]
    [InlineData("all", "iterations.mean", true)]
    [InlineData("all", "hit-rate", true)]
    [InlineData("iterations.all", "iterations.p90", true)]
    [InlineData("iterations.all", "total-iterations.p90", false)]
    [InlineData("all.mean", "subgroup32.tile-max-mean", false)]
    [InlineData("all.mean", "node-fetches.mean", true)]
    [InlineData("all.all", "mismatch", false)]
    [InlineData("mismatch", "mismatch", true)]
    [InlineData("iterations", "iterations.mean", false)]
    public void A_metric_pattern_matches_word_by_word(string pattern, string metric, bool matches)
    {
        GateRule.Parse($"dda.{pattern}:5%").MatchesMetric(metric).Should().Be(matches);
    }

    [Theory]
    [InlineData("dda.iterations.mean")]
    [InlineData("dda:5%")]
    [InlineData("dda.iterations.mean:five%")]
    [InlineData("dda.iterations.mean<=5%")]
    [InlineData("dda.iterations.mean:5%%")]
    [InlineData("dda.iterations.mean:1,5%")]
    [InlineData("a.b.c.d:5%")]
    public void Malformed_rules_are_refused_with_the_expected_shape(string text)
    {
        var act = () => GateRule.Parse(text);

        act.Should().Throw<InputException>().Which.Message.Should()
            .StartWith($"rule '{text}'").And.Contain("STRATEGY.METRIC:LIMIT");
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
    public void A_rule_naming_an_unknown_group_lists_the_one_word_metrics_and_the_groups()
    {
        var doc = ReportFixtures.Standard();
        var act = () => GateRules.Evaluate(Compare(doc, doc), GateRules.Parse(["all.iteration.mean:5%"]));

        act.Should().Throw<InputException>().Which.Message.Should()
            .Contain("unknown metric group 'iteration'").And.Contain("hit-rate, mismatch")
            .And.Contain("iterations, node-fetches, subgroup32, subgroup64");
    }

    [Fact]
    public void A_rule_naming_an_unknown_one_word_metric_lists_the_valid_names()
    {
        var doc = ReportFixtures.Standard();
        var act = () => GateRules.Evaluate(Compare(doc, doc), GateRules.Parse(["dda.hitrate:1%"]));

        act.Should().Throw<InputException>().Which.Message.Should().Contain("unknown metric 'hitrate'").And.Contain("hit-rate, mismatch");
    }

    [Fact]
    public void A_rule_naming_an_unknown_statistic_lists_the_valid_ones_for_that_group()
    {
        var doc = ReportFixtures.Standard();
        var counter = () => GateRules.Evaluate(Compare(doc, doc), GateRules.Parse(["dda.iterations.p95:5%"]));
        var subgroup = () => GateRules.Evaluate(Compare(doc, doc), GateRules.Parse(["dda.subgroup32.mean:5%"]));

        counter.Should().Throw<InputException>().Which.Message.Should()
            .Contain("unknown statistic 'p95' of 'iterations'").And.Contain("total, mean, p50, p90, p99, max");
        subgroup.Should().Throw<InputException>().Which.Message.Should()
            .Contain("unknown statistic 'mean' of 'subgroup32'").And.Contain("tile-max-mean, tile-max-max, simd-efficiency");
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

        GateRules.Evaluate(cmp, GateRules.Parse(["all.iterations.mean:10%", "dda.subgroup32.tile-max-mean:10%"])).Passed.Should().BeTrue();
        GateRules.Evaluate(cmp, GateRules.Parse(["all.iterations.mean:9.99%"])).Passed.Should().BeFalse();
    }

    [Fact]
    public void A_limit_on_efficiency_bounds_its_fall()
    {
        var a = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10, efficiency32: 0.5));
        var b = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10, efficiency32: 0.45));

        GateRules.Evaluate(Compare(a, b), GateRules.Parse(["dda.subgroup32.simd-efficiency:5%"])).Passed.Should().BeFalse();
        GateRules.Evaluate(Compare(a, b), GateRules.Parse(["dda.subgroup32.simd-efficiency:10%"])).Passed.Should().BeTrue();
        GateRules.Evaluate(Compare(b, a), GateRules.Parse(["dda.subgroup32.simd-efficiency:0%"])).Passed.Should().BeTrue("a rise in efficiency is a gain");
    }

    [Fact]
    public void More_distance_skipped_by_the_prepass_is_a_gain_and_less_a_regression()
    {
        StrategyReport With(double skip) => ReportFixtures.Make("dda", ReportFixtures.Counter("iterations", 10), ReportFixtures.Counter("prepass-skip", skip));
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
    public void A_neutral_metric_is_bounded_either_way_and_never_a_regression()
    {
        var a = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10).With(ReportFixtures.Facts(hitRate: 0.5)));
        var rose = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10).With(ReportFixtures.Facts(hitRate: 0.55)));
        var fell = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10).With(ReportFixtures.Facts(hitRate: 0.45)));

        foreach (var b in new[] { rose, fell })
        {
            var cmp = Compare(a, b);
            cmp.Changes.Single(c => c.Metric.Name == "hit-rate").IsRegression.Should().BeFalse();
            GateRules.Evaluate(cmp, GateRules.Parse(["dda.hit-rate:5%"])).Passed.Should().BeFalse("a 10% change either way breaks a 5% limit");
            GateRules.Evaluate(cmp, GateRules.Parse(["dda.hit-rate:0.05"])).Passed.Should().BeTrue();
        }
    }

    [Fact]
    public void A_rule_on_a_mismatch_that_was_not_checked_is_refused_not_passed()
    {
        var checkedRun = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10));
        var notChecked = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10).With(ReportFixtures.Facts(mismatch: null)));
        var cmp = Compare(checkedRun, notChecked);

        cmp.Changes.Should().NotContain(c => c.Metric.Name == "mismatch");
        cmp.Notes.Should().Contain("mismatch not compared for dda: not checked in candidate");
        var act = () => GateRules.Evaluate(cmp, GateRules.Parse(["dda.mismatch:0"]));
        act.Should().Throw<InputException>().Which.Message.Should()
            .Be("rule 'dda.mismatch:0': dda.mismatch is not compared (not checked in candidate), so the rule cannot be checked");
    }

    [Fact]
    public void A_new_mismatch_breaks_an_absolute_limit_of_zero()
    {
        var clean = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10));
        var wrong = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10).With(ReportFixtures.Facts(mismatch: 3)));

        GateRules.Evaluate(Compare(clean, wrong), GateRules.Parse(["all.mismatch:0"])).Passed.Should().BeFalse();
        GateRules.Evaluate(Compare(wrong, clean), GateRules.Parse(["all.mismatch:0"])).Passed.Should().BeTrue();
    }

    [Fact]
    public void Without_rules_the_default_set_is_used()
    {
        // Without the prepass, total iterations equal the pixel's own.
        static ReportDocument WithTotals(double scale) => ReportFixtures.Report(ReportFixtures.Standard(scale).Strategies
            .Select(s => s.With(ReportFixtures.Counter("total-iterations", s.Value("iterations.mean")!.Value))).ToArray());
        var cmp = Compare(WithTotals(1), WithTotals(1.06));

        var verdict = GateRules.Evaluate(cmp, []);

        verdict.UsedDefaultRules.Should().BeTrue();
        verdict.Outcomes.Select(o => o.Rule.Text).Should().Equal(GateRules.Default);
        verdict.Outcomes.Select(o => o.Holds).Should().Equal([false, false, true],
            "a 6% rise in mean total iterations and tile maxima breaks both 5% limits; no pixel hits differently");
        GateRules.Evaluate(Compare(WithTotals(1), WithTotals(1.04)), []).Passed.Should().BeTrue();
    }

    [Fact]
    public void Without_rules_a_new_mismatched_pixel_fails_the_gate_and_a_run_without_grid_skips_that_rule()
    {
        var clean = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10));
        var wrong = ReportFixtures.Report(ReportFixtures.Strategy("dda", 9).With(ReportFixtures.Facts(mismatch: 1)));
        var notChecked = ReportFixtures.Report(ReportFixtures.Strategy("dda", 9).With(ReportFixtures.Facts(mismatch: null)));

        var verdict = GateRules.Evaluate(Compare(clean, wrong), []);
        verdict.Passed.Should().BeFalse("less work bought with one wrong pixel is not an improvement");
        verdict.BrokenRules.Select(o => o.Rule.Text).Should().Equal("all.mismatch:0");
        GateRules.Evaluate(Compare(wrong, clean), []).Passed.Should().BeTrue("a mismatch fixed is no worse");
        GateRules.Evaluate(Compare(clean, notChecked), []).Outcomes.Select(o => o.Rule.Text).Should().NotContain("all.mismatch:0");
    }

    [Fact]
    public void A_default_rule_on_a_metric_neither_report_holds_is_skipped()
    {
        var verdict = GateRules.Evaluate(Compare(ReportFixtures.Standard(), ReportFixtures.Standard(1.06)), []);

        verdict.Outcomes.Select(o => o.Rule.Text).Should().Equal("all.subgroup32.tile-max-mean:5%", "all.mismatch:0");
        verdict.Passed.Should().BeFalse();
    }

    [Fact]
    public void Any_rise_from_zero_breaks_a_relative_limit_but_can_hold_an_absolute_one()
    {
        var a = ReportFixtures.Report(ReportFixtures.Make("dda", ReportFixtures.Counter("ascents", 0, max: 0)));
        var b = ReportFixtures.Report(ReportFixtures.Make("dda", ReportFixtures.Counter("ascents", 0.003, max: 1)));

        GateRules.Evaluate(Compare(a, b), GateRules.Parse(["dda.ascents.total:1000%"])).Passed.Should().BeFalse();
        GateRules.Evaluate(Compare(a, b), GateRules.Parse(["dda.ascents.total:3"])).Passed.Should().BeTrue();
    }
}
