using FluentAssertions;
using VoxProf.Core.Memory;
using VoxProf.Core.Traversal;
using Xunit;

namespace VoxProf.Tests.Memory;

/// <summary>Recording a tile's reads through the counters' own pointer, across the recorder's buffer growing.</summary>
public sealed class ReadRecordingTests
{
    [Fact]
    public void Every_read_lands_in_its_pixel_in_order_even_when_the_buffer_grows_mid_ray()
    {
        var reads = new TileReads();
        reads.Begin(0, 0, 4, 1);
        // 3,000 reads a pixel: the 4,096-read buffer fills during the second ray and again during the fourth.
        int[][] expected = [.. Enumerable.Range(0, 4).Select(p => Enumerable.Range(0, p == 2 ? 0 : 3000).Select(i => p * 100_000 + i * 7 % 1000).ToArray())];
        var tile = new uint[CounterNames.Count * TileCounts.Slots];
        TileReads.Attach(reads);
        try
        {
            for (int p = 0; p < expected.Length; p++)
            {
                MemoryCounts<CostCounts> counts = default;
                foreach (int node in expected[p])
                    counts.NodeFetch(node);
                counts.Flush(tile, p, reads);
                tile[TileCounts.Index((int)Counter.NodeFetches, p)].Should().Be((uint)expected[p].Length);
            }
        }
        finally
        {
            TileReads.Attach(null);
        }
        reads.Pixels.Should().Be(4);
        reads.Count.Should().Be(9000);
        for (int p = 0; p < expected.Length; p++)
            reads.Of(p).ToArray().Should().Equal(expected[p], $"pixel {p}");
        reads.All.ToArray().Should().Equal(expected.SelectMany(e => e));
    }

    [Fact]
    public void A_second_tile_starts_from_an_empty_recorder()
    {
        var reads = new TileReads();
        TileReads.Attach(reads);
        try
        {
            var tile = new uint[CounterNames.Count * TileCounts.Slots];
            foreach (int first in new[] { 10, 20 })
            {
                reads.Begin(0, 0, 1, 1);
                MemoryCounts<CostCounts> counts = default;
                counts.NodeFetch(first);
                counts.NodeFetch(first + 1);
                counts.Flush(tile, 0, reads);
                reads.All.ToArray().Should().Equal(first, first + 1);
            }
        }
        finally
        {
            TileReads.Attach(null);
        }
    }
}
