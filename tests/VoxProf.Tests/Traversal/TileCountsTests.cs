using FluentAssertions;
using VoxProf.Core.Traversal;
using Xunit;

namespace VoxProf.Tests.Traversal;

/// <summary>A tile's staged counts land on the image's pixels; counters that stay zero on the tile are not written.</summary>
public sealed class TileCountsTests
{
    [Fact]
    public void A_cut_short_tile_lands_on_its_own_pixels_counter_by_counter()
    {
        // A 40 × 20 image: the tile at (32, 16) is cut to 8 × 4 pixels.
        const int width = 40, height = 20;
        uint[][] buffers = [new uint[width * height], new uint[width * height]];
        var tile = new uint[2 * TileCounts.Slots];
        for (int y = 0; y < 4; y++)
        {
            for (int x = 0; x < 8; x++)
            {
                int slot = y * Tracer.TileSize + x;
                tile[TileCounts.Index(0, slot)] = (uint)(1000 + 100 * y + x);
                tile[TileCounts.Index(1, slot)] = (uint)(2000 + 100 * y + x);
            }
        }

        TileCounts.CopyTo(tile, buffers, width, 32, 16, 40, 20);

        for (int y = 0; y < height; y++)
        {
            for (int x = 0; x < width; x++)
            {
                bool inside = x >= 32 && y >= 16;
                buffers[0][y * width + x].Should().Be(inside ? (uint)(1000 + 100 * (y - 16) + x - 32) : 0u, $"pixel ({x}, {y})");
                buffers[1][y * width + x].Should().Be(inside ? (uint)(2000 + 100 * (y - 16) + x - 32) : 0u, $"pixel ({x}, {y})");
            }
        }
    }

    [Fact]
    public void A_counter_zero_on_the_whole_tile_is_left_as_it_was_and_one_nonzero_count_copies_its_zeros_too()
    {
        // The buffers start cleared in a trace; a marker shows which ones the copy wrote.
        const int width = 16;
        uint[][] buffers = [.. Enumerable.Range(0, 3).Select(_ => Enumerable.Repeat(7u, width * width).ToArray())];
        var tile = new uint[3 * TileCounts.Slots];
        tile[TileCounts.Index(2, 5)] = 9;

        TileCounts.CopyTo(tile, buffers, width, 0, 0, 16, 16);

        buffers[0].Should().OnlyContain(v => v == 7, "an all-zero counter is not copied");
        buffers[1].Should().OnlyContain(v => v == 7, "an all-zero counter is not copied");
        buffers[2][5].Should().Be(9);
        buffers[2].Count(v => v == 0).Should().Be(width * width - 1, "the tile's other counts of that counter are copied");
    }
}
