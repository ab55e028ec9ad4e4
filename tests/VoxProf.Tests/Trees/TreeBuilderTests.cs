using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Trees;

public class TreeBuilderTests
{
    private static Scene MediumScene()
    {
        var extent = new Box3i(0, 0, 0, 300, 130, 270);
        return TestScenes.Of(300, 130, 270,
            new HillsLayer(1, 50, 14, 90, extent),
            new SphereLayer(LayerOp.Add, 2, 150.3, 70.1, 120.7, 45.5, extent),
            new SphereLayer(LayerOp.Carve, 0, 130, 60, 110, 25, extent),
            new NoiseLayer(LayerOp.Add, 3, new Box3i(200, 0, 20, 260, 90, 80), extent, 7, 0.3),
            new VagueLayer(new BoxLayer(LayerOp.Add, 2, new Box3i(10, 0, 200, 90, 100, 290), extent)),
            new BoxLayer(LayerOp.Carve, 0, new Box3i(40, 20, 0, 60, 200, 270), extent));
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    public void Tree_matches_direct_evaluation_at_seeded_random_points(int branching)
    {
        Scene scene = MediumScene();
        BrickTree tree = TreeBuilder.Build(scene, branching);
        var rng = new Random(1234);
        int solid = 0;
        for (int i = 0; i < 40_000; i++)
        {
            // Also sample a margin outside the extent, which must read as empty.
            int x = rng.Next(-8, scene.ExtentX + 8), y = rng.Next(-8, scene.ExtentY + 8), z = rng.Next(-8, scene.ExtentZ + 8);
            byte expected = scene.EvaluateMaterial(x, y, z);
            if (expected != 0)
                solid++;
            tree.Material(x, y, z).Should().Be(expected, "voxel ({0}, {1}, {2})", x, y, z);
        }
        solid.Should().BeInRange(4_000, 36_000, "the sample must see both solid and empty voxels");
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    public void Tree_matches_direct_evaluation_at_every_voxel_of_small_random_scenes(int branching)
    {
        for (int seed = 0; seed < 60; seed++)
        {
            Scene scene = TestScenes.Random(seed, 40);
            BrickTree tree = TreeBuilder.Build(scene, branching, threads: 1);
            long solid = 0;
            for (int z = 0; z < scene.ExtentZ; z++)
                for (int y = 0; y < scene.ExtentY; y++)
                    for (int x = 0; x < scene.ExtentX; x++)
                    {
                        byte expected = scene.EvaluateMaterial(x, y, z);
                        if (expected != 0)
                            solid++;
                        byte actual = tree.Material(x, y, z);
                        if (actual != expected)
                            actual.Should().Be(expected, "seed {0}, voxel ({1}, {2}, {3})", seed, x, y, z);
                    }
            tree.Stats.SolidVoxels.Should().Be(solid, "seed {0}", seed);
        }
    }

    [Fact]
    public void Octree_and_brick_tree_hold_the_same_solid_set()
    {
        for (int seed = 100; seed < 130; seed++)
        {
            Scene scene = TestScenes.Random(seed, 70);
            BrickTree octree = TreeBuilder.Build(scene, 2);
            BrickTree bricks = TreeBuilder.Build(scene, 4);
            octree.Stats.SolidVoxels.Should().Be(bricks.Stats.SolidVoxels, "seed {0}", seed);
            for (int z = 0; z < scene.ExtentZ; z++)
                for (int y = 0; y < scene.ExtentY; y++)
                    for (int x = 0; x < scene.ExtentX; x++)
                    {
                        byte a = octree.Material(x, y, z), b = bricks.Material(x, y, z);
                        if (a != b)
                            a.Should().Be(b, "seed {0}, voxel ({1}, {2}, {3})", seed, x, y, z);
                    }
        }
    }

    [Fact]
    public void Scene_with_no_layers_is_a_single_empty_root()
    {
        BrickTree tree = TreeBuilder.Build(TestScenes.Of(100, 20, 50), 4);
        tree.Nodes.Should().ContainSingle();
        tree.Nodes[0].Occupancy.Should().Be(0);
        tree.Materials.Should().BeEmpty();
        tree.Stats.SolidVoxels.Should().Be(0);
    }

    [Fact]
    public void Carving_everything_leaves_a_single_empty_root()
    {
        var extent = new Box3i(0, 0, 0, 90, 40, 70);
        BrickTree tree = TreeBuilder.Build(TestScenes.Of(90, 40, 70,
            new SphereLayer(LayerOp.Add, 1, 45, 20, 35, 30, extent),
            new VagueLayer(new BoxLayer(LayerOp.Carve, 0, extent, extent))), 2);
        tree.Nodes.Should().ContainSingle();
        tree.Nodes[0].Occupancy.Should().Be(0);
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    public void Statistics_add_up_to_the_arrays(int branching)
    {
        BrickTree tree = TreeBuilder.Build(MediumScene(), branching);
        TreeStats stats = tree.Stats;
        stats.NodeCount.Should().Be(tree.Nodes.Length);
        stats.SolidCellsPerLevel.Sum().Should().Be(tree.Materials.Length);
        stats.TotalBytes.Should().Be(24L * tree.Nodes.Length + tree.Materials.Length);
        stats.BytesPerLevel.Sum().Should().Be(stats.TotalBytes);
        stats.Depth.Should().Be(tree.Depth);
        stats.RootSize.Should().Be(tree.RootSize);
        stats.NodesPerLevel[0].Should().Be(1);
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    public void Largest_extent_builds_from_its_surfaces_alone(int branching)
    {
        // 2^48 voxels: a dense pass over the volume would never finish, so only the surfaces can have been visited.
        int side = Scene.MaxExtent;
        var extent = new Box3i(0, 0, 0, side, side, side);
        var box = new Box3i(1000, 2000, 3000, 1100, 2077, 3123);
        Scene scene = TestScenes.Of(side, side, side,
            new BoxLayer(LayerOp.Add, 1, box, extent),
            new SphereLayer(LayerOp.Add, 2, side - 60.5, side - 70.25, 80, 40, extent));

        BrickTree tree = TreeBuilder.Build(scene, branching);

        tree.RootSize.Should().Be(side);
        tree.Material(1099, 2076, 3122).Should().Be(1);
        tree.Material(1100, 2076, 3122).Should().Be(0);
        tree.Material(side - 61, side - 71, 80).Should().Be(2);
        tree.Stats.SolidVoxels.Should().BeGreaterThan(box.Volume);
        tree.Stats.TotalBytes.Should().BeLessThan(16L << 20, "memory follows the surface, not the volume");
    }
}
