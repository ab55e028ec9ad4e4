namespace VoxProf.Core.Scenes;

/// <summary>Reads a scene file (JSON; format in docs/scene-format.md).</summary>
public static class SceneLoader
{
    /// <summary>Loads and validates a scene; throws <see cref="SceneFormatException"/> naming the file and JSON path.</summary>
    public static Scene Load(string path) => throw new NotImplementedException("scene loader pending");
}
