using VoxProf.Core;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Model;

namespace VoxProf.Tests.Compare;

public class ReportLoaderTests
{
    [Fact]
    public void A_report_directory_and_its_report_json_load_the_same_document()
    {
        using var tmp = new TempDir();
        var dir = ReportFixtures.Write(tmp, "base", ReportFixtures.Standard());

        var fromDir = ReportLoader.Load(dir);
        var fromFile = ReportLoader.Load(Path.Combine(dir, "report.json"));

        fromDir.File.Should().Be(fromFile.File);
        fromDir.Document.Strategies.Select(s => s.Name).Should().Equal("grid", "dda", "dda-mask");
        fromDir.Document.Strategies[1].Value("iterations.mean").Should().Be(12);
        fromDir.Document.Strategies[2].Value("subgroup32.simd-efficiency").Should().Be(0.45);
        fromDir.Document.Metrics.Should().BeEquivalentTo(ReportFixtures.Standard().Metrics, o => o.WithStrictOrdering());
    }

    [Fact]
    public void A_missing_report_is_named_in_the_error()
    {
        using var tmp = new TempDir();
        var act = () => ReportLoader.Load(tmp.Path);

        act.Should().Throw<InputException>().Which.Message.Should()
            .Contain(Path.Combine(tmp.Path, "report.json")).And.Contain("not found");
    }

    [Fact]
    public void Malformed_json_names_the_file_and_the_line()
    {
        using var tmp = new TempDir();
        var file = Path.Combine(tmp.Path, "report.json");
        File.WriteAllText(file, "{\n  \"schemaVersion\": 1,\n  \"toolVersion\": oops\n}");

        var ex = Assert.Throws<InputException>(() => ReportLoader.Load(file));

        ex.Message.Should().StartWith(file + ": line 3, position").And.Contain("malformed JSON");
        ex.Message.Should().NotContain("\n");
    }

    [Fact]
    public void Truncated_json_says_so()
    {
        using var tmp = new TempDir();
        var dir = ReportFixtures.Write(tmp, "base", ReportFixtures.Standard());
        var file = Path.Combine(dir, "report.json");
        var text = File.ReadAllText(file);
        File.WriteAllText(file, text[..(text.Length / 2)]);

        var ex = Assert.Throws<InputException>(() => ReportLoader.Load(file));

        ex.Message.Should().StartWith(file + ": line ").And.Contain("truncated");
        ex.Message.Should().NotContain("\n");
    }

    [Theory]
    [InlineData(9, "a newer")]
    [InlineData(1, "an older")]
    public void A_report_of_another_schema_is_refused_with_both_versions(int version, string age)
    {
        using var tmp = new TempDir();
        var dir = ReportFixtures.Write(tmp, "base", ReportFixtures.Standard() with { SchemaVersion = version });

        var ex = Assert.Throws<InputException>(() => ReportLoader.Load(dir));

        ex.Message.Should().Be($"{Path.Combine(dir, "report.json")}: $.schemaVersion: report schema {version} (written by {age} voxprof) " +
            $"is not read by this voxprof, which reads schema {ReportDocument.CurrentSchema} only; trace both runs with one voxprof version");
    }

    [Fact]
    public void A_written_report_round_trips_through_the_loader_to_an_equal_document()
    {
        using var tmp = new TempDir();
        var doc = ReportFixtures.Report([.. ReportFixtures.Standard().Strategies, ReportFixtures.Strategy("hdda", 9).With(ReportFixtures.Facts(mismatch: null))]);
        var dir = ReportFixtures.Write(tmp, "base", doc);

        var back = ReportLoader.Load(dir).Document;

        back.Should().BeEquivalentTo(doc);
        back.Strategies[^1].Value("mismatch").Should().BeNull("a mismatch that was not checked stays null, not 0");
        ReportJson.Serialize(back).Should().Be(ReportJson.Serialize(doc));
    }

    [Theory]
    [InlineData("\"name\": \"iterations.mean\"", "\"name\": \"Iterations Mean\"", "$.metrics[1].name: 'Iterations Mean' is not a metric name")]
    [InlineData("\"name\": \"iterations.p50\"", "\"name\": \"iterations.mean\"", "$.metrics[2].name: metric 'iterations.mean' appears twice")]
    [InlineData("\"numberFormat\": \"0.00\"", "\"numberFormat\": \"{0}\"", "$.metrics[1].numberFormat: '{0}' is not a number format")]
    [InlineData("\"better\": \"higher\"", "\"better\": \"up\"", "expected lower, higher or neutral")]
    [InlineData("\"hit-rate\": 0.75", "\"hitrate\": 0.75", "$.strategies[0].values: 'hitrate' is not in $.metrics")]
    public void A_bad_metric_list_or_value_key_is_refused_naming_its_place(string find, string replace, string message)
    {
        using var tmp = new TempDir();
        var dir = ReportFixtures.Write(tmp, "base", ReportFixtures.Standard());
        var file = Path.Combine(dir, "report.json");
        var text = File.ReadAllText(file);
        int at = text.IndexOf(find, StringComparison.Ordinal);
        at.Should().BeGreaterThan(0);
        File.WriteAllText(file, text[..at] + replace + text[(at + find.Length)..]);

        var ex = Assert.Throws<InputException>(() => ReportLoader.Load(file));

        ex.Message.Should().StartWith(file + ": ").And.Contain(message);
        ex.Message.Should().NotContain("\n");
    }

    [Fact]
    public void A_missing_field_is_named_with_its_json_path()
    {
        using var tmp = new TempDir();
        var dir = ReportFixtures.Write(tmp, "base", ReportFixtures.Standard());
        var file = Path.Combine(dir, "report.json");
        var text = File.ReadAllText(file).Replace("\"fovDegrees\": 60", "\"fov\": 60", StringComparison.Ordinal);
        File.WriteAllText(file, text);

        var ex = Assert.Throws<InputException>(() => ReportLoader.Load(file));

        ex.Message.Should().StartWith(file + ": $.camera").And.Contain("missing field").And.Contain("fovDegrees");
    }

    [Fact]
    public void A_null_list_is_refused_rather_than_crashing_later()
    {
        using var tmp = new TempDir();
        var file = Path.Combine(tmp.Path, "report.json");
        var node = System.Text.Json.Nodes.JsonNode.Parse(ReportJson.Serialize(ReportFixtures.Standard()))!;
        node["strategies"]![0]!["files"] = null;
        File.WriteAllText(file, node.ToJsonString());

        var ex = Assert.Throws<InputException>(() => ReportLoader.Load(file));

        ex.Message.Should().Contain("$.strategies[0].files").And.Contain("expected a value, found null");
    }

    [Fact]
    public void A_value_of_the_wrong_type_is_named_with_its_json_path()
    {
        using var tmp = new TempDir();
        var file = Path.Combine(tmp.Path, "report.json");
        var node = System.Text.Json.Nodes.JsonNode.Parse(ReportJson.Serialize(ReportFixtures.Standard()))!;
        node["run"]!["width"] = "wide";
        File.WriteAllText(file, node.ToJsonString());

        var ex = Assert.Throws<InputException>(() => ReportLoader.Load(file));

        ex.Message.Should().StartWith(file + ": $.run.width").And.Contain("wrong type");
    }

    [Fact]
    public void An_empty_file_is_called_truncated_or_empty()
    {
        using var tmp = new TempDir();
        var file = Path.Combine(tmp.Path, "report.json");
        File.WriteAllText(file, "");

        var ex = Assert.Throws<InputException>(() => ReportLoader.Load(tmp.Path));

        ex.Message.Should().Be($"{file}: line 1, position 1: truncated or empty JSON: the text ends before the report does");
    }

    [Fact]
    public void A_strategy_listed_twice_is_refused()
    {
        using var tmp = new TempDir();
        var dir = ReportFixtures.Write(tmp, "base", ReportFixtures.Report(ReportFixtures.Strategy("dda", 1), ReportFixtures.Strategy("DDA", 2)));

        var ex = Assert.Throws<InputException>(() => ReportLoader.Load(dir));

        ex.Message.Should().Contain("$.strategies[1].name").And.Contain("twice");
    }
}
