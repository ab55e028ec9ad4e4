namespace VoxProf.Core.Scenes;

/// <summary>How strictly a scene's file references are checked (docs/scene-format.md, "Files a scene names").</summary>
public sealed record SceneLoadOptions
{
    public static SceneLoadOptions Default { get; } = new();

    /// <summary>
    /// Refuse a raw, mesh, heightmap or glTF buffer file whose real path (after following symbolic links) lies
    /// outside the scene file's real folder: for scenes from people the runner does not trust.
    /// </summary>
    public bool ConfineFiles { get; init; }
}
