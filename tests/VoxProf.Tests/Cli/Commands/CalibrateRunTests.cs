using System.Globalization;
using System.Text.Json.Nodes;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>calibrate given a run of several views uses each view, as if each view's folder had been given.</summary>
public sealed class CalibrateRunTests : IDisposable
{
    private readonly CliScratch _scratch = new(
        "{'kind': 'box', 'material': 1, 'min': [0, 0, 0], 'max': [64, 6, 64]},{'kind': 'sphere', 'material': 2, 'center': [30, 12, 34], 'radius': 9}",
        "{'name': 'yard', 'eye': [2, 20, 2], 'target': [40, 8, 40]}," +
        "{'name': 'walk', 'path': {'frames': 3, 'keys': [{'eye': [4, 12, 60], 'target': [30, 10, 30]}, {'eye': [60, 14, 40], 'target': [30, 10, 30]}]}}");

    public void Dispose() => _scratch.Dispose();

    [Fact]
    public void Every_view_of_a_run_is_one_measured_view()
    {
        string run = _scratch.Out("run");
        CliScratch.Run("trace", _scratch.Scene.Path, "--camera", "all", "--size", "32x18", "-q", "--no-html", "--no-pixels",
            "--strategy", "slab,dda,dda-mask", "-o", run).Code.Should().Be(0);
        var lines = new List<string> { "scene,camera,strategy,gpu-ms" };
        foreach (JsonNode? view in JsonNode.Parse(File.ReadAllText(Path.Combine(run, "report.json")))!["views"]!.AsArray())
        {
            var report = JsonNode.Parse(File.ReadAllText(Path.Combine(run, view!["folder"]!.GetValue<string>(), "report.json")))!;
            foreach (JsonNode? s in report["strategies"]!.AsArray())
            {
                double ms = 0.01 + 0.002 * s!["values"]!["total-iterations.mean"]!.GetValue<double>();
                lines.Add(string.Create(CultureInfo.InvariantCulture, $"test,{view["name"]},{s["name"]},{ms:R}"));
            }
        }
        string times = _scratch.Out("times.csv");
        File.WriteAllLines(times, lines);

        var result = CliScratch.Run("calibrate", times, run, "--device", "test card", "-o", _scratch.Out("cal"));

        result.Code.Should().Be(0, result.Err);
        result.Out.Should().StartWith("calibration for test card from 12 views");
        JsonNode.Parse(File.ReadAllText(Path.Combine(_scratch.Out("cal"), "calibration.json")))!["rows"]!.AsArray()
            .Select(r => r!["camera"]!.GetValue<string>()).Distinct().Should().Equal("yard", "walk#000", "walk#001", "walk#002");
    }
}
