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
        fromDir.Document.Strategies[1].Counters[0].Mean.Should().Be(12);
        fromDir.Document.Strategies[2].Waves[0].SimdEfficiency.Should().Be(0.45);
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

    [Fact]
    public void An_unknown_schema_version_is_refused_with_the_version_read()
    {
        using var tmp = new TempDir();
        var dir = ReportFixtures.Write(tmp, "base", ReportFixtures.Standard() with { SchemaVersion = 9 });

        var ex = Assert.Throws<InputException>(() => ReportLoader.Load(dir));

        ex.Message.Should().Contain("schema 9").And.Contain($"reads schema 1..{ReportDocument.CurrentSchema}");
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
        node["strategies"]![0]!["counters"] = null;
        File.WriteAllText(file, node.ToJsonString());

        var ex = Assert.Throws<InputException>(() => ReportLoader.Load(file));

        ex.Message.Should().Contain("$.strategies[0].counters").And.Contain("expected a value, found null");
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
