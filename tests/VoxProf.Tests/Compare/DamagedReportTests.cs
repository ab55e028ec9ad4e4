using System.Text;
using VoxProf.Core;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Model;

namespace VoxProf.Tests.Compare;

/// <summary>
/// A report.json whose numbers no trace produces, or whose text is not valid, is refused as one line naming the
/// file and the field, never compared and never an internal error.
/// </summary>
public sealed class DamagedReportTests : IDisposable
{
    private readonly TempDir _tmp = new();

    public void Dispose() => _tmp.Dispose();

    private string Write(ReportDocument doc) => ReportFixtures.Write(_tmp, "r", doc);

    private string WriteText(Func<string, string> edit)
    {
        string dir = Write(ReportFixtures.Standard());
        string file = Path.Combine(dir, "report.json");
        File.WriteAllText(file, edit(File.ReadAllText(file)));
        return dir;
    }

    private static string Refused(string dir) =>
        FluentActions.Invoking(() => ReportLoader.Load(dir)).Should().Throw<InputException>().Which.Message;

    private static ReportDocument With(string metric, double value) => ReportFixtures.Report(
        ReportFixtures.Strategy("dda", 12).With(new Dictionary<string, double?> { [metric] = value }));

    [Fact]
    public void A_statistic_of_1e999_is_refused_as_damaged()
    {
        string dir = WriteText(t => t.Replace("\"iterations.mean\": 40", "\"iterations.mean\": 1e999", StringComparison.Ordinal));

        Refused(dir).Should().Contain("$.strategies[0].values.iterations.mean: damaged report: Infinity is not a count, size or fraction a trace can produce");
    }

    [Fact]
    public void Statistics_too_large_for_any_trace_are_refused_so_no_difference_can_overflow()
    {
        Refused(Write(With("iterations.max", 1.5e308))).Should().Contain("values.iterations.max: damaged report: 1.5E+308 is not a count");
    }

    [Theory]
    [InlineData("iterations.p50", -1, "-1 is not a count, size or fraction a trace can produce")]
    [InlineData("subgroup32.simd-efficiency", 1.5, "1.5 is a ratio above 1")]
    [InlineData("hit-rate", 2, "2 is a fraction above 1")]
    [InlineData("iterations.p99", 500, "100 is below iterations.p99 (500); expected p50 ≤ p90 ≤ p99 ≤ max")]
    [InlineData("iterations.p90", 5, "5 is below iterations.p50 (12); expected p50 ≤ p90 ≤ p99 ≤ max")]
    [InlineData("iterations.mean", 101, "101 is above iterations.max (100)")]
    [InlineData("iterations.total", 1, "1 disagrees with iterations.mean (12) × 1000 pixels")]
    [InlineData("subgroup32.tile-max-mean", 150, "150 is above subgroup32.tile-max-max (100)")]
    public void Impossible_statistics_are_refused_naming_the_field(string metric, double value, string problem)
    {
        Refused(Write(With(metric, value))).Should().Contain("damaged report: " + problem).And.EndWith("; trace again");
    }

    [Fact]
    public void A_null_item_in_a_list_is_refused_not_an_internal_error()
    {
        string dir = WriteText(t => t.Replace("\"metrics\": [", "\"metrics\": [null, ", StringComparison.Ordinal));

        Refused(dir).Should().EndWith("report.json: $.metrics[0]: expected a metric, found null");
    }

    [Fact]
    public void A_byte_order_mark_before_the_report_is_accepted()
    {
        string dir = Write(ReportFixtures.Standard());
        string file = Path.Combine(dir, "report.json");
        File.WriteAllBytes(file, [0xEF, 0xBB, 0xBF, .. File.ReadAllBytes(file)]);

        ReportLoader.Load(dir).Document.Strategies.Should().HaveCount(3);
    }

    [Fact]
    public void Invalid_utf8_and_lone_surrogates_are_refused_with_their_place()
    {
        string bad = WriteText(t => t.Replace("\"harbour\"", "\"harb\\ud800our\"", StringComparison.Ordinal));
        Refused(bad).Should().Contain("$.scene.name: text holds an escaped lone surrogate");

        string file = Path.Combine(bad, "report.json");
        byte[] bytes = Encoding.UTF8.GetBytes(File.ReadAllText(file).Replace("harb\\ud800our", "harbour", StringComparison.Ordinal));
        int at = Array.IndexOf(bytes, (byte)'h');
        bytes[at] = 0xC0;
        File.WriteAllBytes(file, bytes);
        Refused(bad).Should().Contain($"not UTF-8: byte 0xC0 at byte offset {at}");
    }

    [Fact]
    public void A_bad_literal_echoes_a_short_excerpt_not_the_rest_of_the_report()
    {
        string dir = WriteText(t => t.Replace("\"width\": 40", "\"width\": nul", StringComparison.Ordinal));

        string message = Refused(dir);

        message.Should().Contain("malformed JSON: 'nul,").And.Contain("…'").And.NotContain("\n");
        message.Length.Should().BeLessThan(300);
    }

    [Fact]
    public void A_report_json_over_the_size_limit_is_refused_by_its_length()
    {
        string dir = Path.Combine(_tmp.Path, "huge");
        Directory.CreateDirectory(dir);
        using (var f = new FileStream(Path.Combine(dir, "report.json"), FileMode.Create))
            f.SetLength(ReportLoader.MaxBytes + 1);

        Refused(dir).Should().EndWith($"report.json: holds {ReportLoader.MaxBytes + 1} bytes; expected a report.json of at most {ReportLoader.MaxBytes}");
    }
}
