using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Strategies;

/// <summary>The demo scene and its trees, built once for every test that traces them.</summary>
internal static class DemoTrees
{
    private static readonly Lazy<Scene> LazyScene = new(() =>
        SceneLoader.Load(Path.Combine(AppContext.BaseDirectory, "samples", "stonebrook-quarry.vpscene.json")));

    private static readonly Lazy<BrickTree>[] Trees =
        [new(() => TreeBuilder.Build(Scene, 2, 2)), new(() => TreeBuilder.Build(Scene, 4, 2)), new(() => TreeBuilder.Build(Scene, 8, 2))];

    public static Scene Scene => LazyScene.Value;

    public static BrickTree Tree(int branching) => Trees[branching switch { 2 => 0, 4 => 1, _ => 2 }].Value;
}
