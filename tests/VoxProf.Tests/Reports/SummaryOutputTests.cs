using System.Globalization;
using CsvHelper;
using VoxProf.Core.Statistics;
using VoxProf.Core.Strategies;
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
        foreach (var c in MetricColumns.For(MetricColumns.Summary, prepass: false, memory: true))
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
        lines[0].Split(' ', StringSplitOptions.RemoveEmptyEntries).Should().StartWith(
            ["total-iterations.", "total-node-fetches.", "subgroup32.", "subgroup32.", "cache-lines.", "cache."]);
        lines[1].Split(' ', StringSplitOptions.RemoveEmptyEntries).Should().Equal(
            "strategy", "mean", "mean", "tile-max-mean", "simd-efficiency", "mean", "hit-rate", "hit-rate", "mismatch", "seconds");
        lines[2].Split(' ', StringSplitOptions.RemoveEmptyEntries).Should().Equal("grid", F("total-iterations.mean"),
            F("total-node-fetches.mean"), F("subgroup32.tile-max-mean"), F("subgroup32.simd-efficiency"), F("cache-lines.mean"),
            F("cache.hit-rate"), F("hit-rate"), "0", "0.030");
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
        var doc = Document(TestRuns.Options with { Baseline = VoxProf.Core.Strategies.BuiltInStrategies.Grid });
        string md = SummaryMarkdown.Render(doc, MetricTable.FromReport(doc));
        md.Should().Contain("| grid (baseline) |");
        var table = MetricTable.FromReport(doc);
        int m = table.IndexOf("total-iterations.mean");
        double ratio = table[table.RowOf("dda"), m]!.Value / table[table.RowOf("grid"), m]!.Value;
        md.Should().Contain("×" + ratio.ToString("0.00", CultureInfo.InvariantCulture));
    }

    [Fact]
    public void The_default_baseline_is_the_first_tree_strategy_and_grid_only_when_alone()
    {
        var full = TestRuns.Small();
        var stats = StrategyStatistics.Compute(full);
        ReportBuilder.Baseline(stats, requested: null).Should().Be(VoxProf.Core.Strategies.BuiltInStrategies.Dda);
        ReportBuilder.Baseline(stats, VoxProf.Core.Strategies.BuiltInStrategies.Grid).Should().Be(VoxProf.Core.Strategies.BuiltInStrategies.Grid);
        ReportBuilder.Baseline([stats[0]], requested: null).Should().Be(VoxProf.Core.Strategies.BuiltInStrategies.Grid);
        ReportBuilder.Baseline([], requested: null).Should().BeNull();
    }

    [Fact]
    public void A_link_base_makes_every_image_link_absolute_and_escaped()
    {
        var doc = Document();
        string md = SummaryMarkdown.Render(doc, MetricTable.FromReport(doc), new Uri("https://ci.example.org/run 7/artefacts"));

        var links = System.Text.RegularExpressions.Regex.Matches(md, @"\]\(([^)]*)\)").Select(m => m.Groups[1].Value).ToList();
        links.Should().NotBeEmpty().And.OnlyContain(l => l.StartsWith("https://ci.example.org/run%207/artefacts/", StringComparison.Ordinal));
        links.Should().Contain("https://ci.example.org/run%207/artefacts/heatmap-dda-iterations.png");
        links.Should().Contain("https://ci.example.org/run%207/artefacts/report.html");
        SummaryMarkdown.Render(doc, MetricTable.FromReport(doc)).Should().Contain("[iterations](heatmap-dda-iterations.png)");
    }

    [Theory]
    [InlineData("https://ci.example.org/a/", true)]
    [InlineData("http://localhost:8080/reports", true)]
    [InlineData("ftp://ci.example.org/a/", false)]
    [InlineData("reports/run-7", false)]
    [InlineData("https://ci.example.org/a/?token=1", false)]
    [InlineData("https://ci.example.org/a/#top", false)]
    public void Only_an_absolute_http_address_is_a_link_base(string text, bool valid) =>
        ReportLinks.IsValidBase(text, out _).Should().Be(valid);

    [Fact]
    public void Report_json_records_the_commit_the_command_line_and_each_heatmap_s_range_as_drawn()
    {
        var run = TestRuns.Small();
        var options = TestRuns.Options;
        var doc = ReportBuilder.Build(run, StrategyStatistics.Compute(run), options);

        doc.ToolCommit.Should().Be(options.ToolCommit);
        doc.CommandLine.Should().Equal(options.CommandLine);
        doc.Run.HeatmapRanges.Should().HaveCount(run.Results.Count * options.Heatmaps.Count);
        var context = new ReportContext(run, StrategyStatistics.Compute(run), doc, options);
        foreach (var range in doc.Run.HeatmapRanges)
        {
            var result = run.Results.Single(r => r.Strategy.Name == range.Strategy);
            var drawn = HeatmapExporter.ScaleFor(range.Map, context, result);
            (range.Min, range.Max).Should().Be((drawn.Min, drawn.Max), $"{range.Strategy} {range.Map}");
            range.File.Should().Be(OutputNames.Heatmap(range.Strategy, range.Map));
        }
        var fixedRange = ReportBuilder.Build(run, StrategyStatistics.Compute(run), options with { RangeMin = 2, RangeMax = 90 });
        fixedRange.Run.HeatmapRanges.Should().OnlyContain(r => r.Min == 2 && r.Max == 90);
    }

    [Fact]
    public void The_tool_commit_is_a_git_hash_or_unknown()
    {
        ToolInfo.Commit.Should().MatchRegex("^([0-9a-f]{40}|unknown)$");
    }
}
