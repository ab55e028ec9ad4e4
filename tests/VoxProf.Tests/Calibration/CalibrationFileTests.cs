using System.Text.Json.Nodes;
using VoxProf.Core;
using VoxProf.Core.Calibration;
using VoxProf.Core.Statistics;
using VoxProf.Reports.Calibration;
using VoxProf.Reports.Export;
using VoxProf.Tests.Compare;

namespace VoxProf.Tests.Calibration;

public sealed class CalibrationFileTests : IDisposable
{
    private readonly TempDir _tmp = new();

    public void Dispose() => _tmp.Dispose();

    private static CalibrationDocument Document() => new(
        CalibrationDocument.CurrentSchema, "0.1.0-test", "lab card A, driver 9.1", ["total-iterations", "slab-tests"],
        new CalibrationScope([4], ["1280x720", "640x360"], [0, 4], ["harbour"], 12),
        [new CostEntry("pixels", "pixel", 12.5) { Share = 0.2 }, new CostEntry("total-iterations", "count", 0.75) { Share = 0.7 },
            new CostEntry("slab-tests", "count", 0) { Share = 0 }],
        new FitSummary(0.98, 0.05, 0.95, 0.08, 2.5, 14.2, true),
        [],
        [new CalibrationRowEntry(2, "harbour", "pier", "dda", 0, 4, "1280x720", "runs/pier/report.json", 2.5, 2.45, 0.05, 2.4, 0.1) { Note = "warm" }]);

    private string WriteJson(string text)
    {
        string path = Path.Combine(_tmp.Path, "calibration.json");
        File.WriteAllText(path, text);
        return path;
    }

    private string ErrorOf(string json) =>
        FluentActions.Invoking(() => CalibrationFile.Read(WriteJson(json))).Should().Throw<InputException>().Which.Message;

    private static string Edited(Action<JsonNode> edit)
    {
        var node = JsonNode.Parse(CalibrationFile.Serialize(Document()))!;
        edit(node);
        return node.ToJsonString();
    }

    [Fact]
    public void Written_files_read_back_to_the_model_they_describe()
    {
        IReadOnlyList<string> written;
        using (OutputDirectory output = OutputDirectory.Open(_tmp.Path))
        {
            written = CalibrationFile.Write(output, Document());
            output.Commit();
        }

        written.Should().Equal("calibration.json", "calibration.md");
        var applied = CalibrationFile.Read(_tmp.Path);
        applied.Model.Device.Should().Be("lab card A, driver 9.1");
        applied.Model.Terms.Select(t => (t.Name, t.Nanoseconds)).Should().Equal(("pixels", 12.5), ("total-iterations", 0.75), ("slab-tests", 0.0));
        applied.Model.Terms[1].Measure.Should().BeSameAs(Measures.TotalIterations);
        applied.Model.FittedOn.Branchings.Should().Equal(4);
        applied.Model.FittedOn.Sizes.Should().Equal(new ImageSize(1280, 720), new ImageSize(640, 360));
        applied.Info.Features.Should().Equal("total-iterations", "slab-tests");
        string md = File.ReadAllText(Path.Combine(_tmp.Path, "calibration.md"));
        md.Should().StartWith("# VoxProf calibration: lab card A, driver 9.1\n")
            .And.Contain("| `total-iterations` | 0.75 | count | 70.0% |")
            .And.Contain("| 2 | harbour | pier | dda | off | 4 | 1280x720 | 2.5 | 2.45 | 0.05 | 2.4 | 0.1 |")
            .And.Contain("- R² 0.9800");
    }

    [Fact]
    public void An_unknown_feature_is_named_with_its_JSON_path_and_the_valid_ones()
    {
        string json = Edited(n => n["costs"]![1]!["feature"] = "dram-pages");
        ErrorOf(json).Should().StartWith(Path.Combine(_tmp.Path, "calibration.json") + ": $.costs[1].feature: 'dram-pages' is not a measure this voxprof counts; expected pixels or one of: iterations,");
    }

    [Fact]
    public void A_calibration_pricing_cache_lines_is_refused_by_a_trace_with_the_memory_model_off()
    {
        string path = WriteJson(Edited(n => n["costs"]![1]!["feature"] = "cache-lines"));
        CalibrationFile.Read(path).Model.Terms[1].Name.Should().Be("cache-lines", "cache-lines is a feature like any counter");
        var output = new StringWriter();
        var error = new StringWriter();
        int code = VoxProf.Cli.Cli.Run(["trace", "missing-scene.json", "--memory", "off", "--calibration", path], output, error);
        code.Should().Be(VoxProf.Cli.ExitCodes.BadInput);
        error.ToString().Should().Be("voxprof: error: --calibration: prices cache-lines, which comes from the memory model, which --memory off turns off; drop one of them\n");
    }

    [Fact]
    public void Prepass_skip_cannot_be_priced_since_it_counts_distance_saved()
    {
        ErrorOf(Edited(n => n["costs"]![2]!["feature"] = "prepass-skip")).Should().Contain("$.costs[2].feature: 'prepass-skip' is not a measure");
    }

    [Theory]
    [InlineData("negative", "$.costs[0].nanoseconds: -1; expected a cost of 0 or more")]
    [InlineData("twice", "$.costs[2].feature: 'pixels' is priced twice")]
    [InlineData("device", "$.device: empty; expected the GPU and driver")]
    [InlineData("size", "$.fittedOn.sizes[0]: '1280'; expected WxH")]
    [InlineData("schema", "$.schemaVersion: 7 is not read by this voxprof, which reads calibration schema 1")]
    [InlineData("missing", "missing field")]
    public void Damaged_files_are_one_line_naming_the_place(string damage, string message)
    {
        string json = Edited(n =>
        {
            switch (damage)
            {
                case "negative": n["costs"]![0]!["nanoseconds"] = -1; break;
                case "twice": n["costs"]![2]!["feature"] = "pixels"; break;
                case "device": n["device"] = " "; break;
                case "size": n["fittedOn"]!["sizes"]![0] = "1280"; break;
                case "schema": n["schemaVersion"] = 7; break;
                default: n.AsObject().Remove("costs"); break;
            }
        });

        ErrorOf(json).Should().StartWith(Path.Combine(_tmp.Path, "calibration.json") + ": ").And.Contain(message).And.NotContain("\n");
    }

    [Fact]
    public void A_truncated_file_or_a_missing_one_is_one_line()
    {
        ErrorOf(CalibrationFile.Serialize(Document())[..200]).Should().Contain("malformed JSON").And.NotContain("\n");
        string missing = Path.Combine(_tmp.Path, "none.json");
        FluentActions.Invoking(() => CalibrationFile.Read(missing)).Should().Throw<InputException>()
            .WithMessage($"{missing}: not found (expected a calibration.json written by `voxprof calibrate`)");
    }
}
