using System.Globalization;
using CsvHelper;
using VoxProf.Core.Statistics;
using VoxProf.Reports.Export;
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
    public void Summary_csv_reads_back_with_CsvHelper_to_the_report_values()
    {
        var doc = Document();
        using var csv = CsvReader.FromText(Csv(doc));
        int records = 0;
        while (csv.Read())
        {
            records++;
            var strategy = doc.Strategies.Single(s => s.Name == csv.GetString("strategy"));
            double.Parse(csv.GetString("hit_rate"), CultureInfo.InvariantCulture).Should().Be(strategy.HitRate);
            string measure = csv.GetString("measure");
            if (measure.StartsWith("wave", StringComparison.Ordinal))
            {
                var w = strategy.Waves.Single(x => x.Name == measure);
                double.Parse(csv.GetString("mean_tile_max"), CultureInfo.InvariantCulture).Should().Be(w.MeanTileMax);
                double.Parse(csv.GetString("simd_efficiency"), CultureInfo.InvariantCulture).Should().Be(w.SimdEfficiency);
                csv.GetString("p90_hf7").Should().BeEmpty();
            }
            else
            {
                var c = strategy.Counters.Single(x => x.Counter == measure);
                long.Parse(csv.GetString("total"), CultureInfo.InvariantCulture).Should().Be(c.Total);
                double.Parse(csv.GetString("mean"), CultureInfo.InvariantCulture).Should().Be(c.Mean);
                double.Parse(csv.GetString("p50_hf7"), CultureInfo.InvariantCulture).Should().Be(c.P50);
                double.Parse(csv.GetString("p90_hf7"), CultureInfo.InvariantCulture).Should().Be(c.P90);
                double.Parse(csv.GetString("p99_hf7"), CultureInfo.InvariantCulture).Should().Be(c.P99);
                long.Parse(csv.GetString("max"), CultureInfo.InvariantCulture).Should().Be(c.Max);
                csv.GetString("unit").Should().Be(c.Unit);
            }
        }
        records.Should().Be(doc.Strategies.Count * (doc.Run.Counters.Length + 2));
    }

    [Fact]
    public void Report_json_round_trips_to_an_equal_document()
    {
        var doc = Document();
        string json = ReportJson.Serialize(doc);
        var back = ReportJson.Deserialize(json, "report.json");
        back.Should().BeEquivalentTo(doc);
        ReportJson.Serialize(back).Should().Be(json);
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
    public void A_report_with_a_future_schema_is_refused_with_the_field_named()
    {
        string json = ReportJson.Serialize(Document()).Replace("\"schemaVersion\": 1", "\"schemaVersion\": 99", StringComparison.Ordinal);
        FluentActions.Invoking(() => ReportJson.Deserialize(json, "old.json"))
            .Should().Throw<VoxProf.Core.InputException>().WithMessage("old.json: $.schemaVersion: 99*");
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
        int m = table.IndexOf("iterations.mean");
        double ratio = table[table.RowOf("grid"), m] / table[table.RowOf("dda"), m];
        md.Should().Contain("×" + ratio.ToString("0.00", CultureInfo.InvariantCulture));
    }
}
