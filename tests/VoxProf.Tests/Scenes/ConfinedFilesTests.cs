using VoxProf.Core;
using VoxProf.Core.Scenes;

namespace VoxProf.Tests.Scenes;

/// <summary>
/// <see cref="SceneLoadOptions.ConfineFiles"/> (<c>--confine-files</c>): a scene from someone the runner does not trust
/// may name only files inside its own folder, judged by real paths, so neither "../" nor a symbolic link leads out.
/// </summary>
public sealed class ConfinedFilesTests : IDisposable
{
    private static readonly SceneLoadOptions Confined = new() { ConfineFiles = true };
    private static readonly byte[] Volume = [1, 1, 1, 1, 1, 1, 1, 1];

    private readonly TempScene _scene = TempScene.With("{'kind': 'raw', 'material': 1, 'file': 'FILE', 'size': [2, 2, 2]}");
    private readonly string _outside = Path.Combine(Path.GetTempPath(), $"voxprof-outside-{Guid.NewGuid():N}.raw");

    public ConfinedFilesTests() => File.WriteAllBytes(_outside, Volume);

    public void Dispose()
    {
        _scene.Dispose();
        File.Delete(_outside);
    }

    private void Name(string file) =>
        File.WriteAllText(_scene.Path, File.ReadAllText(_scene.Path).Replace("FILE", file, StringComparison.Ordinal));

    [Fact]
    public void A_file_inside_the_scene_folder_loads()
    {
        _scene.WriteSideFile("inside.raw", Volume);
        Name("inside.raw");

        SceneLoader.Load(_scene.Path, Confined).EvaluateMaterial(1, 1, 1).Should().Be(1);
    }

    [Fact]
    public void A_file_outside_the_scene_folder_loads_by_default_and_is_refused_when_confined()
    {
        Name(_outside);

        SceneLoader.Load(_scene.Path).EvaluateMaterial(0, 0, 0).Should().Be(1, "without the switch a scene may name any readable file");
        var ex = FluentActions.Invoking(() => SceneLoader.Load(_scene.Path, Confined)).Should().Throw<SceneFormatException>().Which;
        ex.Where.Should().Be("$.layers[0].file");
        ex.Problem.Should().Be($"{_outside} resolves to {_outside}, outside the scene file's folder {_scene.Folder}; files are confined to that folder");
    }

    [Fact]
    public void A_symbolic_link_inside_the_folder_to_a_file_outside_is_refused_when_confined()
    {
        File.CreateSymbolicLink(Path.Combine(_scene.Folder, "innocent.raw"), _outside);
        Name("innocent.raw");

        FluentActions.Invoking(() => SceneLoader.Load(_scene.Path, Confined)).Should().Throw<SceneFormatException>()
            .Which.Problem.Should().StartWith($"innocent.raw resolves to {_outside}, outside the scene file's folder");
    }

    [Fact]
    public void Dot_dot_through_a_linked_folder_is_judged_where_the_system_would_open_it()
    {
        // sub -> a folder elsewhere; "sub/../x.raw" opens x.raw beside that folder, not in the scene's folder.
        string elsewhere = Path.Combine(Path.GetTempPath(), $"voxprof-elsewhere-{Guid.NewGuid():N}");
        Directory.CreateDirectory(Path.Combine(elsewhere, "inner"));
        try
        {
            File.WriteAllBytes(Path.Combine(elsewhere, "x.raw"), Volume);
            _scene.WriteSideFile("x.raw", Volume);
            Directory.CreateSymbolicLink(Path.Combine(_scene.Folder, "sub"), Path.Combine(elsewhere, "inner"));
            Name("sub/../x.raw");

            FluentActions.Invoking(() => SceneLoader.Load(_scene.Path, Confined)).Should().Throw<SceneFormatException>()
                .Which.Problem.Should().Contain($"resolves to {Path.Combine(elsewhere, "x.raw")}, outside the scene file's folder");
        }
        finally
        {
            Directory.Delete(elsewhere, recursive: true);
        }
    }
}
