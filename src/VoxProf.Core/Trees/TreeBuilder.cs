using VoxProf.Core.Scenes;

namespace VoxProf.Core.Trees;

/// <summary>Builds a <see cref="BrickTree"/> straight from a scene's layers.</summary>
public static class TreeBuilder
{
    /// <param name="threads">0 means every processor.</param>
    public static BrickTree Build(Scene scene, int branching, int threads = 0) =>
        throw new NotImplementedException("tree builder pending");
}
