using System.Text;
using VoxProf.Core;
using VoxProf.Core.Scenes;

namespace VoxProf.Tests.Scenes;

/// <summary>Scene files that once ended in an internal error, a flood of output or a wrong message.</summary>
public class SceneInputHardeningTests
{
    private static SceneFormatException Reject(string path, SceneLoadOptions? options = null)
    {
        var act = () => SceneLoader.Load(path, options ?? SceneLoadOptions.Default);
        return act.Should().Throw<SceneFormatException>().Which;
    }

    private static TempScene Bytes(byte[] bytes)
    {
        var scene = new TempScene("");
        File.WriteAllBytes(scene.Path, bytes);
        return scene;
    }

    private static byte[] Utf8(string json) => Encoding.UTF8.GetBytes(json.Replace('\'', '"'));

    [Fact]
    public void Invalid_utf8_in_a_string_names_its_line_and_column()
    {
        byte[] head = Utf8("{'extent': [4, 4, 4],\n 'description': '");
        using var scene = Bytes([.. head, 0xFF, .. Utf8("', 'layers': [], 'cameras': [" + TempScene.Camera + "]}")]);

        var ex = Reject(scene.Path);

        ex.Where.Should().Be("line 2, column 18");
        ex.Problem.Should().Be($"not UTF-8: byte 0xFF at byte offset {head.Length} does not continue a valid character; expected UTF-8 text");
    }

    [Theory]
    [InlineData("{'extent': [4, 4, 4], 'description': 'a\\ud800b', 'layers': [], 'cameras': [CAM]}", "$.description")]
    [InlineData("{'extent': [4, 4, 4], 'layers': [], 'cameras': [CAM, {'name': '\\udc00', 'eye': [1, 1, 1], 'target': [2, 2, 2]}]}", "$.cameras[1].name")]
    [InlineData("{'extent': [4, 4, 4], 'layers': [{'kind': 'box', '\\ud800': 1}], 'cameras': [CAM]}", "$.layers[0] (key 1)")]
    public void An_escaped_lone_surrogate_in_a_value_or_a_key_is_refused_at_its_path(string json, string where)
    {
        using var scene = new TempScene(json.Replace("CAM", TempScene.Camera, StringComparison.Ordinal));

        var ex = Reject(scene.Path);

        ex.Where.Should().Be(where);
        ex.Problem.Should().StartWith("text holds an escaped lone surrogate");
    }

    [Fact]
    public void A_nul_character_in_a_raw_layer_file_is_refused_at_the_file_key()
    {
        using var scene = TempScene.With("{'kind': 'raw', 'material': 1, 'file': 'ring\\u0000post.raw', 'size': [2, 2, 2]}");

        var ex = Reject(scene.Path);

        ex.Where.Should().Be("$.layers[0].file");
        ex.Problem.Should().Be("contains a NUL character; expected a raw volume file path relative to the scene file's folder");
    }

    [Fact]
    public void A_byte_order_mark_before_the_scene_is_accepted()
    {
        using var scene = Bytes([0xEF, 0xBB, 0xBF, .. Utf8("{'extent': [4, 4, 4], 'layers': [], 'cameras': [" + TempScene.Camera + "]}")]);

        SceneLoader.Load(scene.Path).Cameras.Should().ContainSingle().Which.Name.Should().Be("cam");
    }

    [Fact]
    public void A_scene_file_over_64_mb_is_refused_by_its_length_before_it_is_read()
    {
        using var scene = new TempScene("");
        using (var f = new FileStream(scene.Path, FileMode.Create))
            f.SetLength(SceneLoader.MaxSceneBytes + 1); // sparse: no 64 MB written

        var ex = Reject(scene.Path);

        ex.Where.Should().Be("$");
        ex.Problem.Should().Be($"scene file {scene.Path} holds 67,108,865 bytes; expected at most 67,108,864");
    }

    [Fact]
    public void A_device_without_a_length_is_read_only_to_the_size_limit()
    {
        if (!File.Exists("/dev/zero"))
            return; // Linux only: a character device of endless zeros.

        var ex = Reject("/dev/zero");

        ex.Problem.Should().Be("scene file /dev/zero holds more than 67,108,864 bytes; expected at most 67,108,864");
    }

    [Theory]
    [InlineData("{'kind': 'heightmap', 'material': 1, 'file': '/dev/zero', 'height': [0, 8]}", "heightmap file")]
    [InlineData("{'kind': 'mesh', 'material': 1, 'file': '/dev/zero', 'format': 'obj'}", "mesh file")]
    public void A_device_named_as_a_layer_file_is_refused_before_it_is_opened(string layer, string what)
    {
        if (!File.Exists("/dev/zero"))
            return; // Linux only.
        using var scene = TempScene.With(layer);

        Reject(scene.Path).Problem.Should().Be($"{what} /dev/zero holds no bytes (an empty file, a device or a pipe); expected a {what}");
    }

    [Fact]
    public void A_folder_given_as_the_scene_is_called_a_folder_not_missing()
    {
        using var scene = new TempScene("{}");

        var ex = Reject(scene.Folder);

        ex.Where.Should().Be("$");
        ex.Problem.Should().Be($"scene file {scene.Folder} is a folder; expected a file");
    }

    [Fact]
    public void A_missing_scene_gives_the_message_docs_scene_format_lists()
    {
        string path = Path.Combine(Path.GetTempPath(), $"voxprof-missing-{Guid.NewGuid():N}", "a.vpscene.json");

        var ex = Reject(path);

        // docs/scene-format.md, "Errors": scene file missing | `$` | `scene file not found: PATH`
        ex.Message.Should().Be($"{path}: $: scene file not found: {path}");
    }

    [Fact]
    public void A_raw_file_reached_through_a_symbolic_link_is_measured_at_its_target()
    {
        using var scene = TempScene.With("{'kind': 'raw', 'material': 1, 'file': 'link.raw', 'size': [2, 2, 2]}");
        scene.WriteSideFile("data.raw", [1, 0, 0, 0, 0, 0, 0, 1]);
        File.CreateSymbolicLink(Path.Combine(scene.Folder, "link.raw"), "data.raw");

        Scene loaded = SceneLoader.Load(scene.Path);

        loaded.EvaluateMaterial(0, 0, 0).Should().Be(1);
        loaded.EvaluateMaterial(1, 1, 1).Should().Be(1);
        loaded.EvaluateMaterial(1, 0, 0).Should().Be(0);
    }

    [Fact]
    public void A_missing_layer_file_says_relative_to_which_folder_it_was_looked_for()
    {
        using var scene = TempScene.With("{'kind': 'mesh', 'material': 1, 'file': 'parts/arch.obj'}");

        var ex = Reject(scene.Path);

        ex.Problem.Should().Be($"mesh file not found: {Path.Combine(scene.Folder, "parts", "arch.obj")} (paths are relative to the scene file's folder)");
    }

    [Fact]
    public void A_layer_file_that_is_a_folder_is_called_a_folder()
    {
        using var scene = TempScene.With("{'kind': 'raw', 'material': 1, 'file': '.', 'size': [2, 2, 2]}");

        Reject(scene.Path).Problem.Should().Be($"raw volume file {scene.Folder} is a folder; expected a file");
    }

    [Fact]
    public void A_bad_literal_echoes_a_short_excerpt_not_the_rest_of_the_file()
    {
        string rest = string.Concat(Enumerable.Repeat("\n    {'kind': 'box', 'material': 1, 'min': [0, 0, 0], 'max': [1, 1, 1]},", 400));
        using var scene = new TempScene("{'version': tru, 'extent': [4, 4, 4], 'layers': [" + rest + "], 'cameras': []}");

        var ex = Reject(scene.Path);

        ex.Where.Should().Be("line 1, column 16", "the parser stops after the literal it could not read");
        ex.Problem.Should().StartWith("malformed JSON: 'tru, ").And.Contain("…'");
        ex.Problem.Length.Should().BeLessThan(200);
    }

    [Fact]
    public void Fifty_thousand_cameras_load_and_a_repeated_name_at_the_end_is_still_found()
    {
        var cameras = Enumerable.Range(0, 50_000).Select(i => $"{{'name': 'c{i}', 'eye': [1, 2, 3], 'target': [10, 2, {10 + i % 50}]}}").ToList();
        using (var scene = TempScene.With("", string.Join(",", cameras)))
            SceneLoader.Load(scene.Path).Cameras.Should().HaveCount(50_000);

        cameras.Add("{'name': 'c17', 'eye': [1, 2, 3], 'target': [10, 2, 10]}");
        using var repeated = TempScene.With("", string.Join(",", cameras));
        var ex = Reject(repeated.Path);
        ex.Where.Should().Be("$.cameras[50000].name");
        ex.Problem.Should().Be("duplicate camera name \"c17\"; expected unique names");
    }
}
