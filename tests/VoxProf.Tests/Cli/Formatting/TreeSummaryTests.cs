using System.Globalization;
using System.Numerics;
using System.Text.Json;
using VoxProf.Cli.Formatting;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;
using VoxProf.Tests.Trees;

namespace VoxProf.Tests.Cli.Formatting;

public class TreeSummaryTests
{
    // A 20 x 10 x 20 scene with a slab 5 voxels thick: 2,000 solid voxels, countable by hand.
    private static (Scene Scene, BrickTree Tree) Slab(int branching)
    {
        var extent = new Box3i(0, 0, 0, 20, 10, 20);
        Scene scene = new(20, 10, 20, [new BoxLayer(LayerOp.Add, 1, new Box3i(0, 0, 0, 20, 5, 20), extent)],
            [new CameraSpec("side", new Vector3(-5, 2.5f, 10), new Vector3(10, 2.5f, 10), Vector3.UnitY, 50)], "slab");
        BrickTree built = TreeBuilder.Build(scene, branching, threads: 1);
        // Fix the one measured value so the output can be compared whole.
        var tree = new BrickTree(built.Branching, built.Depth, built.ExtentX, built.ExtentY, built.ExtentZ,
            built.Nodes, built.Materials, built.Stats with { BuildTime = TimeSpan.FromMilliseconds(12.5) });
        return (scene, tree);
    }

    // The census of the one layer, with its measured time fixed.
    private static LayerTally[] Census(Scene scene) =>
        [.. LayerCensus.Run(scene, threads: 1).Select(t => t with { Voxelise = TimeSpan.FromMilliseconds(3.5) })];

    // Worked by hand: the root's cells are 16 wide, so the slab touches 4 of them (x and z below 20, y below 16).
    // Their 4-wide cells: a full layer y 0..3 (16 + 4 + 4 + 1 = 25 solid cells) and a layer y 4..7 holding the slab's
    // last row (25 leaves of 16 solid voxels each). 25 · 64 + 400 = 2000 voxels; bytes = nodes · 24 + solid cells.
    private const string ExpectedText = """
        scene                  slab
        extent                 20 x 10 x 20 voxels
        tree                   branching 4, depth 3, root side 64

        level  cell side         nodes   solid cells           bytes
            0         16             1             0              24
            1          4             4            25             121
            2          1            25           400            1000
        total                       30           425            1145

        solid voxels           2000
        bytes per solid voxel  0.5725
        build time             12.5 ms
        voxelise time          3.5 ms (time in the layers' Classify and Fill, summed over threads)
        load time              0.0 ms (reading and preparing the layers)

        layer  kind       label                     file                  op             voxels    load ms  voxelise ms  details
            0  test-box   -                         -                     add              2000        0.0          3.5

        camera            eye                     target                  up                fovY
        side              -5, 2.5, 10             10, 2.5, 10             0, 1, 0           50

        """;

    [Fact]
    public void Text_summary_lists_every_level_and_the_totals()
    {
        (Scene scene, BrickTree tree) = Slab(4);
        TreeSummary.Text(scene, tree, Census(scene)).ReplaceLineEndings("\n").Should().Be(ExpectedText);
    }

    [Fact]
    public void Text_summary_is_the_same_under_a_comma_decimal_culture()
    {
        (Scene scene, BrickTree tree) = Slab(4);
        CultureInfo saved = CultureInfo.CurrentCulture;
        try
        {
            CultureInfo.CurrentCulture = CultureInfo.GetCultureInfo("de-DE");
            TreeSummary.Text(scene, tree, Census(scene)).ReplaceLineEndings("\n").Should().Be(ExpectedText);
        }
        finally
        {
            CultureInfo.CurrentCulture = saved;
        }
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    public void Json_summary_carries_the_same_numbers(int branching)
    {
        (Scene scene, BrickTree tree) = Slab(branching);
        using JsonDocument doc = JsonDocument.Parse(TreeSummary.Json(scene, tree, Census(scene)));
        JsonElement root = doc.RootElement;
        root.GetProperty("scene").GetString().Should().Be("slab");
        root.GetProperty("extent").EnumerateArray().Select(e => e.GetInt32()).Should().Equal(20, 10, 20);
        root.GetProperty("branching").GetInt32().Should().Be(branching);
        root.GetProperty("solidVoxels").GetInt64().Should().Be(2000);
        root.GetProperty("nodes").GetInt64().Should().Be(tree.Nodes.Length);
        root.GetProperty("solidCells").GetInt64().Should().Be(tree.Materials.Length);
        root.GetProperty("totalBytes").GetInt64().Should().Be(24L * tree.Nodes.Length + tree.Materials.Length);
        root.GetProperty("bytesPerSolidVoxel").GetDouble().Should().BeApproximately(tree.Stats.TotalBytes / 2000.0, 1e-4);
        root.GetProperty("buildMilliseconds").GetDouble().Should().Be(12.5);
        JsonElement[] levels = [.. root.GetProperty("levels").EnumerateArray()];
        levels.Should().HaveCount(tree.Depth);
        levels.Sum(l => l.GetProperty("nodes").GetInt64()).Should().Be(tree.Nodes.Length);
        levels[^1].GetProperty("cellSide").GetInt32().Should().Be(1);
        root.GetProperty("voxeliseMilliseconds").GetDouble().Should().Be(3.5);
        JsonElement layer = root.GetProperty("layers").EnumerateArray().Single();
        (layer.GetProperty("kind").GetString(), layer.GetProperty("voxels").GetInt64(), layer.GetProperty("op").GetString())
            .Should().Be(("test-box", 2000L, "add"));
        root.GetProperty("cameras")[0].GetProperty("eye").EnumerateArray().Select(e => e.GetSingle()).Should().Equal(-5f, 2.5f, 10f);
    }
}
