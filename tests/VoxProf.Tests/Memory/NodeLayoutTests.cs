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
        // Two 64-bit masks and two 32-bit indices, no padding; for 8³ two 512-bit masks and the same indices.
        NodeLayout.For(2).RecordBytes.Should().Be(Unsafe.SizeOf<Node>()).And.Be(24);
        NodeLayout.For(4).RecordBytes.Should().Be(24);
        NodeLayout.For(8).RecordBytes.Should().Be(Unsafe.SizeOf<Node8>()).And.Be(136);
    }

    [Theory]
    [InlineData(2, 11)]
    [InlineData(4, 12)]
    [InlineData(8, 13)]
    public void Addresses_are_the_byte_offsets_of_the_records_in_the_array_the_builder_wrote(int branching, int seed)
    {
        BrickTree tree = TreeBuilder.Build(TestScenes.Random(seed, 48), branching, threads: 2);
        NodeLayout layout = NodeLayout.For(branching);
        tree.NodeCount.Should().BeGreaterThan(branching == 8 ? 2 : 10, "the layout check needs a tree with some nodes");
        for (int i = 0; i < tree.NodeCount; i++)
        {
            long offset = branching == 8
                ? (long)Unsafe.ByteOffset(ref tree.Nodes8[0], ref tree.Nodes8[i])
                : (long)Unsafe.ByteOffset(ref tree.Nodes[0], ref tree.Nodes[i]);
            layout.Address(i).Should().Be(offset, $"node {i}");
        }
    }

    [Theory]
    [InlineData(2, 21)]
    [InlineData(4, 22)]
    [InlineData(8, 23)]
    public void The_root_comes_first_and_each_nodes_children_lie_one_after_another_where_it_points(int branching, int seed)
    {
        BrickTree tree = TreeBuilder.Build(TestScenes.Random(seed, 48), branching, threads: 2);
        NodeLayout layout = NodeLayout.For(branching);
        layout.Address(0).Should().Be(0, "the root is the first record");
        for (int n = 0; n < tree.NodeCount; n++)
        {
            (_, int children) = tree.CellCounts(n);
            for (int k = 0; k < children; k++)
                layout.Address(tree.FirstChildOf(n) + k).Should().Be(layout.Address(tree.FirstChildOf(n)) + k * layout.RecordBytes);
        }
    }

    [Theory]
    [InlineData(24, 0, 64, 0, 0)]
    [InlineData(24, 2, 64, 0, 1)] // bytes 48..71 straddle the first boundary
    [InlineData(24, 3, 64, 1, 1)] // bytes 72..95
    [InlineData(24, 5, 128, 0, 1)] // bytes 120..143 straddle 128
    [InlineData(24, 16, 128, 3, 3)] // bytes 384..407
    [InlineData(136, 0, 64, 0, 2)] // bytes 0..135: three lines
    [InlineData(136, 1, 64, 2, 4)] // bytes 136..271
    [InlineData(136, 1, 128, 1, 2)] // bytes 136..271 in 128-byte lines
    public void A_record_touches_the_lines_its_bytes_lie_in(int recordBytes, int index, int lineBytes, int first, int last)
    {
        var layout = new NodeLayout(recordBytes);
        int shift = System.Numerics.BitOperations.Log2((uint)lineBytes);
        long start = layout.Address(index), end = start + layout.RecordBytes - 1;
        layout.FirstLine(index, shift).Should().Be((int)(start / lineBytes));
        layout.LastLine(index, shift).Should().Be((int)(end / lineBytes));
        (layout.FirstLine(index, shift), layout.LastLine(index, shift)).Should().Be((first, last));
    }

    [Theory]
    [InlineData(24, 6, 2)]
    [InlineData(24, 7, 2)]
    [InlineData(136, 6, 3)]
    [InlineData(136, 7, 2)]
    [InlineData(64, 6, 1)]
    [InlineData(65, 6, 2)]
    public void The_most_lines_a_record_touches_bounds_every_record_and_is_reached_or_passed_by_one(int recordBytes, int lineShift, int reached)
    {
        var layout = new NodeLayout(recordBytes);
        int most = Enumerable.Range(0, 4096).Max(i => layout.LastLine(i, lineShift) - layout.FirstLine(i, lineShift) + 1);
        most.Should().Be(reached, "worked by hand from where the records start within a line");
        layout.MaxLinesPerRecord(lineShift).Should().BeGreaterThanOrEqualTo(most).And.BeLessThanOrEqualTo(most + 1);
    }
}
