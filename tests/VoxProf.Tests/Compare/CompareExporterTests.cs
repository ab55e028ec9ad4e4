using System.Globalization;
using System.Text;
using System.Text.Json;
using CsvHelper;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Export;
using VoxProf.Reports.Metrics;

namespace VoxProf.Tests.Compare;

public class CompareExporterTests
{
    private static CompareResult Result(double scale, params string[] rules)
    {
        var cmp = ReportComparison.Create(new("base/report.json", ReportFixtures.Standard()),
            new("cand/report.json", ReportFixtures.Standard(scale) with { Scene = ReportFixtures.Standard().Scene with { Sha256 = "99ff" } }));
        return new CompareResult(cmp, GateRules.Evaluate(cmp, GateRules.Parse(rules)));
    }

    private static string Render(ICompareExporter exporter, CompareResult result)
    {
        using var stream = new MemoryStream();
        exporter.Write(result, stream);
        return Encoding.UTF8.GetString(stream.ToArray());
    }

    [Fact]
    public void Compare_csv_reads_back_with_an_rfc_4180_reader_to_the_same_numbers()
    {
        var result = Result(1.1);
        var text = Render(new CompareCsvExporter(), result);

        // Independent check: CsvHelper's RFC 4180 reader parses what we wrote, header and every row.
        using var csv = CsvReader.FromText(text);
        var rows = new List<(string Strategy, string Metric, string Better, double Base, double Candidate, string Relative)>();
        while (csv.Read())
        {
            rows.Add((csv.GetString("strategy"), csv.GetString("metric"), csv.GetString("better"),
                double.Parse(csv.GetString("base"), CultureInfo.InvariantCulture),
                double.Parse(csv.GetString("candidate"), CultureInfo.InvariantCulture),
                csv.GetString("relative_change")));
        }

        csv.Headers.ToArray().Should().Equal(CompareCsvExporter.Header);
        rows.Should().HaveCount(result.Comparison.Changes.Count);
        for (var i = 0; i < rows.Count; i++)
        {
            var c = result.Comparison.Changes[i];
            rows[i].Strategy.Should().Be(c.Strategy);
            rows[i].Metric.Should().Be(c.Metric.Name);
            rows[i].Better.Should().Be(CompareText.BetterText(c.Metric.Better));
            rows[i].Base.Should().Be(c.Base);
            rows[i].Candidate.Should().Be(c.Candidate);
            double.Parse(rows[i].Relative, CultureInfo.InvariantCulture).Should().Be(c.RelativeChange!.Value);
        }
    }

    [Fact]
    public void Compare_csv_uses_invariant_numbers_under_a_comma_decimal_culture()
    {
        var saved = CultureInfo.CurrentCulture;
        try
        {
            CultureInfo.CurrentCulture = CultureInfo.GetCultureInfo("de-DE");
            var text = Render(new CompareCsvExporter(), Result(1.1));

            text.Should().Contain(",13.2").And.NotContain("13,2");
        }
        finally
        {
            CultureInfo.CurrentCulture = saved;
        }
    }

    [Fact]
    public void Every_text_output_is_the_same_under_a_comma_decimal_culture()
    {
        var result = Result(1.1, "dda.iterations.mean:5%");
        ICompareExporter[] exporters = [new CompareMarkdownExporter(), new CompareCsvExporter(), new CompareJsonExporter()];
        var invariant = exporters.Select(e => Render(e, result)).ToArray();
        var console = new StringWriter();
        CompareConsole.WriteTable(console, result.Comparison);

        var saved = CultureInfo.CurrentCulture;
        try
        {
            CultureInfo.CurrentCulture = CultureInfo.GetCultureInfo("de-DE");
            exporters.Select(e => Render(e, result)).Should().Equal(invariant);
            var german = new StringWriter();
            CompareConsole.WriteTable(german, result.Comparison);
            german.ToString().Should().Be(console.ToString());
        }
        finally
        {
            CultureInfo.CurrentCulture = saved;
        }
        invariant[0].Should().Contain("| 12.00 | 13.20 | +1.20 | +10% | ↑ |");
    }

    [Fact]
    public void Compare_json_holds_the_verdict_the_broken_rule_and_every_change()
    {
        var result = Result(1.1, "dda.iterations.mean:5%", "all.subgroup32.tile-max-mean:20%");
        var text = Render(new CompareJsonExporter(), result);

        using var doc = JsonDocument.Parse(text);
        var root = doc.RootElement;
        root.GetProperty("verdict").GetString().Should().Be("fail");
        root.GetProperty("sceneChanged").GetBoolean().Should().BeTrue();
        var rules = root.GetProperty("rules");
        rules[0].GetProperty("rule").GetString().Should().Be("dda.iterations.mean:5%");
        rules[0].GetProperty("holds").GetBoolean().Should().BeFalse();
        rules[1].GetProperty("holds").GetBoolean().Should().BeTrue();
        rules[1].GetProperty("checks").GetArrayLength().Should().Be(3);
        root.GetProperty("changes").GetArrayLength().Should().Be(result.Comparison.Changes.Count);
        root.GetProperty("changes")[0].GetProperty("regression").GetBoolean().Should().BeTrue();
    }

    [Fact]
    public void Compare_md_states_the_scene_change_first_then_the_verdict_and_the_broken_numbers()
    {
        var text = Render(new CompareMarkdownExporter(), Result(1.1, "dda.iterations.mean:5%"));
        var lines = text.Split('\n');

        lines[2].Should().Contain("Scene content differs").And.Contain("99ff");
        text.Should().Contain("## Gate\n\n**The gate fails**: 1 of 1 rule does not hold (exit code 1).");
        text.Should().Contain("`dda.iterations.mean:5%`: dda iterations.mean: 12.00 -> 13.20 (+1.20, +10%), may rise at most 5%");
        var table = lines.SkipWhile(l => !l.StartsWith("| strategy")).Skip(2).TakeWhile(l => l.StartsWith('|')).ToArray();
        table.Should().HaveCount(3 * 20);
        table.Should().Contain(l => l.Contains("subgroup32.simd-efficiency"));
    }

    [Fact]
    public void A_failing_exporter_is_reported_and_the_others_still_written()
    {
        using var tmp = new TempDir();
        var result = Result(1.0);

        using (var output = OutputDirectory.Open(tmp.Path))
        {
            var failures = CompareOutputs.WriteAll(output, result, [new ThrowingExporter(), new CompareCsvExporter()]);
            output.Commit();
            failures.Should().ContainSingle().Which.Should().Contain("broken.txt").And.Contain("disk full");
        }

        File.Exists(Path.Combine(tmp.Path, "compare.csv")).Should().BeTrue();
        File.Exists(Path.Combine(tmp.Path, "broken.txt")).Should().BeFalse();
        Directory.GetFiles(tmp.Path).Select(Path.GetFileName).Should().BeEquivalentTo(["compare.csv", "manifest.json"], "no temporary file is left behind");
    }

    private sealed class ThrowingExporter : ICompareExporter
    {
        public string FileName => "broken.txt";

        public void Write(CompareResult result, Stream output)
        {
            output.WriteByte(1);
            throw new IOException("disk full");
        }
    }
}

public class WorkMarkTests
{
    private static MetricChange Change(string name, Better better, double from, double to) =>
        new("dda", new MetricDescriptor(name, name, "count", "0.00", better), from, to);

    [Theory]
    [InlineData("iterations.mean", Better.Lower, 10, 12, "↑")]
    [InlineData("iterations.mean", Better.Lower, 12, 10, "↓")]
    [InlineData("subgroup32.simd-efficiency", Better.Higher, 0.9, 0.8, "↑")]
    [InlineData("subgroup32.simd-efficiency", Better.Higher, 0.8, 0.9, "↓")]
    [InlineData("prepass-skip.mean", Better.Higher, 40, 30, "↑")]
    [InlineData("hit-rate", Better.Neutral, 0.5, 0.6, "")]
    [InlineData("iterations.mean", Better.Lower, 10, 10, "")]
    public void The_mark_says_more_or_less_work_whichever_way_the_number_moves(string metric, Better better, double from, double to, string mark) =>
        CompareText.WorkMark(Change(metric, better, from, to)).Should().Be(mark);

    [Fact]
    public void Compare_md_explains_each_mark_once_and_states_the_verdict_apart_from_the_changes()
    {
        var b = ReportFixtures.Standard();
        var cmp = ReportComparison.Create(new("base/report.json", b), new("cand/report.json", ReportFixtures.Standard(0.9)));
        var verdict = GateRules.Evaluate(cmp, GateRules.Parse(["all.iterations.mean:5%"]));
        using var stream = new MemoryStream();
        new CompareMarkdownExporter().Write(new CompareResult(cmp, verdict), stream);
        string text = System.Text.Encoding.UTF8.GetString(stream.ToArray());

        text.Should().Contain("**The gate holds**: 1 of 1 rule holds.");
        text.Split("↑ marks more work and ↓ less work").Should().HaveCount(2, "the legend is given once");
        text.Should().NotContain("▲").And.NotContain("▼").And.NotContain("Verdict: PASS");
        text.Should().Contain("| dda | iterations.mean | count | 12.00 | 10.80 | -1.20 | -10% | ↓ |");
    }
}
