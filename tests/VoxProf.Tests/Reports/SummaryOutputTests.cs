using System.Globalization;
using CsvHelper;
using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Export;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;
using VoxProf.Reports.Tables;

namespace VoxProf.Tests.Reports;

public class SummaryOutputTests
{
    private static ReportDocument Document(ReportOptions? options = null)
    {
        var run = TestRuns.Small();
        return ReportBuilder.Build(run, StrategyStatistics.Compute(run), options ?? TestRuns.Options);
    }

    private static string Csv(ReportDocument doc)
    {
        var sw = new StringWriter();
        SummaryCsv.Write(MetricTable.FromReport(doc), sw);
        return sw.ToString();
    }

    [Theory]
    [InlineData("en-US")]
    [InlineData("de-DE")]
    public void Summary_csv_matches_the_stored_snapshot_in_any_culture(string culture)
    {
        using var _ = new CultureScope(culture);
        Snapshot.Match(Csv(Document()), "summary.csv");
    }

    [Theory]
    [InlineData("en-US")]
    [InlineData("de-DE")]
    public void Summary_markdown_matches_the_stored_snapshot_in_any_culture(string culture)
    {
        using var _ = new CultureScope(culture);
        var doc = Document();
        Snapshot.Match(SummaryMarkdown.Render(doc, MetricTable.FromReport(doc)), "summary.md");
    }

    [Theory]
    [InlineData("en-US")]
    [InlineData("de-DE")]
    public void Report_json_matches_the_stored_snapshot_in_any_culture(string culture)
    {
        using var _ = new CultureScope(culture);
        Snapshot.Match(ReportJson.Serialize(Document()), "report.json");
    }

    // RFC 4180 reader from outside the project: CsvHelper 34 reads the file back to the very same numbers.
    [Fact]
    public void Summary_csv_reads_back_with_CsvHelper_to_the_report_values_under_the_metric_names()
    {
        var doc = Document();
        using var csv = CsvReader.FromText(Csv(doc));
        int records = 0;
        while (csv.Read())
        {
            if (records == 0)
                csv.Headers.ToArray().Should().Equal(["strategy", .. doc.Metrics.Select(m => m.Name)]);
            var strategy = doc.Strategies[records++];
            csv.GetString("strategy").Should().Be(strategy.Name);
            foreach (var m in doc.Metrics)
                double.Parse(csv.GetString(m.Name), CultureInfo.InvariantCulture).Should().Be(strategy.Value(m.Name)!.Value, m.Name);
        }
        records.Should().Be(doc.Strategies.Count);
    }

    [Fact]
    public void Every_output_names_a_metric_as_a_gate_rule_does()
    {
        // Calibrated, so that predicted-ms is among the metrics and summary.md's columns.
        var doc = Document(TestRuns.Options with { Calibration = TestRuns.Calibration });
        string csvHeader = Csv(doc).Split("\r\n")[0];
        string md = SummaryMarkdown.Render(doc, MetricTable.FromReport(doc));
        foreach (var m in doc.Metrics)
        {
            csvHeader.Split(',').Should().Contain(m.Name);
            doc.Strategies.Should().OnlyContain(s => s.Values.ContainsKey(m.Name));
            VoxProf.Reports.Compare.GateRule.Parse($"dda.{m.Name}:5%").MatchesMetric(m.Name).Should().BeTrue(m.Name);
        }
        foreach (var c in MetricColumns.For(MetricColumns.Summary, prepass: false))
            md.Should().Contain($" `{c.Metric}` |");
    }

    [Fact]
    public void Without_the_grid_reference_the_mismatch_reads_not_checked_everywhere()
    {
        var full = TestRuns.Small();
        var run = new TraceRun(full.Scene, full.Camera, full.Settings, full.Tree, [full.Results[1]]);
        var doc = ReportBuilder.Build(run, StrategyStatistics.Compute(run), TestRuns.Options);

        doc.Strategies[0].Values["mismatch"].Should().BeNull();
        ReportJson.Serialize(doc).Should().Contain("\"mismatch\": null");
        using var csv = CsvReader.FromText(Csv(doc));
        csv.Read().Should().BeTrue();
        csv.GetString("mismatch").Should().BeEmpty();
        string md = SummaryMarkdown.Render(doc, MetricTable.FromReport(doc));
        md.Split('\n').Single(l => l.StartsWith("| dda", StringComparison.Ordinal)).Should().Contain("| not checked |");
        var console = new StringWriter();
        SummaryConsole.Write(console, doc);
        console.ToString().Split('\n')[2].Should().Contain("not checked");
    }

    [Fact]
    public void The_console_table_names_its_columns_as_metrics_over_two_lines_and_leads_with_total_work()
    {
        var doc = Document();
        var console = new StringWriter();
        SummaryConsole.Write(console, doc);
        string[] lines = console.ToString().Split('\n', StringSplitOptions.RemoveEmptyEntries);
        string F(string metric) => doc.Metrics.Single(m => m.Name == metric).Format(doc.Strategies[0].Value(metric)!.Value);

        lines.Should().HaveCount(2 + 2);
        lines[0].Split(' ', StringSplitOptions.RemoveEmptyEntries).Should().StartWith(["total-iterations.", "total-node-fetches.", "subgroup32.", "subgroup32."]);
        lines[1].Split(' ', StringSplitOptions.RemoveEmptyEntries).Should().Equal(
            "strategy", "mean", "mean", "tile-max-mean", "simd-efficiency", "hit-rate", "mismatch", "seconds");
        lines[2].Split(' ', StringSplitOptions.RemoveEmptyEntries).Should().Equal("grid", F("total-iterations.mean"),
            F("total-node-fetches.mean"), F("subgroup32.tile-max-mean"), F("subgroup32.simd-efficiency"), F("hit-rate"), "0", "0.030");
    }

    [Fact]
    public void Reports_differing_only_in_thread_count_are_equal_apart_from_timings()
    {
        var a = Document(TestRuns.Options with { Threads = 1 });
        var b = Document(TestRuns.Options with { Threads = 8 });
        a.Timings.Threads.Should().NotBe(b.Timings.Threads);
        ReportJson.Serialize(a with { Timings = b.Timings }).Should().Be(ReportJson.Serialize(b));
    }

    [Fact]
    public void Debug_builds_are_flagged_in_the_report_and_the_summary()
    {
        var doc = Document(TestRuns.Options with { Environment = TestRuns.Environment with { Configuration = "Debug" } });
        doc.Warnings.Should().ContainSingle().Which.Should().Contain("Debug");
        SummaryMarkdown.Render(doc, MetricTable.FromReport(doc)).Should().Contain("**Warning:** Debug build");
    }

    [Fact]
    public void Markdown_ratios_are_relative_to_the_requested_baseline()
    {
        var doc = Document(TestRuns.Options with { Baseline = VoxProf.Core.Traversal.Strategy.Dda });
        string md = SummaryMarkdown.Render(doc, MetricTable.FromReport(doc));
        md.Should().Contain("| dda (baseline) |");
        var table = MetricTable.FromReport(doc);
        int m = table.IndexOf("total-iterations.mean");
        double ratio = table[table.RowOf("grid"), m]!.Value / table[table.RowOf("dda"), m]!.Value;
        md.Should().Contain("×" + ratio.ToString("0.00", CultureInfo.InvariantCulture));
    }
}
