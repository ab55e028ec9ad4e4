using System.Numerics;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;

namespace VoxProf.Tests.Scenes;

public class SceneLoaderTests
{
    [Fact]
    public void Every_layer_kind_is_read_with_its_parameters()
    {
        using var file = TempScene.With(
            "{'kind': 'terrain', 'material': 1, 'seed': 4, 'amplitude': 10, 'baseHeight': 8, 'frequency': 0.05, 'footprint': {'min': [2, 3], 'max': [40, 50]}}," +
            "{'kind': 'box', 'material': 2, 'min': [0.6, 0, 0], 'max': [3.5, 1, 1]}," +
            "{'kind': 'sphere', 'op': 'carve', 'center': [10, 10, 10], 'radius': 4}," +
            "{'kind': 'cylinder', 'material': 3, 'axis': 'z', 'base': [5, 5, 0], 'radius': 2, 'length': 9}," +
            "{'kind': 'caves', 'op': 'carve', 'seed': 8, 'threshold': 0.1, 'frequency': 0.1, 'shape': 'chambers', 'region': {'min': [0, 0, 0], 'max': [8, 8, 8]}}," +
            "{'kind': 'scatter', 'material': 4, 'seed': 1, 'count': 25, 'size': [1, 3], 'label': 'grit'}");
        Scene scene = SceneLoader.Load(file.Path);

        scene.Name.Should().Be("test");
        scene.SourcePath.Should().Be(file.Path);
        scene.Layers.Select(l => l.Kind).Should().Equal("terrain", "box", "sphere", "cylinder", "caves", "scatter");
        var terrain = (TerrainLayer)scene.Layers[0];
        terrain.Settings.Should().Be(new TerrainSettings(4, 5, 0.05, 10, 8, 0.5, 2.0));
        terrain.Bounds.Should().Be(new Box3i(2, 0, 3, 40, 24, 50));
        // Voxel centres 1.5, 2.5 and 3.5 lie in [0.6, 3.5]; 0.5 does not.
        scene.Layers[1].Bounds.Should().Be(new Box3i(1, 0, 0, 4, 1, 1));
        scene.Layers[2].Op.Should().Be(LayerOp.Carve);
        scene.Layers[2].Material.Should().Be(0);
        ((CylinderLayer)scene.Layers[3]).Axis.Should().Be(Axis.Z);
        ((CavesLayer)scene.Layers[4]).Settings.Shape.Should().Be(CaveShape.Chambers);
        ((ScatterLayer)scene.Layers[5]).Clumps.Should().HaveCount(25);
        scene.Layers[5].Label.Should().Be("grit");
        scene.Layers[0].Label.Should().BeNull();
        scene.Cameras.Should().ContainSingle().Which.Should().Be(
            new CameraSpec("cam", new Vector3(1, 2, 3), new Vector3(10, 2, 10), Vector3.UnitY, 60));
    }

    [Fact]
    public void Later_layers_override_earlier_ones()
    {
        using var file = TempScene.With(
            "{'kind': 'box', 'material': 2, 'min': [0, 0, 0], 'max': [10, 10, 10]}," +
            "{'kind': 'box', 'op': 'carve', 'min': [2, 2, 2], 'max': [4, 4, 4]}," +
            "{'kind': 'box', 'material': 7, 'min': [3, 3, 3], 'max': [5, 5, 5]}");
        Scene scene = SceneLoader.Load(file.Path);
        scene.EvaluateMaterial(0, 0, 0).Should().Be(2);
        scene.EvaluateMaterial(2, 2, 2).Should().Be(0);
        scene.EvaluateMaterial(3, 3, 3).Should().Be(7);
        scene.EvaluateMaterial(4, 4, 4).Should().Be(7);
        scene.EvaluateMaterial(11, 0, 0).Should().Be(0);
    }

    [Fact]
    public void Comments_are_allowed_and_the_name_drops_the_whole_extension()
    {
        using var file = new TempScene(
            "// A scene with a comment.\n{'extent': [4, 4, 4], /* inline */ 'layers': [], 'cameras': [" + TempScene.Camera + "]}",
            "little-yard.vpscene.json");
        SceneLoader.Load(file.Path).Name.Should().Be("little-yard");
        SceneLoader.NameOf("dir/other.json").Should().Be("other");
    }

    [Fact]
    public void Editing_the_file_changes_the_content_hash()
    {
        using var a = TempScene.With("{'kind': 'box', 'material': 2, 'min': [0, 0, 0], 'max': [10, 10, 10]}");
        using var b = TempScene.With("{'kind': 'box', 'material': 3, 'min': [0, 0, 0], 'max': [10, 10, 10]}");
        using var c = TempScene.With("{'kind': 'box', 'material': 2, 'min': [0, 0, 0], 'max': [10, 10, 10]}");
        string ha = SceneLoader.Load(a.Path).ContentHash!;
        ha.Should().NotBe(SceneLoader.Load(b.Path).ContentHash);
        ha.Should().Be(SceneLoader.Load(c.Path).ContentHash);
    }
}
