using System.Runtime.CompilerServices;
using FluentAssertions;
using VoxProf.Core.Memory;
using VoxProf.Core.Trees;
using VoxProf.Tests.Trees;
using Xunit;

namespace VoxProf.Tests.Memory;

public sealed class NodeLayoutTests
{
    [Fact]
    public void A_node_record_is_the_size_it_is_stored_at()
    {
        // Two 64-bit masks and two 32-bit indices, no padding.
        NodeLayout.RecordBytes.Should().Be(Unsafe.SizeOf<Node>()).And.Be(24);
    }

    [Theory]
    [InlineData(2, 11)]
    [InlineData(4, 12)]
    public void Addresses_are_the_byte_offsets_of_the_records_in_the_array_the_builder_wrote(int branching, int seed)
    {
        BrickTree tree = TreeBuilder.Build(TestScenes.Random(seed, 48), branching, threads: 2);
        Node[] nodes = tree.Nodes;
        nodes.Length.Should().BeGreaterThan(10, "the layout check needs a tree with some nodes");
        for (int i = 0; i < nodes.Length; i++)
            NodeLayout.Address(i).Should().Be((long)Unsafe.ByteOffset(ref nodes[0], ref nodes[i]), $"node {i}");
    }

    [Theory]
    [InlineData(2, 21)]
    [InlineData(4, 22)]
    public void The_root_comes_first_and_each_nodes_children_lie_one_after_another_where_it_points(int branching, int seed)
    {
        BrickTree tree = TreeBuilder.Build(TestScenes.Random(seed, 48), branching, threads: 2);
        NodeLayout.Address(0).Should().Be(0, "the root is the first record");
        foreach (Node n in tree.Nodes)
        {
            int children = System.Numerics.BitOperations.PopCount(n.ChildMask);
            for (int k = 0; k < children; k++)
                NodeLayout.Address(n.FirstChild + k).Should().Be(NodeLayout.Address(n.FirstChild) + k * NodeLayout.RecordBytes);
        }
    }

    [Theory]
    [InlineData(0, 64, 0, 0)]
    [InlineData(2, 64, 0, 1)] // bytes 48..71 straddle the first boundary
    [InlineData(3, 64, 1, 1)] // bytes 72..95
    [InlineData(5, 128, 0, 1)] // bytes 120..143 straddle 128
    [InlineData(16, 128, 3, 3)] // bytes 384..407
    public void A_record_touches_the_lines_its_bytes_lie_in(int index, int lineBytes, int first, int last)
    {
        int shift = System.Numerics.BitOperations.Log2((uint)lineBytes);
        long start = NodeLayout.Address(index), end = start + NodeLayout.RecordBytes - 1;
        NodeLayout.FirstLine(index, shift).Should().Be((int)(start / lineBytes));
        NodeLayout.LastLine(index, shift).Should().Be((int)(end / lineBytes));
        (NodeLayout.FirstLine(index, shift), NodeLayout.LastLine(index, shift)).Should().Be((first, last));
    }
}
