using VoxProf.Core;
using VoxProf.Core.Scenes;

namespace VoxProf.Tests.Scenes;

public class SceneLoaderErrorTests
{
    private static SceneFormatException Reject(TempScene scene)
    {
        using (scene)
        {
            var act = () => SceneLoader.Load(scene.Path);
            var ex = act.Should().Throw<SceneFormatException>().Which;
            ex.File.Should().Be(scene.Path);
            ex.Message.Should().StartWith(scene.Path + ": " + ex.Where + ": ");
            return ex;
        }
    }

    [Fact]
    public void Malformed_json_reports_line_and_column()
    {
        var ex = Reject(new TempScene("{\n  'extent': [4, 4, 4],\n  'layers' []\n}"));
        ex.Where.Should().Be("line 3, column 12");
        ex.Problem.Should().StartWith("malformed JSON");
    }

    [Fact]
    public void Unknown_layer_kind_lists_the_valid_kinds()
    {
        var ex = Reject(TempScene.With("{'kind': 'cone', 'material': 1}"));
        ex.Where.Should().Be("$.layers[0].kind");
        ex.Problem.Should().Be("expected one of: \"box\", \"sphere\", \"cylinder\", \"terrain\", \"caves\", \"scatter\", \"raw\", \"mesh\", \"heightmap\", found \"cone\"");
    }

    [Fact]
    public void Unknown_key_lists_the_valid_keys()
    {
        var ex = Reject(TempScene.With("{'kind': 'sphere', 'material': 1, 'center': [1, 1, 1], 'radus': 3}"));
        ex.Where.Should().Be("$.layers[0].radus");
        ex.Problem.Should().Be("unknown key; valid keys for a sphere layer: kind, op, material, label, center, radius");
    }

    [Fact]
    public void Unknown_top_level_key_is_rejected()
    {
        var ex = Reject(new TempScene("{'extent': [4, 4, 4], 'layers': [], 'cameras': [" + TempScene.Camera + "], 'colour': 1}"));
        ex.Where.Should().Be("$.colour");
        ex.Problem.Should().Contain("valid keys in a scene: version, description, extent, layers, cameras");
    }

    [Fact]
    public void Missing_field_names_its_path_and_what_was_expected()
    {
        var ex = Reject(TempScene.With("{'kind': 'box', 'material': 1, 'min': [0, 0, 0]}, {'kind': 'sphere', 'material': 1, 'center': [1, 1, 1]}"));
        ex.Where.Should().Be("$.layers[0].max");
        ex.Problem.Should().Be("missing; expected [x, y, z] upper corner");
    }

    [Fact]
    public void Wrong_type_names_the_value_found()
    {
        var ex = Reject(TempScene.With("{'kind': 'box', 'material': 1, 'min': [0, 0, 0], 'max': [1, 1, 1]}, {'kind': 'sphere', 'material': 1, 'center': [1, 1, 1], 'radius': 'big'}"));
        ex.Where.Should().Be("$.layers[1].radius");
        ex.Problem.Should().Be("expected a number > 0, found \"big\"");
    }

    [Theory]
    [InlineData("[64, 0, 64]", "$.extent[1]", "found 0")]
    [InlineData("[64, 32, 65537]", "$.extent[2]", "found 65537")]
    [InlineData("[-5, 32, 64]", "$.extent[0]", "found -5")]
    [InlineData("[64, 2.5, 64]", "$.extent[1]", "found 2.5")]
    [InlineData("[64, 64]", "$.extent", "found an array of 2")]
    public void Extent_outside_1_to_65536_is_rejected(string extent, string where, string found)
    {
        var ex = Reject(TempScene.With("", extent: extent));
        ex.Where.Should().Be(where);
        ex.Problem.Should().EndWith(found);
    }

    [Theory]
    [InlineData("0")]
    [InlineData("256")]
    [InlineData("-1")]
    public void Material_outside_1_to_255_is_rejected(string material)
    {
        var ex = Reject(TempScene.With($"{{'kind': 'box', 'material': {material}, 'min': [0, 0, 0], 'max': [1, 1, 1]}}"));
        ex.Where.Should().Be("$.layers[0].material");
        ex.Problem.Should().Be($"expected a material from 1 to 255, found {material}");
    }

    [Fact]
    public void Add_layer_without_material_is_rejected_and_carve_layer_with_one_too()
    {
        Reject(TempScene.With("{'kind': 'box', 'min': [0, 0, 0], 'max': [1, 1, 1]}"))
            .Where.Should().Be("$.layers[0].material");
        Reject(TempScene.With("{'kind': 'box', 'op': 'carve', 'material': 3, 'min': [0, 0, 0], 'max': [1, 1, 1]}"))
            .Problem.Should().StartWith("a carve layer takes no material");
    }

    [Fact]
    public void Number_that_overflows_to_infinity_is_rejected()
    {
        var ex = Reject(TempScene.With("{'kind': 'sphere', 'material': 1, 'center': [1, 1, 1e999], 'radius': 3}"));
        ex.Where.Should().Be("$.layers[0].center[2]");
        ex.Problem.Should().StartWith("number out of range; expected a number (finite");
    }

    [Fact]
    public void Missing_scene_file_is_reported()
    {
        string path = Path.Combine(Path.GetTempPath(), "voxprof-no-such-" + Guid.NewGuid().ToString("N") + ".vpscene.json");
        var ex = FluentActions.Invoking(() => SceneLoader.Load(path)).Should().Throw<SceneFormatException>().Which;
        ex.Where.Should().Be("$");
        ex.Problem.Should().Be($"scene file not found: {path}");
    }

    [Fact]
    public void Missing_raw_file_is_reported_at_its_key()
    {
        var ex = Reject(TempScene.With("{'kind': 'raw', 'material': 1, 'file': 'absent.raw', 'size': [2, 2, 2]}"));
        ex.Where.Should().Be("$.layers[0].file");
        ex.Problem.Should().StartWith("raw volume file not found: ").And.EndWith("absent.raw (paths are relative to the scene file's folder)");
    }

    [Fact]
    public void Raw_file_whose_size_disagrees_with_its_dimensions_is_rejected()
    {
        var scene = TempScene.With("{'kind': 'raw', 'material': 1, 'file': 'blob.raw', 'size': [4, 4, 4]}");
        scene.WriteSideFile("blob.raw", new byte[60]);
        var ex = Reject(scene);
        ex.Where.Should().Be("$.layers[0].file");
        ex.Problem.Should().Be("raw volume file blob.raw holds 60 bytes; expected 64 (4 × 4 × 4 from $.layers[0].size)");
    }

    [Fact]
    public void Camera_whose_eye_equals_its_target_is_rejected()
    {
        var ex = Reject(TempScene.With("", "{'name': 'a', 'eye': [1, 2, 3], 'target': [1, 2, 3]}"));
        ex.Where.Should().Be("$.cameras[0].target");
        ex.Problem.Should().Be("equals the eye; expected a point the camera looks at, away from the eye");
    }

    [Fact]
    public void Camera_with_a_zero_up_vector_is_rejected()
    {
        var ex = Reject(TempScene.With("", TempScene.Camera + ", {'name': 'b', 'eye': [1, 2, 3], 'target': [5, 2, 3], 'up': [0, 0, 0]}"));
        ex.Where.Should().Be("$.cameras[1].up");
        ex.Problem.Should().StartWith("zero vector");
    }

    [Fact]
    public void Camera_with_up_along_the_view_direction_is_rejected()
    {
        var ex = Reject(TempScene.With("", "{'name': 'down', 'eye': [5, 20, 5], 'target': [5, 0, 5]}"));
        ex.Where.Should().Be("$.cameras[0].target", "without an up key the default [0, 1, 0] is used, so the target is at fault");
        ex.Problem.Should().StartWith("the camera looks along the default up direction (0, 1, 0)");
        var opposite = Reject(TempScene.With("", "{'name': 'down', 'eye': [5, 20, 5], 'target': [5, 0, 5], 'up': [0, -2, 0]}"));
        opposite.Where.Should().Be("$.cameras[0].up");
        opposite.Problem.Should().Be("lies along the view direction (sine of the angle between them 0, below 0.001); expected an up direction across the view");
    }

    [Theory]
    [InlineData("'eye': [0, 20, 0], 'target': [32, 20, 32], 'up': [1e-30, 1e-30, 0]", "$.cameras[0].up", "has length 1.41E-30, which single precision cannot turn into a camera basis")]
    [InlineData("'eye': [0, 0, 0], 'target': [1e-30, 0, 0]", "$.cameras[0].target", "lies 1E-30 voxels from the eye, too close to give a view direction in single precision")]
    [InlineData("'eye': [0, 20, 0], 'target': [32, 20, 32], 'up': [1, 0.00003, 1]", "$.cameras[0].up", "lies along the view direction (sine of the angle between them 2.12E-05, below 0.001)")]
    public void Camera_vectors_too_short_or_too_close_to_the_view_for_a_float_basis_are_rejected(string camera, string where, string problem)
    {
        var ex = Reject(TempScene.With("", "{'name': 'tiny', " + camera + "}"));
        ex.Where.Should().Be(where);
        ex.Problem.Should().StartWith(problem);
    }

    [Fact]
    public void Scene_without_cameras_is_rejected()
    {
        var ex = Reject(new TempScene("{'extent': [4, 4, 4], 'layers': [], 'cameras': []}"));
        ex.Where.Should().Be("$.cameras");
        ex.Problem.Should().Be("empty; expected at least one camera (the first is the default)");
    }

    [Fact]
    public void Duplicate_keys_and_camera_names_are_rejected()
    {
        Reject(new TempScene("{'extent': [4, 4, 4], 'extent': [4, 4, 4], 'layers': [], 'cameras': [" + TempScene.Camera + "]}"))
            .Where.Should().Be("$.extent");
        Reject(TempScene.With("", TempScene.Camera + ", " + TempScene.Camera))
            .Where.Should().Be("$.cameras[1].name");
    }

    [Fact]
    public void Field_of_view_outside_1_to_179_degrees_is_rejected()
    {
        var ex = Reject(TempScene.With("", "{'name': 'a', 'eye': [1, 2, 3], 'target': [9, 2, 3], 'fovY': 180}"));
        ex.Where.Should().Be("$.cameras[0].fovY");
        ex.Problem.Should().Be("expected a vertical field of view from 1 to 179 degrees, found 180");
    }

    [Fact]
    public void Unsupported_version_and_a_non_object_root_are_rejected()
    {
        var ex = Reject(new TempScene("{'version': 2, 'extent': [4, 4, 4], 'layers': [], 'cameras': [" + TempScene.Camera + "]}"));
        ex.Where.Should().Be("$.version");
        ex.Problem.Should().Be("expected 1, found 2");
        Reject(new TempScene("[1, 2]")).Problem.Should().Be("expected an object holding a scene, found an array of 2");
    }

    [Theory]
    [InlineData("{'kind': 'box', 'material': 1, 'min': [0, 5, 0], 'max': [1, 1, 1]}",
        "$.layers[0].max", "max[1] is below min[1]; expected max ≥ min on every axis")]
    [InlineData("{'kind': 'scatter', 'material': 1, 'seed': 1, 'count': 3, 'region': {'min': [4, 0, 0], 'max': [4, 8, 8]}}",
        "$.layers[0].region.max", "max[0] is not above min[0]; expected a non-empty region (max > min)")]
    [InlineData("{'kind': 'scatter', 'material': 1, 'seed': 1, 'count': 3, 'size': [3, 2]}",
        "$.layers[0].size", "largest clump side is below the smallest; expected [smallest, largest]")]
    [InlineData("{'kind': 'scatter', 'material': 1, 'seed': 1, 'count': 3, 'size': [1, 65]}",
        "$.layers[0].size[1]", "expected an integer from 1 to 64, found 65")]
    [InlineData("{'kind': 'terrain', 'material': 1, 'seed': 1, 'frequency': 0.01, 'amplitude': 5, 'baseHeight': 3, 'footprint': {'min': [0, 0], 'max': [65536, 65536]}}",
        "$.layers[0].footprint", "footprint too large; expected at most 1073741824 columns")]
    [InlineData("{'kind': 'raw', 'material': 1, 'file': 'x.raw', 'size': [2048, 2048, 2048]}",
        "$.layers[0].size", "volume too large; expected at most 1073741824 voxels")]
    [InlineData("{'kind': 'cylinder', 'material': 1, 'axis': 'w', 'base': [0, 0, 0], 'radius': 1, 'length': 1}",
        "$.layers[0].axis", "expected one of: \"x\", \"y\", \"z\", found \"w\"")]
    [InlineData("{'kind': 'caves', 'op': 'carve', 'seed': 1, 'threshold': 0.1, 'frequency': 0}",
        "$.layers[0].frequency", "expected a number > 0 and at most 1, found 0")]
    [InlineData("{'kind': 'terrain', 'material': 1, 'seed': -3, 'frequency': 0.01, 'amplitude': 5, 'baseHeight': 3}",
        "$.layers[0].seed", "expected an integer seed from 0 to 18446744073709551615, found -3")]
    public void Layer_parameters_out_of_range_are_rejected_with_the_documented_message(string layer, string where, string problem)
    {
        var ex = Reject(TempScene.With(layer, extent: "[65536, 64, 65536]"));
        ex.Where.Should().Be(where);
        ex.Problem.Should().Be(problem);
    }

    [Fact]
    public void Every_failure_is_an_input_exception_for_the_command_line_guard()
    {
        var ex = Reject(TempScene.With("{'kind': 'cone'}"));
        ex.Should().BeAssignableTo<InputException>();
    }
}
