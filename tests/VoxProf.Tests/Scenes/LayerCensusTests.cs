using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Scenes;

public class LayerCensusTests
{
    [Fact]
    public void Each_voxel_is_credited_to_the_last_layer_that_contains_it()
    {
        var extent = new Box3i(0, 0, 0, 40, 40, 40);
        Layer[] layers =
        [
            new BoxLayer(LayerOp.Add, 1, new Box3i(0, 0, 0, 40, 10, 40), extent),   // 16,000 voxels
            new BoxLayer(LayerOp.Carve, 0, new Box3i(5, 5, 5, 15, 15, 15), extent),  // 1,000 voxels, 500 of them in the slab
            new BoxLayer(LayerOp.Add, 2, new Box3i(10, 0, 10, 20, 30, 20), extent),  // 3,000 voxels
        ];
        var scene = new Scene(40, 40, 40, layers, []);
        LayerTally[] census = LayerCensus.Run(scene, threads: 1);
        // Worked by hand: the tower (x, z 10..19, y 0..29) takes 3,000; the carve keeps its box minus the tower's
        // part (x, z 10..14, y 5..14: 250), 750; the slab keeps 16,000 − 500 carved − 1,000 under the tower + 125
        // counted in both (x, z 10..14, y 5..9) = 14,625.
        census.Select(c => c.Voxels).Should().Equal(14625, 750, 3000);
        LayerCensus.Run(scene, threads: 2).Select(c => c.Voxels).Should().Equal(census.Select(c => c.Voxels));
    }

    [Theory]
    [InlineData("ring-post.vpscene.json")]
    [InlineData("hollow-shell.vpscene.json")]
    public void The_add_layers_together_hold_every_solid_voxel_of_the_tree(string file)
    {
        Scene scene = SceneLoader.Load(Path.Combine(AppContext.BaseDirectory, "samples", file));
        LayerTally[] census = LayerCensus.Run(scene);
        long added = scene.Layers.Select((l, i) => l.Op == LayerOp.Add ? census[i].Voxels : 0).Sum();
        added.Should().Be(TreeBuilder.Build(scene, 4).Stats.SolidVoxels).And.BeGreaterThan(0);
    }
}
