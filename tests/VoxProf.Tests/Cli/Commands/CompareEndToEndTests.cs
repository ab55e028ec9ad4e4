using System.Text.Json;
using System.Text.Json.Nodes;
using StbImageSharp;
using VoxProf.Cli;
using VoxProf.Tests.Compare;
using VoxProf.Tests.Reports;

namespace VoxProf.Tests.Cli.Commands;

/// <summary>
/// The real pipeline: trace a scene, trace it again with a scatter layer added far from the camera, compare.
/// Small images keep it to a few seconds.
/// </summary>
public sealed class CompareEndToEndTests : IDisposable
{
    // A walled yard seen from its gate: a floor slab and a far back wall, nothing between.
    private const string Yard = """
        {
          "version": 1,
          "description": "A walled yard seen from its gate.",
          "extent": [64, 64, 64],
          "layers": [
            {"kind": "box", "label": "floor", "material": 1, "min": [0, 0, 0], "max": [64, 4, 64]},
            {"kind": "box", "label": "back wall", "material": 2, "min": [0, 4, 60], "max": [64, 40, 64]}
          ],
          "cameras": [
            {"name": "gate", "eye": [32, 20, 1], "target": [32, 16, 63], "up": [0, 1, 0], "fovY": 60}
          ]
        }
        """;

    private readonly TempDir _tmp = new();
    private readonly StringWriter _out = new();
    private readonly StringWriter _err = new();

    public void Dispose() => _tmp.Dispose();

    private string P(string name) => Path.Combine(_tmp.Path, name);

    private void Trace(string scene, string outDir)
    {
        var code = VoxProf.Cli.Cli.Run(["trace", scene, "--size", "48x32", "--strategy", "grid,dda,hdda", "--out", outDir, "--quiet", "--threads", "2"], _out, _err);
        code.Should().Be(ExitCodes.Ok, _err.ToString());
    }

    private (string Base, string Candidate) TraceBoth()
    {
        File.WriteAllText(P("yard.vpscene.json"), Yard);
        var dusty = JsonNode.Parse(Yard)!;
        // Dust in the far third of the yard, in front of the back wall: rays that crossed empty space now walk into it.
        dusty["layers"]!.AsArray().Add(JsonNode.Parse(
            """{"kind": "scatter", "label": "far dust", "material": 3, "seed": 5, "count": 300, "region": {"min": [0, 4, 40], "max": [64, 40, 60]}}"""));
        File.WriteAllText(P("dusty.vpscene.json"), dusty.ToJsonString());
        Trace(P("yard.vpscene.json"), P("base"));
        Trace(P("dusty.vpscene.json"), P("candidate"));
        return (P("base"), P("candidate"));
    }

    private int Compare(string a, string b, params string[] rules) =>
        VoxProf.Cli.Cli.Run(["compare", a, b, "--out", P("cmp"), .. rules.SelectMany(r => new[] { "--fail-on", r })], _out, _err);

    private static double Change(JsonElement root, string strategy, string metric) =>
        root.GetProperty("changes").EnumerateArray()
            .Single(c => c.GetProperty("strategy").GetString() == strategy && c.GetProperty("metric").GetString() == metric)
            .GetProperty("change").GetDouble();

    [Fact]
    public void Far_scatter_raises_the_tree_walk_counters_and_a_tight_rule_fails_while_a_loose_one_passes()
    {
        var (a, b) = TraceBoth();

        Compare(a, b, "dda.iterations.mean:5%").Should().Be(ExitCodes.RuleBroken, _err.ToString());
        _out.ToString().Should().Contain("scene content differs").And.Contain("broken: dda.iterations.mean:5%");

        using (var json = JsonDocument.Parse(File.ReadAllText(P("cmp/compare.json"))))
        {
            var root = json.RootElement;
            root.GetProperty("sceneChanged").GetBoolean().Should().BeTrue();
            // Rays that crossed empty space in a few big steps now go down into the dust's nodes and back up.
            foreach (var strategy in new[] { "dda", "hdda" })
            {
                Change(root, strategy, "iterations.mean").Should().BePositive();
                Change(root, strategy, "descents.total").Should().BePositive();
                Change(root, strategy, "ascents.total").Should().BePositive();
                Change(root, strategy, "subgroup32.tile-max-mean").Should().BePositive();
            }
        }

        _out.GetStringBuilder().Clear();
        Compare(a, b, "dda.iterations.mean:1000%", "hdda.iterations.mean:1000%").Should().Be(ExitCodes.Ok, _err.ToString());
        _out.ToString().Should().Contain("verdict: pass");
    }

    [Fact]
    public void A_traced_report_compared_with_itself_has_no_change_and_passes()
    {
        File.WriteAllText(P("yard.vpscene.json"), Yard);
        Trace(P("yard.vpscene.json"), P("base"));

        Compare(P("base"), P("base")).Should().Be(ExitCodes.Ok, _err.ToString());

        using var json = JsonDocument.Parse(File.ReadAllText(P("cmp/compare.json")));
        json.RootElement.GetProperty("changes").EnumerateArray().Should().OnlyContain(c => c.GetProperty("change").GetDouble() == 0);
        json.RootElement.GetProperty("sceneChanged").GetBoolean().Should().BeFalse();
        var png = PngPicture.Read(P("cmp/diff-dda-iterations.png")).CropRgb();
        png.Width.Should().Be(48);
    }

    [Fact]
    public void The_dust_shows_in_the_difference_heatmap_as_changed_hits()
    {
        var (a, b) = TraceBoth();

        Compare(a, b, "all.iterations.mean:1000%").Should().Be(ExitCodes.Ok, _err.ToString());

        _out.ToString().Should().MatchRegex(@"note: dda: [1-9][0-9]* pixels hit a different voxel");
        var names = Directory.GetFiles(P("cmp"), "diff-*.png").Select(Path.GetFileName);
        names.Should().BeEquivalentTo(new[] { "grid", "dda", "hdda" }
            .SelectMany(s => new[] { "iterations", "subgroup32", "subgroup64" }.Select(m => $"diff-{s}-{m}.png")));
    }
}
