using System.Globalization;
using CsvHelper;
using VoxProf.Core.Calibration;
using VoxProf.Core.Statistics;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Calibration;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Export;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;
using VoxProf.Reports.Tables;
using VoxProf.Tests.Compare;
using VoxProf.Tests.Reports;

namespace VoxProf.Tests.Calibration;

public sealed class PredictedMetricTests : IDisposable
{
    private readonly TempDir _tmp = new();

    public void Dispose() => _tmp.Dispose();

    private static ReportOptions Calibrated => TestRuns.Options with { Calibration = TestRuns.Calibration };

    private static ReportDocument Document(ReportOptions options, TraceRun? run = null)
    {
        run ??= TestRuns.Small();
        return ReportBuilder.Build(run, StrategyStatistics.Compute(run), options);
    }

    // By hand from TestRuns.Calibration: 40 ns a pixel, 3 ns an iteration, 5 ns a node fetch, over the raw counters.
    private static double ByHandMs(StrategyResult r) =>
        (40.0 * r.Width * r.Height + 3.0 * r.Get(Counter.Iterations).ToArray().Sum(v => (double)v)
            + 5.0 * r.Get(Counter.NodeFetches).ToArray().Sum(v => (double)v)) / 1e6;

    [Fact]
    public void Predicted_ms_is_a_lower_is_better_metric_valued_from_the_counters_by_hand()
    {
        var run = TestRuns.Small();
        var doc = Document(Calibrated, run);

        var metric = doc.Metrics.Single(m => m.Name == MetricCatalogue.PredictedMs);
        metric.Unit.Should().Be("ms");
        metric.Better.Should().Be(Better.Lower);
        metric.Title.Should().Contain("lab card A, driver 9.1");
        foreach (var r in run.Results)
            doc.Strategies.Single(s => s.Name == r.Strategy.Name).Value(MetricCatalogue.PredictedMs).Should().BeApproximately(ByHandMs(r), 1e-15);
        doc.Calibration.Should().NotBeNull();
        doc.Calibration!.Device.Should().Be("lab card A, driver 9.1");
        doc.Calibration.File.Should().Be("lab.json");
        doc.Calibration.Costs.Select(c => (c.Feature, c.Nanoseconds)).Should().Equal(("pixels", 40.0), ("iterations", 3.0), ("node-fetches", 5.0));
        doc.Warnings.Should().BeEmpty();
    }

    [Fact]
    public void Without_a_calibration_there_is_no_predicted_metric_and_report_json_has_no_calibration_field()
    {
        var doc = Document(TestRuns.Options);

        doc.Metrics.Should().NotContain(m => m.Name == MetricCatalogue.PredictedMs);
        ReportJson.Serialize(doc).Should().NotContain("calibration").And.NotContain("predicted");
    }

    [Fact]
    public void Summary_csv_md_console_and_report_json_all_carry_predicted_ms()
    {
        var doc = Document(Calibrated);
        double dda = doc.Strategies.Single(s => s.Name == "dda").Value(MetricCatalogue.PredictedMs)!.Value;

        var csvText = new StringWriter();
        SummaryCsv.Write(MetricTable.FromReport(doc), csvText);
        using (var csv = CsvReader.FromText(csvText.ToString()))
        {
            while (csv.Read())
            {
                if (csv.GetString("strategy") == "dda")
                    double.Parse(csv.GetString("predicted-ms"), CultureInfo.InvariantCulture).Should().Be(dda);
            }
        }
        string md = SummaryMarkdown.Render(doc, MetricTable.FromReport(doc));
        md.Should().Contain("| strategy | `predicted-ms` |");
        md.Split('\n').Single(l => l.StartsWith("| dda ", StringComparison.Ordinal)).Should().StartWith($"| dda (baseline) | {dda.ToString("0.000", CultureInfo.InvariantCulture)} ×1.00 |");
        var console = new StringWriter();
        SummaryConsole.Write(console, doc);
        console.ToString().Split('\n')[1].Should().StartWith("strategy  predicted-ms");
        ReportJson.Serialize(doc).Should().Contain("\"predicted-ms\": ").And.Contain("\"calibration\": {");
    }

    [Fact]
    public void A_calibration_fitted_on_another_size_or_branching_warns_in_report_json_and_summary_md()
    {
        var run = TestRuns.Small(20, 10);
        var doc = Document(Calibrated, run);

        doc.Warnings.Should().ContainSingle().Which.Should()
            .Be("calibration for lab card A, driver 9.1 was fitted on 16x8 images, this trace uses 20x10 images: predicted-ms may not hold");
        SummaryMarkdown.Render(doc, MetricTable.FromReport(doc)).Should().Contain("> **Warning:** calibration for lab card A");
    }

    [Fact]
    public void The_predicted_cost_heatmap_is_written_per_strategy_from_each_pixels_picoseconds()
    {
        var run = TestRuns.Small();
        var options = Calibrated with { Heatmaps = [.. HeatmapNames.Default, HeatmapNames.PredictedCost] };
        string dir = Path.Combine(_tmp.Path, "report");

        var result = ReportWriter.WriteAll(run, options, dir);

        result.Failures.Should().BeEmpty();
        foreach (var r in run.Results)
        {
            string file = OutputNames.Heatmap(r.Strategy.Name, HeatmapNames.PredictedCost);
            result.Document.Strategies.Single(s => s.Name == r.Strategy.Name).Files.Should().Contain(file);
            var png = PngPicture.Read(Path.Combine(dir, file));
            png.Text["Counter"].Should().Be("predicted-cost");
            png.Width.Should().Be(r.Width);
            // Each pixel is 40 000 ps plus 3 000 per iteration and 5 000 per node fetch.
            uint[] ps = HeatmapExporter.Values(r, HeatmapNames.PredictedCost, TestRuns.Calibration.Model);
            ps[5].Should().Be(40_000 + 3_000 * r.Get(Counter.Iterations)[5] + 5_000 * r.Get(Counter.NodeFetches)[5]);
            (ps.Sum(v => (double)v) / 1e9).Should().BeApproximately(ByHandMs(r), 1e-12);
        }
        result.Document.Run.Heatmaps.Should().Contain("predicted-cost");
        HeatmapExporter.UnitOf(HeatmapNames.PredictedCost).Should().Be("predicted GPU time per pixel, picoseconds");
    }

    [Fact]
    public void Compare_gates_on_predicted_ms_like_any_metric_and_notes_a_change_of_calibration()
    {
        var run = TestRuns.Small();
        var cheap = new LoadedReport("base/report.json", Document(Calibrated, run));
        var dearer = TestRuns.Calibration with
        {
            File = "/calibrations/other.json",
            Model = TestRuns.Calibration.Model with { Terms = TestRuns.Calibration.Model.Terms.Select(t => t with { Nanoseconds = t.Nanoseconds * 1.1 }).ToArray() },
        };
        var candidate = new LoadedReport("cand/report.json", Document(TestRuns.Options with { Calibration = dearer }, run));

        var comparison = ReportComparison.Create(cheap, candidate);

        var change = comparison.Changes.Single(c => c.Strategy == "dda" && c.Metric.Name == MetricCatalogue.PredictedMs);
        change.RelativeWorsening.Should().BeApproximately(0.1, 1e-12);
        GateRules.Evaluate(comparison, GateRules.Parse(["dda.predicted-ms:5%"])).Passed.Should().BeFalse();
        GateRules.Evaluate(comparison, GateRules.Parse(["dda.predicted-ms:10%"])).Passed.Should().BeTrue();
        comparison.Notes.Should().Contain(n => n.StartsWith("calibration differs: base lab.json (lab card A, driver 9.1), candidate other.json", StringComparison.Ordinal));
        ReportComparison.Create(cheap, cheap).Notes.Should().NotContain(n => n.Contains("calibration", StringComparison.Ordinal));
    }
}
