using System.Text.Json;
using System.Text.Json.Serialization.Metadata;
using FluentAssertions;
using VoxProf.Core.Statistics;
using VoxProf.Reports.Export;
using VoxProf.Reports.Html;
using VoxProf.Reports.Model;
using Xunit;

namespace VoxProf.Tests.Reports;

/// <summary>
/// The reports' JSON contracts are generated at build time (DocumentJson); the files must stay byte for byte what
/// System.Text.Json's reflection-based contracts (DefaultJsonTypeInfoResolver, the library's own reference behaviour)
/// write with the same options: names, order, omitted nulls, escaping.
/// </summary>
public class GeneratedJsonTests
{
    private static JsonSerializerOptions ByReflection(JsonSerializerOptions options) =>
        new(options) { TypeInfoResolver = new DefaultJsonTypeInfoResolver() };

    [Theory]
    [InlineData(true, false)]
    [InlineData(false, true)]
    public void Report_json_is_what_reflection_writes(bool memory, bool calibrated)
    {
        var run = TestRuns.Small(memory: memory);
        ReportOptions options = calibrated ? TestRuns.Options with { Calibration = TestRuns.Calibration } : TestRuns.Options;
        ReportDocument doc = ReportBuilder.Build(run, StrategyStatistics.Compute(run), options);

        string generated = ReportJson.Serialize(doc);

        generated.Should().Be(JsonSerializer.Serialize(doc, ByReflection(ReportJson.Options)) + "\n");
        // Both ways of the fields left out when null (the memory model's, the calibration's) are exercised.
        generated.Contains("\"memory\": {").Should().Be(memory);
        generated.Contains("lab card A").Should().Be(calibrated);
        // Read back through the generated contracts: the same document, written again, is the same text.
        var back = JsonSerializer.Deserialize<ReportDocument>(generated, ReportJson.Options)!;
        ReportJson.Serialize(back).Should().Be(generated);
    }

    [Fact]
    public void The_page_data_and_the_manifest_are_what_reflection_writes()
    {
        PixelBlock block = PixelBlock.Build(TestRuns.Small());
        var manifest = new ReportManifest("voxprof", "0.1.0-test", "run-1", [new ManifestFile("report.json", 12, "ab"), new ManifestFile("a<b>.png", 3, "cd")]);
        var pageOptions = new JsonSerializerOptions(JsonSerializerDefaults.Web) { Encoder = System.Text.Encodings.Web.JavaScriptEncoder.Default };
        var manifestOptions = new JsonSerializerOptions(JsonSerializerDefaults.Web) { WriteIndented = true };

        HtmlText.JsonData(block.Data).Should().Be(JsonSerializer.Serialize(block.Data, ByReflection(pageOptions)));
        System.Text.Encoding.UTF8.GetString(manifest.ToJson()).Should().Be(JsonSerializer.Serialize(manifest, ByReflection(manifestOptions)));
    }
}
