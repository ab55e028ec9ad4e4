using System.Text.Json;
using VoxProf.Cli;
using VoxProf.Core.Scenes;

namespace VoxProf.Tests.Cli.Commands;

public class InspectCommandTests
{
    private static (int Code, string Out, string Err) Run(params string[] args)
    {
        using var output = new StringWriter();
        using var error = new StringWriter();
        int code = VoxProf.Cli.Cli.Run(args, output, error);
        return (code, output.ToString(), error.ToString());
    }

    [Fact]
    public void Missing_scene_file_is_one_line_naming_it_and_exit_code_2()
    {
        string path = Path.Combine(Path.GetTempPath(), $"voxprof-missing-{Guid.NewGuid():N}.json");
        (int code, string output, string error) = Run("inspect", path);
        code.Should().Be(ExitCodes.BadInput);
        output.Should().BeEmpty();
        error.TrimEnd().Should().NotContain("\n").And.Contain(path).And.Contain("not found");
    }

    [Theory]
    [InlineData("--branching", "3", "expected 2, 4 or 8")]
    [InlineData("--branching", "16", "expected 2, 4 or 8")]
    [InlineData("--threads", "-1", "expected 0 or more")]
    [InlineData("--format", "xml", "xml")]
    public void Bad_option_value_is_refused_before_any_work(string option, string value, string message)
    {
        (int code, string output, string error) = Run("inspect", "scene.json", option, value);
        code.Should().NotBe(ExitCodes.Ok);
        error.Should().Contain(message);
        output.Should().NotContain("solid voxels");
    }

    [Theory]
    [InlineData("2")]
    [InlineData("4")]
    [InlineData("8")]
    public void Sample_scene_reports_as_many_solid_voxels_as_its_layers_define(string branching)
    {
        string path = Path.Combine(AppContext.BaseDirectory, "samples", "ring-post.vpscene.json");
        (int code, string output, string error) = Run("inspect", path, "--format", "json", "--branching", branching);
        code.Should().Be(ExitCodes.Ok, error);

        // The slow definition, voxel by voxel over the whole extent.
        Scene scene = SceneLoader.Load(path);
        long solid = 0;
        for (int z = 0; z < scene.ExtentZ; z++)
            for (int y = 0; y < scene.ExtentY; y++)
                for (int x = 0; x < scene.ExtentX; x++)
                    if (scene.EvaluateMaterial(x, y, z) != 0)
                        solid++;

        using JsonDocument doc = JsonDocument.Parse(output);
        doc.RootElement.GetProperty("solidVoxels").GetInt64().Should().Be(solid).And.BeGreaterThan(0);
        doc.RootElement.GetProperty("branching").GetInt32().Should().Be(int.Parse(branching));
    }

    [Fact]
    public void A_malformed_mesh_file_is_one_line_naming_the_file_and_line_and_exit_code_2()
    {
        using var scene = new VoxProf.Tests.Scenes.TempScene(
            "{'extent': [16, 16, 16], 'layers': [{'kind': 'mesh', 'material': 1, 'file': 'bad.obj'}], 'cameras': ["
            + VoxProf.Tests.Scenes.TempScene.Camera + "]}");
        scene.WriteSideFile("bad.obj", System.Text.Encoding.ASCII.GetBytes("v 0 0 0\nv 1 0 0\nv 0 1 0\nf 1 2 9\n"));
        (int code, string output, string error) = Run("inspect", scene.Path);
        code.Should().Be(ExitCodes.BadInput);
        output.Should().BeEmpty();
        error.TrimEnd().Should().NotContain("\n").And.Contain(Path.Combine(scene.Folder, "bad.obj") + ": line 4: vertex index 9 is out of range");
    }

    [Fact]
    public void Text_output_lists_every_layer_and_camera_of_the_scene()
    {
        string path = Path.Combine(AppContext.BaseDirectory, "samples", "ring-post.vpscene.json");
        (int code, string output, string error) = Run("inspect", path);
        code.Should().Be(ExitCodes.Ok, error);
        Scene scene = SceneLoader.Load(path);
        string[] lines = output.Split('\n');
        foreach (Layer layer in scene.Layers)
        {
            string label = layer.Label![..Math.Min(20, layer.Label!.Length)];
            lines.Should().Contain(l => l.Contains(label, StringComparison.Ordinal) && l.Contains(layer.Kind, StringComparison.Ordinal));
        }
        foreach (CameraSpec camera in scene.Cameras)
            lines.Should().Contain(l => l.StartsWith(camera.Name + " ", StringComparison.Ordinal));
        output.Should().Contain("voxelise time").And.Contain("build time");
    }
}
