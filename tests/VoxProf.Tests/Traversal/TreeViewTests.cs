using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;
using VoxProf.Tests.Trees;

namespace VoxProf.Tests.Traversal;

public class TreeViewTests
{
    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    [InlineData(8)]
    public void Fetch_counts_one_read_and_refuses_an_index_outside_the_tree(int branching)
    {
        BrickTree tree = TreeBuilder.Build(TestScenes.Random(41, 40), branching, threads: 2);
        var view = new TreeView(tree);
        CostCounts counts = default;
        view.Fetch(tree.NodeCount - 1, ref counts).Index.Should().Be(tree.NodeCount - 1);
        counts.NodeFetches.Should().Be(1);
        default(NodeRef).Index.Should().Be(0, "the default handle is the root");

        foreach (int bad in new[] { -1, tree.NodeCount, int.MaxValue })
        {
            CostCounts c = default;
            FluentActions.Invoking(() => view.Fetch(bad, ref c)).Should().Throw<IndexOutOfRangeException>()
                .WithMessage($"node index {bad} is outside the tree's {tree.NodeCount} node records");
        }
    }

    [Fact]
    public void The_stack_walk_refuses_a_branching_other_than_the_trees()
    {
        // It reads the mask table without a bounds check, which only its own branching keeps in range.
        var view = new TreeView(DenseTree.Build(16, 16, 16, (_, y, _) => y < 4 ? (byte)5 : (byte)0, 2));
        var ray = new VoxProf.Core.Rays.RaySetup(8.5, 12.5, 8.5, 0.3, -0.9, 0.3);
        var path = new NodeRef[view.Depth + 1];
        var hit = default(PixelHit);
        FluentActions.Invoking(() => StackWalk.Trace<MaskedDdaMode, Branching4, CostCounts>(view, ray, 0, path, ref hit))
            .Should().Throw<ArgumentException>().WithMessage("the walk was compiled for 4³ nodes but the tree has 2³ nodes");
        StackWalk.Trace<MaskedDdaMode, Branching2, CostCounts>(view, ray, 0, path, ref hit).Iterations.Should().BeGreaterThan(0);
        (hit.Hit, hit.Y).Should().Be((true, 3), "at its own branching the walk reaches the ground's top layer");
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    [InlineData(8)]
    public void Every_cell_question_answers_as_the_tree_does(int branching)
    {
        // The view's branching-specialised reads against BrickTree's plain accessors, on every cell of every node.
        BrickTree tree = TreeBuilder.Build(TestScenes.Random(42, 40), branching, threads: 2);
        var view = new TreeView(tree);
        for (int i = 0; i < tree.NodeCount; i++)
        {
            CostCounts c = default;
            NodeRef node = view.Fetch(i, ref c);
            for (int bit = 0; bit < tree.CellsPerNode; bit++)
            {
                (bool occupied, bool solid) = branching switch
                {
                    2 => (view.IsOccupied<Branching2>(node, bit), view.IsSolid<Branching2>(node, bit)),
                    4 => (view.IsOccupied<Branching4>(node, bit), view.IsSolid<Branching4>(node, bit)),
                    _ => (view.IsOccupied<Branching8>(node, bit), view.IsSolid<Branching8>(node, bit)),
                };
                solid.Should().Be(tree.IsSolidCell(i, bit));
                occupied.Should().Be(tree.IsSolidCell(i, bit) || tree.HasChild(i, bit));
                if (tree.HasChild(i, bit))
                {
                    int child = branching switch
                    {
                        2 => view.Child<Branching2>(node, bit),
                        4 => view.Child<Branching4>(node, bit),
                        _ => view.Child<Branching8>(node, bit),
                    };
                    child.Should().Be(tree.ChildOf(i, bit));
                }
            }
        }
    }
}
