using VoxProf.Core;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Pixels;

namespace VoxProf.Tests.Reports;

/// <summary>A merge's read of one shard's tiles from a whole-image pixel file, straight into the merged buffers.</summary>
public class PixelTileReadTests
{
    private const uint Untouched = 0xDEADBEEF;

    [Theory]
    [InlineData(1, 3)]
    [InlineData(2, 3)]
    [InlineData(2, 2)]
    [InlineData(1, 1)]
    public void Exactly_the_shares_tiles_are_copied_and_every_other_pixel_is_left_as_it_was(int index, int count)
    {
        // 300×300: partial 16-pixel tiles at the right and bottom, and rows that straddle the reader's chunks.
        PixelData data = PixelFileTests.Large();
        int w = data.Width, h = data.Height, n = w * h;
        string[] wanted = ["descents", "ITERATIONS", "cache-lines"];
        uint[][] counters = [.. wanted.Select(_ => Enumerable.Repeat(Untouched, n).ToArray())];
        var sentinel = new PixelHit { Hit = true, X = -1, Y = -2, Z = -3, T = -4, Material = 250, Face = HitFace.PosX };
        PixelHit[] hits = Enumerable.Repeat(sentinel, n).ToArray();

        using MemoryStream stream = PixelFileTests.Written(data);
        PixelDataFile.ReadTiles(stream, "mem", new TileShare(index, count), w, h, wanted, counters, hits);

        var share = new TileShare(index, count);
        for (int y = 0; y < h; y++)
        {
            for (int x = 0; x < w; x++)
            {
                int p = y * w + x;
                // The tile rule written out: row-major tiles of Tracer.TileSize, tile t in share t mod count + 1.
                bool held = share.Holds(y / Tracer.TileSize * Tracer.TilesX(w) + x / Tracer.TileSize);
                for (int c = 0; c < wanted.Length; c++)
                    counters[c][p].Should().Be(held ? data.Find(wanted[c])![p] : Untouched, $"{wanted[c]} at {x},{y}");
                hits[p].Should().Be(held ? data.Hits[p] : sentinel, $"hit at {x},{y}");
            }
        }
    }

    [Fact]
    public void A_missing_counter_or_another_image_size_is_refused_naming_the_file()
    {
        PixelData data = PixelFileTests.Large();
        int n = data.Width * data.Height;
        using MemoryStream stream = PixelFileTests.Written(data);
        FluentActions.Invoking(() => PixelDataFile.ReadTiles(stream, "s1/pixels-dda-mask.bin.gz", new TileShare(1, 2), data.Width, data.Height,
                ["iterations", "made-up"], [new uint[n], new uint[n]], new PixelHit[n]))
            .Should().Throw<InputException>().Which.Message.Should().Be("s1/pixels-dda-mask.bin.gz: pixel data of dda-mask has no counter made-up; trace the shards again");

        using MemoryStream again = PixelFileTests.Written(data);
        FluentActions.Invoking(() => PixelDataFile.ReadTiles(again, "s1/pixels-dda-mask.bin.gz", new TileShare(1, 2), 200, 450,
                ["iterations"], [new uint[n]], new PixelHit[n]))
            .Should().Throw<InputException>().Which.Message.Should().Be("s1/pixels-dda-mask.bin.gz: 300x300 pixels, expected 200x450; trace the shard again");
    }
}
