using VoxProf.Core;
using VoxProf.Core.Calibration;
using VoxProf.Core.Statistics;
using VoxProf.Reports.Calibration;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Model;
using VoxProf.Tests.Compare;

namespace VoxProf.Tests.Calibration;

public class MeasuredViewsTests
{
    private static readonly MeasureDefinition[] Features = [Measures.Find("iterations")!, Measures.Find("node-fetches")!];

    // The fixture's harbour/pier view at 40×25, and the same camera with the prepass, and another camera.
    private static readonly LoadedReport Plain = new("a/report.json", ReportFixtures.Standard());
    private static readonly LoadedReport Prepass = new("b/report.json", ReportFixtures.Standard(0.5) with
    {
        Run = ReportFixtures.Standard().Run with { PrepassBlock = 4 },
    });
    private static readonly LoadedReport Quay = new("c/report.json", ReportFixtures.Standard(2) with
    {
        Camera = ReportFixtures.Standard().Camera with { Name = "quay" },
    });

    private static TimeRow Row(string camera, string strategy, int? prepass = null, int line = 2) =>
        new(line, "harbour", camera, strategy, prepass, null, null, 1.5, null);

    private static string ErrorOf(TimeRow row, params LoadedReport[] reports) =>
        FluentActions.Invoking(() => MeasuredViews.Match("times.csv", [row], reports, Features))
            .Should().Throw<InputException>().Which.Message;

    [Fact]
    public void Each_row_gets_its_reports_strategy_totals_and_pixel_count()
    {
        var views = MeasuredViews.Match("times.csv",
            [Row("pier", "dda", prepass: 0), Row("PIER", "grid", prepass: 4, line: 3), Row("quay", "dda-mask", line: 4)],
            [Plain, Prepass, Quay], Features);

        views.Select(v => v.Report.File).Should().Equal("a/report.json", "b/report.json", "c/report.json");
        views.Select(v => v.Strategy.Name).Should().Equal("dda", "grid", "dda-mask");
        // ReportFixtures: iterations.total = 1000 × mean, node fetches twice the iterations.
        views[0].Sample.Should().BeEquivalentTo(new CalibrationSample(1.5, 40 * 25, [12_000.0, 24_000.0]));
        views[1].Sample.Totals.Should().Equal(20_000.0, 40_000.0);
        views[2].Sample.Totals.Should().Equal(16_000.0, 32_000.0);
    }

    [Fact]
    public void A_scene_may_be_named_by_its_file_name_too()
    {
        var row = Row("pier", "dda") with { Scene = "HARBOUR.json" };
        MeasuredViews.Match("times.csv", [row], [Plain], Features).Should().ContainSingle();
    }

    [Fact]
    public void A_row_matching_two_reports_asks_for_a_column_to_tell_them_apart()
    {
        ErrorOf(Row("pier", "dda"), Plain, Prepass).Should().Be(
            "times.csv: line 2: scene 'harbour', camera 'pier' matches 2 reports (a/report.json: branching 4, prepass off, 40x25; " +
            "b/report.json: branching 4, prepass 4, 40x25); add a prepass, branching or size column to tell them apart");
    }

    [Fact]
    public void A_row_matching_no_report_lists_the_views_given()
    {
        ErrorOf(Row("pier", "dda", prepass: 8), Plain, Quay).Should().Be(
            "times.csv: line 2: no report given is of scene 'harbour', camera 'pier', prepass 8; the reports are of: " +
            "harbour/pier (branching 4, prepass off, 40x25); harbour/quay (branching 4, prepass off, 40x25)");
    }

    [Fact]
    public void A_strategy_the_report_did_not_trace_is_named_with_those_it_did()
    {
        ErrorOf(Row("pier", "hdda"), Plain).Should().Be("times.csv: line 2: a/report.json has no strategy 'hdda'; it traced grid, dda, dda-mask");
    }

    [Fact]
    public void A_report_without_a_features_total_names_the_metric()
    {
        MeasureDefinition[] features = [Measures.Find("slab-tests")!];
        FluentActions.Invoking(() => MeasuredViews.Match("times.csv", [Row("pier", "dda")], [Plain], features))
            .Should().Throw<InputException>().WithMessage(
                "a/report.json: strategy 'dda' has no value for slab-tests.total (used by times.csv: line 2); trace the view again with this voxprof");
    }
}
