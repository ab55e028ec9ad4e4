using System.Collections;
using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;
using VoxProf.Tests.Traversal;

namespace VoxProf.Tests.Trees;

/// <summary>8³ nodes: the 512-bit masks, and the tree regrouped from the octree.</summary>
public class WideTreeTests
{
    [Fact]
    public void Mask512_answers_as_a_plain_bit_array_does()
    {
        // The reference is System.Collections.BitArray from the .NET class library.
        var rng = new Random(512);
        for (int round = 0; round < 200; round++)
        {
            Mask512 a = default, b = default;
            var plainA = new BitArray(512);
            var plainB = new BitArray(512);
            int density = rng.Next(1, 60);
            for (int bit = 0; bit < 512; bit++)
            {
                if (rng.Next(64) < density) { a.Set(bit); plainA[bit] = true; }
                if (rng.Next(64) < density) { b.Set(bit); plainB[bit] = true; }
            }
            int count = 0;
            for (int bit = 0; bit < 512; bit++)
            {
                a.Has(bit).Should().Be(plainA[bit]);
                a.Rank(bit).Should().Be(count, $"rank of bit {bit}");
                count += plainA[bit] ? 1 : 0;
            }
            a.Count.Should().Be(count);
            a.IsEmpty.Should().Be(count == 0);
            var both = new BitArray(plainA).And(plainB);
            a.Overlaps(b).Should().Be(both.HasAnySet());
            var outside = new BitArray(plainB).Not().And(plainA);
            a.CountOutside(b).Should().Be(outside.Cast<bool>().Count(x => x));
        }
        default(Mask512).IsEmpty.Should().BeTrue();
    }

    [Theory]
    [InlineData(301, 64)]
    [InlineData(302, 90)]
    [InlineData(303, 40)]
    [InlineData(304, 33)]
    public void Every_voxel_has_the_material_the_scene_gives_it(int seed, int size)
    {
        // Random extents: the 8³ root's cube is the octree root's, or one or two octree levels larger.
        Scene scene = TestScenes.Random(seed, size);
        BrickTree tree = TreeBuilder.Build(scene, 8, threads: 2);
        tree.Branching.Should().Be(8);
        tree.Nodes.Should().BeEmpty();
        tree.Depth.Should().Be(BrickTree.DepthFor(8, Math.Max(scene.ExtentX, Math.Max(scene.ExtentY, scene.ExtentZ))));
        for (int z = 0; z < scene.ExtentZ; z++)
            for (int y = 0; y < scene.ExtentY; y++)
                for (int x = 0; x < scene.ExtentX; x++)
                    if (tree.Material(x, y, z) != scene.EvaluateMaterial(x, y, z))
                        Assert.Fail($"voxel ({x},{y},{z}): tree {tree.Material(x, y, z)}, scene {scene.EvaluateMaterial(x, y, z)}");
        TreeStructureTests.AssertWellFormed(tree, $"seed {seed}");
    }

    [Theory]
    [InlineData(311, 70)]
    [InlineData(312, 48)]
    public void The_regrouped_tree_has_the_shape_a_naive_8_cubed_builder_gives(int seed, int size)
    {
        // DenseTree builds 8³ nodes directly, cell by cell, with no octree in between.
        Scene scene = TestScenes.Random(seed, size);
        BrickTree tree = TreeBuilder.Build(scene, 8, threads: 2);
        BrickTree naive = DenseTree.Build(scene.ExtentX, scene.ExtentY, scene.ExtentZ, scene.EvaluateMaterial, 8);
        tree.Depth.Should().Be(naive.Depth);
        tree.NodeCount.Should().Be(naive.NodeCount);
        tree.Materials.Should().Equal(naive.Materials, "both lay nodes out breadth first, cells in bit order");
        for (int i = 0; i < tree.NodeCount; i++)
        {
            tree.CellCounts(i).Should().Be(naive.CellCounts(i), $"node {i}");
            for (int bit = 0; bit < 512; bit++)
                if (tree.HasChild(i, bit) != naive.HasChild(i, bit) || tree.IsSolidCell(i, bit) != naive.IsSolidCell(i, bit))
                    Assert.Fail($"node {i} cell {bit} differs");
        }
    }

    [Fact]
    public void Stats_count_136_byte_records_and_the_same_solid_voxels_as_the_4_cubed_tree()
    {
        Scene scene = TestScenes.Random(321, 80);
        BrickTree wide = TreeBuilder.Build(scene, 8, threads: 2);
        BrickTree brick = TreeBuilder.Build(scene, 4, threads: 2);
        TreeStats stats = wide.Stats;
        stats.Branching.Should().Be(8);
        stats.NodeCount.Should().Be(wide.Nodes8.Length);
        stats.TotalBytes.Should().Be(136L * wide.Nodes8.Length + wide.Materials.Length);
        stats.BytesPerLevel.Sum().Should().Be(stats.TotalBytes);
        stats.SolidVoxels.Should().Be(brick.Stats.SolidVoxels).And.BeGreaterThan(0);
    }

    [Fact]
    public void An_empty_scene_and_a_full_scene_are_one_node()
    {
        BrickTree empty = TreeBuilder.Build(TestScenes.Of(20, 20, 20), 8);
        empty.NodeCount.Should().Be(1);
        empty.Nodes8[0].Occupancy.IsEmpty.Should().BeTrue();

        BrickTree full = TreeBuilder.Build(TestScenes.Of(8, 8, 8, new Core.Scenes.Layers.BoxLayer(LayerOp.Add, 3,
            new Core.Geometry.Box3i(0, 0, 0, 8, 8, 8), new Core.Geometry.Box3i(0, 0, 0, 8, 8, 8))), 8);
        full.NodeCount.Should().Be(1);
        full.Nodes8[0].SolidMask.Count.Should().Be(512);
        full.Material(7, 7, 7).Should().Be(3);
    }
}
