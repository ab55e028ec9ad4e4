using System.Numerics;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// A tile's prepass shares are written a block at a time (PrepassMap.FillShares): they must be, pixel by pixel, what
/// PrepassMap.Share gives, on images whose right and bottom blocks are cut short.
/// </summary>
public class PrepassShareTests
{
    [Theory]
    [InlineData(2, 37, 23)]
    [InlineData(4, 37, 23)]
    [InlineData(8, 37, 23)]
    [InlineData(4, 64, 32)]
    public void Tile_shares_are_the_per_pixel_shares_and_add_up_to_each_block(int block, int width, int height)
    {
        const int size = 24;
        BrickTree tree = DenseTree.Build(size, size, size, (x, y, z) => (x * 7 + y * 3 + z) % 11 == 0 ? (byte)1 : (byte)0, 2);
        var camera = new Camera(new CameraSpec("c", new Vector3(-30, 40, -20), new Vector3(12, 10, 12), Vector3.UnitY, 50), width, height);
        PrepassMap map = PrepassMap.Compute(tree, camera, block, new ParallelOptions { MaxDegreeOfParallelism = 1 });

        var iterations = new uint[width * height];
        var lookups = new uint[width * height];
        Span<uint> tile = new uint[(int)Counter.PrepassSkip * TileCounts.Slots + TileCounts.Slots];
        for (int y0 = 0; y0 < height; y0 += Tracer.TileSize)
        {
            for (int x0 = 0; x0 < width; x0 += Tracer.TileSize)
            {
                int x1 = Math.Min(width, x0 + Tracer.TileSize), y1 = Math.Min(height, y0 + Tracer.TileSize);
                tile.Fill(uint.MaxValue);
                map.FillShares(tile, x0, y0, x1, y1);
                for (int y = y0; y < y1; y++)
                {
                    for (int x = x0; x < x1; x++)
                    {
                        int slot = (y - y0) * Tracer.TileSize + (x - x0);
                        iterations[y * width + x] = tile[TileCounts.Index((int)Counter.PrepassIterations, slot)];
                        lookups[y * width + x] = tile[TileCounts.Index((int)Counter.PrepassNodeFetches, slot)];
                    }
                }
            }
        }

        long totalIterations = 0;
        for (int y = 0; y < height; y++)
        {
            for (int x = 0; x < width; x++)
            {
                iterations[y * width + x].Should().Be(map.Share(map.BlockIterations(x, y), x, y, width, height), "pixel ({0}, {1})", x, y);
                lookups[y * width + x].Should().Be(map.Share(map.BlockNodeFetches(x, y), x, y, width, height));
                totalIterations += iterations[y * width + x];
            }
        }
        long blockTotal = 0;
        for (int by = 0; by < map.BlocksY; by++)
            for (int bx = 0; bx < map.BlocksX; bx++)
                blockTotal += map.BlockIterations(bx * block, by * block);
        totalIterations.Should().Be(blockTotal).And.BeGreaterThan(0);
    }

    [Fact]
    public void A_tile_that_does_not_start_on_a_block_is_refused()
    {
        BrickTree tree = DenseTree.Build(8, 8, 8, (x, y, z) => 0, 2);
        var camera = new Camera(new CameraSpec("c", new Vector3(-5, 4, -5), new Vector3(4, 4, 4), Vector3.UnitY, 50), 32, 32);
        PrepassMap map = PrepassMap.Compute(tree, camera, 4, new ParallelOptions());
        var act = () => map.FillShares(new uint[(int)Counter.PrepassSkip * TileCounts.Slots + TileCounts.Slots], 2, 0, 18, 16);
        act.Should().Throw<ArgumentException>();
    }
}
