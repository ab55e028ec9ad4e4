using System.Numerics;
using VoxProf.Core.Rays;
using VoxProf.Core.Scenes;
using VoxProf.Core.Traversal;
using VoxProf.Core.Trees;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// How the prepass charges its coarse rays' work: a tile's counts, written a block at a time (PrepassMap.FillShares),
/// must be PrepassMap.Share of each block's charge pixel by pixel, on images whose right and bottom blocks are cut
/// short; and each block's charge is its own coarse ray's work plus even shares of the enclosing blocks' rays, which
/// add up to every coarse ray's work.
/// </summary>
public class PrepassShareTests
{
    [Theory]
    [InlineData(2, 37, 23)]
    [InlineData(4, 37, 23)]
    [InlineData(8, 37, 23)]
    [InlineData(4, 80, 48)]
    public void Tile_counts_are_the_blocks_shares_and_add_up_to_every_coarse_ray(int block, int width, int height)
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
                // Whatever the previous tile left: the shares must overwrite it.
                tile.Fill(12345);
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

        PrepassLevel finest = map.Levels[^1];
        finest.Block.Should().Be(block);
        map.Levels.Should().HaveCountGreaterThan(1, "coarse rays run for blocks of 32 pixels down to K");
        for (int y = 0; y < height; y++)
        {
            for (int x = 0; x < width; x++)
            {
                iterations[y * width + x].Should().Be(map.Share(map.BlockIterations(x, y), x, y), "pixel ({0}, {1})", x, y);
                lookups[y * width + x].Should().Be(map.Share(map.BlockNodeFetches(x, y), x, y));
            }
        }
        for (int y = 0; y < height; y += block)
        {
            for (int x = 0; x < width; x += block)
            {
                // A block is charged its own coarse ray's work and at most a rounded-up even share of each enclosing one.
                long most = finest.IterationsAt(x, y) + map.Levels.SkipLast(1).Sum(l =>
                {
                    int per = l.Block / block;
                    return (long)Math.Ceiling(l.IterationsAt(x, y) / (double)(Math.Min(per, finest.BlocksX - x / l.Block * per) * Math.Min(per, finest.BlocksY - y / l.Block * per)));
                });
                ((long)map.BlockIterations(x, y)).Should().BeInRange(finest.IterationsAt(x, y), most);
            }
        }
        iterations.Sum(v => (long)v).Should().Be(map.TotalIterations).And.BeGreaterThan(Enumerable.Range(0, map.Levels[^1].BlocksX * map.Levels[^1].BlocksY).Sum(i => (long)map.Levels[^1].IterationsAt(i % map.Levels[^1].BlocksX * block, i / map.Levels[^1].BlocksX * block)));
        lookups.Sum(v => (long)v).Should().Be(map.TotalLookups);
    }

    [Fact]
    public void The_map_is_the_same_on_one_thread_and_on_two()
    {
        BrickTree tree = DenseTree.Build(40, 40, 40, (x, y, z) => (x * 5 + y * 11 + z * 3) % 23 == 0 ? (byte)2 : (byte)0, 4);
        var camera = new Camera(new CameraSpec("c", new Vector3(-25, 60, -30), new Vector3(20, 15, 20), Vector3.UnitY, 60), 150, 70);
        PrepassMap one = PrepassMap.Compute(tree, camera, 4, new ParallelOptions { MaxDegreeOfParallelism = 1 });
        PrepassMap two = PrepassMap.Compute(tree, camera, 4, new ParallelOptions { MaxDegreeOfParallelism = 2 });
        for (int y = 0; y < 70; y++)
        {
            for (int x = 0; x < 150; x++)
            {
                two.Start(x, y).Should().Be(one.Start(x, y));
                two.BlockIterations(x, y).Should().Be(one.BlockIterations(x, y));
                two.BlockNodeFetches(x, y).Should().Be(one.BlockNodeFetches(x, y));
            }
        }
        one.TotalIterations.Should().BeGreaterThan(0);
    }

    [Fact]
    public void A_region_that_is_no_tile_of_the_image_is_refused()
    {
        BrickTree tree = DenseTree.Build(8, 8, 8, (x, y, z) => 0, 2);
        var camera = new Camera(new CameraSpec("c", new Vector3(-5, 4, -5), new Vector3(4, 4, 4), Vector3.UnitY, 50), 32, 32);
        PrepassMap map = PrepassMap.Compute(tree, camera, 4, new ParallelOptions());
        var act = () => map.FillShares(new uint[(int)Counter.PrepassSkip * TileCounts.Slots + TileCounts.Slots], 2, 0, 18, 16);
        act.Should().Throw<ArgumentException>();
    }
}
