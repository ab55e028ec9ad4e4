using VoxProf.Core;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;

namespace VoxProf.Tests.Compare;

public class ReportComparisonTests
{
    private static LoadedReport Loaded(ReportDocument doc, string name = "report.json") => new(name, doc);

    [Fact]
    public void A_report_compared_with_itself_has_only_zero_changes()
    {
        var doc = ReportFixtures.Standard();

        var cmp = ReportComparison.Create(Loaded(doc), Loaded(doc));

        // 3 strategies x (2 counters x 6 statistics + 2 subgroup sizes x 3 statistics + hit rate + mismatch)
        cmp.Changes.Should().HaveCount(3 * (12 + 6 + 2));
        cmp.Changes.Should().OnlyContain(c => c.Change == 0 && c.RelativeChange == 0 && !c.IsRegression);
        cmp.SceneChanged.Should().BeFalse();
        cmp.Notes.Should().BeEmpty();
    }

    [Fact]
    public void Relative_change_is_the_change_over_the_base_value()
    {
        // Relative change (x - x0) / |x0|, the usual definition (Törnqvist, Vartia & Vartia 1985,
        // "How should relative changes be measured?", The American Statistician 39(1)).
        var change = new MetricChange("dda", new MetricDescriptor("iterations.mean", "mean", "count", "0.00", Better.Lower), 8, 10);
        change.Change.Should().Be(2);
        change.RelativeChange.Should().Be(0.25);

        var fall = change with { Base = -4, Candidate = -5 };
        fall.RelativeChange.Should().Be(-0.25);
    }

    [Fact]
    public void Different_image_sizes_are_refused_naming_both_sizes()
    {
        var a = ReportFixtures.Standard();
        var b = a with { Run = a.Run with { Width = 80, Height = 50 } };

        var act = () => ReportComparison.Create(Loaded(a, "a/report.json"), Loaded(b, "b/report.json"));

        act.Should().Throw<InputException>().Which.Message.Should()
            .Contain("different image sizes").And.Contain("base 40x25").And.Contain("candidate 80x50");
    }

    [Fact]
    public void Different_cameras_are_refused_naming_both_cameras()
    {
        var a = ReportFixtures.Standard();
        var b = a with { Camera = a.Camera with { Eye = [10f, 20f, -31f] } };

        var act = () => ReportComparison.Create(Loaded(a), Loaded(b));

        act.Should().Throw<InputException>().Which.Message.Should()
            .Contain("different cameras").And.Contain("eye 10,20,-30").And.Contain("eye 10,20,-31");
    }

    [Fact]
    public void A_different_scene_hash_is_allowed_and_stated_first()
    {
        var a = ReportFixtures.Standard();
        var b = a with { Scene = a.Scene with { Sha256 = "ffee0011" } };

        var cmp = ReportComparison.Create(Loaded(a), Loaded(b));

        cmp.SceneChanged.Should().BeTrue();
        cmp.Notes[0].Should().Contain("scene content differs").And.Contain("abc123").And.Contain("ffee0011");
    }

    [Fact]
    public void Changes_are_sorted_largest_regression_first_and_improvements_last()
    {
        var a = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10), ReportFixtures.Strategy("hdda", 10));
        var b = ReportFixtures.Report(ReportFixtures.Strategy("dda", 11), ReportFixtures.Strategy("hdda", 13));

        var cmp = ReportComparison.Create(Loaded(a), Loaded(b));

        cmp.Changes[0].Strategy.Should().Be("hdda");
        cmp.Changes.Select(c => c.RelativeWorsening).Should().BeInDescendingOrder();
        var hddaMean = cmp.Changes.Single(c => c.Strategy == "hdda" && c.Metric.Name == "iterations.mean");
        var ddaMean = cmp.Changes.Single(c => c.Strategy == "dda" && c.Metric.Name == "iterations.mean");
        cmp.Changes.ToList().IndexOf(hddaMean).Should().BeLessThan(cmp.Changes.ToList().IndexOf(ddaMean));
        hddaMean.RelativeChange.Should().BeApproximately(0.3, 1e-12);
    }

    [Fact]
    public void A_fall_in_simd_efficiency_is_a_regression_and_a_fall_in_cost_is_not()
    {
        var a = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10, tileMax32: 20, efficiency32: 0.5));
        var b = ReportFixtures.Report(ReportFixtures.Strategy("dda", 9, tileMax32: 18, efficiency32: 0.4));

        var cmp = ReportComparison.Create(Loaded(a), Loaded(b));

        var efficiency = cmp.Changes.Single(c => c.Metric.Name == "subgroup32.simd-efficiency");
        efficiency.IsRegression.Should().BeTrue();
        efficiency.RelativeWorsening.Should().BeApproximately(0.2, 1e-12);
        cmp.Changes.Single(c => c.Metric.Name == "subgroup32.tile-max-mean").IsRegression.Should().BeFalse();
        cmp.Changes.Single(c => c.Metric.Name == "iterations.mean").IsRegression.Should().BeFalse();
        cmp.Changes.Where(c => c.IsRegression).Should().OnlyContain(c => c.Metric.Statistic == "simd-efficiency");
        // subgroup64 falls 0.45 -> 0.36: the same 20%, so the tie keeps the report order and subgroup32 leads.
        cmp.Changes.Take(2).Select(c => c.Metric.Name).Should().Equal("subgroup32.simd-efficiency", "subgroup64.simd-efficiency");
    }

    [Fact]
    public void Equal_relative_changes_keep_the_report_order_whatever_the_rounding_of_each_division()
    {
        // 7% of 12, 40 and 20 lands a few ulps either side of 0.07 depending on the operands.
        var cmp = ReportComparison.Create(Loaded(ReportFixtures.Standard()), Loaded(ReportFixtures.Standard(1.07)));

        var regressions = cmp.Changes.Where(c => c.IsRegression).ToArray();
        regressions.Select(c => c.Strategy).Should().StartWith(Enumerable.Repeat("grid", 12), "grid has 10 counter statistics and 2 tile maxima that rise; its maxima stay at 100");
        regressions.Take(3).Select(c => c.Metric.Name).Should().Equal("iterations.total", "iterations.mean", "iterations.p50");
    }

    [Fact]
    public void A_cost_that_appears_from_zero_sorts_before_any_finite_regression()
    {
        var a = ReportFixtures.Report(ReportFixtures.Make("dda", ReportFixtures.Counter("iterations", 10), ReportFixtures.Counter("ascents", 0, max: 0)));
        var b = ReportFixtures.Report(ReportFixtures.Make("dda", ReportFixtures.Counter("iterations", 20), ReportFixtures.Counter("ascents", 0.005, max: 1)));

        var cmp = ReportComparison.Create(Loaded(a), Loaded(b));

        cmp.Changes[0].Metric.Group.Should().Be("ascents");
        cmp.Changes[0].RelativeChange.Should().BeNull();
        cmp.Changes[0].RelativeWorsening.Should().Be(double.PositiveInfinity);
    }

    [Fact]
    public void Strategies_in_one_report_only_are_left_out_and_noted()
    {
        var a = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10), ReportFixtures.Strategy("grid", 30));
        var b = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10), ReportFixtures.Strategy("hdda", 8));

        var cmp = ReportComparison.Create(Loaded(a), Loaded(b));

        cmp.Strategies.Should().Equal("dda");
        cmp.Changes.Should().OnlyContain(c => c.Strategy == "dda");
        cmp.Notes.Should().Contain(n => n.Contains("only in base") && n.Contains("grid"))
            .And.Contain(n => n.Contains("only in candidate") && n.Contains("hdda"));
    }

    [Fact]
    public void A_metric_in_one_report_only_is_noted_and_left_out()
    {
        var a = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10));
        var b = ReportFixtures.Report(ReportFixtures.Strategy("dda", 10).With(ReportFixtures.Counter("ascents", 1)));

        var cmp = ReportComparison.Create(Loaded(a), Loaded(b));

        cmp.Changes.Should().NotContain(c => c.Metric.Group == "ascents");
        cmp.Notes.Should().ContainSingle(n => n.StartsWith("not compared, present in one report only: ascents.total (candidate only)", StringComparison.Ordinal));
    }

    [Fact]
    public void A_metric_whose_direction_changed_is_not_compared()
    {
        var a = ReportFixtures.Standard();
        var b = a with { Metrics = a.Metrics.Select(m => m.Name == "iterations.mean" ? m with { Better = Better.Higher } : m).ToArray() };

        var cmp = ReportComparison.Create(Loaded(a), Loaded(b));

        cmp.Changes.Should().NotContain(c => c.Metric.Name == "iterations.mean");
        cmp.Notes.Should().Contain(n => n.StartsWith("iterations.mean not compared: base measures it in count (lower is better), candidate in count (higher is better)", StringComparison.Ordinal));
    }
}
