using System.Numerics;
using System.Runtime.CompilerServices;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Trees;

public class TreeStructureTests
{
    [Fact]
    public void Node_record_is_24_bytes_and_the_8_cubed_record_136() =>
        (Unsafe.SizeOf<Node>(), Unsafe.SizeOf<Node8>()).Should().Be((24, 136));

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    [InlineData(8)]
    public void Every_occupied_cell_is_a_child_or_a_solid_cell_and_every_record_is_reached_once(int branching)
    {
        for (int seed = 200; seed < 240; seed++)
            AssertWellFormed(TreeBuilder.Build(TestScenes.Random(seed, 90), branching), $"seed {seed}");
    }

    /// <summary>
    /// Walks the tree from the root and checks the layout contract: masks disjoint and within N³ bits; solid cells inside the extent; children
    /// contiguous, one per child bit, each record owned by exactly one parent; no empty node below the root; no node
    /// that should have collapsed into a solid cell; leaves without children; every material nonzero and owned once.
    /// </summary>
    internal static void AssertWellFormed(BrickTree tree, string because)
    {
        Problems(tree).Should().BeEmpty(because);
    }

    private static Node8 Widen(Node n)
    {
        var wide = new Node8 { FirstChild = n.FirstChild, FirstMaterial = n.FirstMaterial };
        wide.ChildMask[0] = n.ChildMask;
        wide.SolidMask[0] = n.SolidMask;
        return wide;
    }

    // Plain checks collected as text: an assertion call per record would dominate the run time on large trees.
    private static List<string> Problems(BrickTree tree)
    {
        var problems = new List<string>();
        // One record type for every branching: a 2³ or 4³ record's masks are the first word of a 512-bit mask.
        Node8[] nodes = tree.Branching == 8 ? tree.Nodes8 : tree.Nodes.Select(Widen).ToArray();
        byte[] materials = tree.Materials;
        int cells = tree.Branching * tree.Branching * tree.Branching;
        ulong firstWordFull = cells >= 64 ? ulong.MaxValue : (1UL << cells) - 1;
        var nodeOwned = new bool[nodes.Length];
        var materialOwned = new bool[materials.Length];
        nodeOwned[0] = true;
        int n = tree.Branching;
        var pending = new Stack<(int Index, int Level, int X, int Y, int Z)>();
        pending.Push((0, 0, 0, 0, 0));
        while (pending.Count > 0 && problems.Count < 10)
        {
            (int index, int level, int x, int y, int z) = pending.Pop();
            Node8 node = nodes[index];
            int cellSide = 1 << tree.CellShift(level);
            if (node.ChildMask.Overlaps(node.SolidMask))
                problems.Add($"node {index}: a cell is both a child and solid");
            if ((node.Occupancy[0] & ~firstWordFull) != 0)
                problems.Add($"node {index}: bits beyond the {cells} cells");
            if (index != 0 && node.Occupancy.IsEmpty)
                problems.Add($"node {index}: empty node below the root");
            if (level == tree.Depth - 1 && !node.ChildMask.IsEmpty)
                problems.Add($"node {index}: a leaf has children");

            for (int bit = 0; bit < cells; bit++)
            {
                var cell = Box3i.Cube(x + bit % n * cellSide, y + bit / n % n * cellSide, z + bit / (n * n) * cellSide, cellSide);
                if (node.SolidMask.Has(bit) && !tree.Bounds.ContainsBox(cell))
                    problems.Add($"node {index}: solid cell {bit} reaches outside the extent");
                if (!node.ChildMask.Has(bit))
                    continue;
                int child = node.FirstChild + node.ChildMask.Rank(bit);
                if (child < 1 || child >= nodes.Length)
                    problems.Add($"node {index}: child {child} out of range");
                else if (nodeOwned[child])
                    problems.Add($"node {child} has two parents");
                else
                {
                    nodeOwned[child] = true;
                    pending.Push((child, level + 1, cell.MinX, cell.MinY, cell.MinZ));
                }
            }

            int solids = node.SolidMask.Count;
            if (node.FirstMaterial < 0 || node.FirstMaterial + solids > materials.Length)
            {
                problems.Add($"node {index}: materials out of range");
                continue;
            }
            for (int m = node.FirstMaterial; m < node.FirstMaterial + solids; m++)
            {
                if (materialOwned[m])
                    problems.Add($"material {m} has two owners");
                materialOwned[m] = true;
                if (materials[m] == 0)
                    problems.Add($"material {m} of node {index} is 0");
            }
            if (index != 0 && solids == cells &&
                materials.AsSpan(node.FirstMaterial, cells).IndexOfAnyExcept(materials[node.FirstMaterial]) < 0)
                problems.Add($"node {index} is one material throughout and should be a solid cell of its parent");
        }
        if (Array.IndexOf(nodeOwned, false) is int orphan and >= 0)
            problems.Add($"node {orphan} is not reachable from the root");
        if (Array.IndexOf(materialOwned, false) is int stray and >= 0)
            problems.Add($"material {stray} belongs to no node");
        return problems;
    }

    [Fact]
    public void Aligned_uniform_box_is_one_solid_cell_of_the_root_in_a_brick_tree()
    {
        var extent = new Box3i(0, 0, 0, 64, 64, 64);
        var box = new Box3i(16, 32, 48, 32, 48, 64);
        foreach (Layer layer in new Layer[]
        {
            new BoxLayer(LayerOp.Add, 5, box, extent),
            // The same box known only as "maybe": the builder must discover it is uniform.
            new VagueLayer(new BoxLayer(LayerOp.Add, 5, box, extent)),
            new NoiseLayer(LayerOp.Add, 5, box, extent, seed: 3, density: 1.0),
        })
        {
            BrickTree tree = TreeBuilder.Build(TestScenes.Of(64, 64, 64, layer), 4);
            tree.Nodes.Should().ContainSingle(layer.Kind);
            tree.Nodes[0].ChildMask.Should().Be(0, layer.Kind);
            tree.Nodes[0].SolidMask.Should().Be(1UL << tree.CellBit(1, 2, 3), layer.Kind);
            tree.Materials.Should().Equal([(byte)5], layer.Kind);
        }
    }

    [Fact]
    public void Aligned_uniform_box_is_one_solid_cell_at_its_own_level_in_an_octree()
    {
        var extent = new Box3i(0, 0, 0, 64, 64, 64);
        var box = new Box3i(16, 32, 48, 32, 48, 64);
        BrickTree tree = TreeBuilder.Build(TestScenes.Of(64, 64, 64, new VagueLayer(new BoxLayer(LayerOp.Add, 5, box, extent))), 2);
        // The root's cells are 32 wide, so side-16 cells belong to the level-1 node: two nodes and one solid cell.
        tree.Depth.Should().Be(6);
        tree.Stats.NodesPerLevel.Should().Equal(1, 1, 0, 0, 0, 0);
        tree.Stats.SolidCellsPerLevel.Should().Equal(0, 1, 0, 0, 0, 0);
        tree.Materials.Should().Equal([(byte)5]);
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    public void Scene_filled_with_one_material_is_a_root_of_solid_cells(int branching)
    {
        var extent = new Box3i(0, 0, 0, 64, 64, 64);
        BrickTree tree = TreeBuilder.Build(TestScenes.Of(64, 64, 64,
            new HillsLayer(2, 10, 3, 20, extent),
            new VagueLayer(new BoxLayer(LayerOp.Add, 7, extent, extent))), branching);
        tree.Nodes.Should().ContainSingle();
        tree.Nodes[0].SolidMask.Should().Be(branching == 4 ? ulong.MaxValue : 0xFFUL);
        tree.Materials.Should().HaveCount(branching * branching * branching).And.OnlyContain(m => m == 7);
        tree.Stats.SolidVoxels.Should().Be(64 * 64 * 64);
    }

    [Theory]
    [InlineData(2, 3)]
    [InlineData(4, 1)]
    public void Extent_filled_whole_on_cell_boundaries_needs_no_subtree_below_the_top(int branching, int nodes)
    {
        // 512 x 256 x 768 splits into whole 256-voxel cells: nothing is left for the parallel subtrees to build.
        var extent = new Box3i(0, 0, 0, 512, 256, 768);
        BrickTree tree = TreeBuilder.Build(TestScenes.Of(512, 256, 768, new BoxLayer(LayerOp.Add, 4, extent, extent)), branching);
        tree.Nodes.Should().HaveCount(nodes);
        tree.Stats.SolidVoxels.Should().Be(extent.Volume);
        tree.Material(511, 255, 767).Should().Be(4);
        tree.Material(0, 0, 0).Should().Be(4);
        AssertWellFormed(tree, "aligned fill");
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    public void Unaligned_box_is_stored_as_the_fewest_aligned_solid_cells(int branching)
    {
        var extent = new Box3i(0, 0, 0, 100, 70, 90);
        var box = new Box3i(3, 17, 30, 77, 64, 89);
        BrickTree tree = TreeBuilder.Build(TestScenes.Of(100, 70, 90, new BoxLayer(LayerOp.Add, 1, box, extent)), branching);

        // Oracle: split the root cube into aligned cells, keep a cell whole when the box contains it.
        var expected = new long[tree.Depth];
        CountCells(box, 0, 0, 0, tree.RootSize, 0, branching, expected);
        tree.Stats.SolidCellsPerLevel.Should().Equal(expected);
        tree.Stats.SolidVoxels.Should().Be(box.Volume);
    }

    private static void CountCells(Box3i box, int x, int y, int z, int side, int level, int n, long[] perLevel)
    {
        int cell = side / n;
        for (int cz = 0; cz < n; cz++)
            for (int cy = 0; cy < n; cy++)
                for (int cx = 0; cx < n; cx++)
                {
                    var c = Box3i.Cube(x + cx * cell, y + cy * cell, z + cz * cell, cell);
                    if (box.ContainsBox(c))
                        perLevel[level]++;
                    else if (box.Intersects(c))
                        CountCells(box, c.MinX, c.MinY, c.MinZ, cell, level + 1, n, perLevel);
                }
    }
}
