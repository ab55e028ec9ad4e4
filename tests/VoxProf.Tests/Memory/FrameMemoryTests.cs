using FluentAssertions;
using VoxProf.Core.Memory;
using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;
using Xunit;

namespace VoxProf.Tests.Memory;

/// <summary>The memory model fed made-up node reads through the tracer's protocol, against an obvious replay.</summary>
public sealed class FrameMemoryTests
{
    internal sealed record Frame(int Width, int Height, int[][] Reads);

    /// <summary>Random reads per pixel: a few popular nodes (the tree's top) and a wide spread of others.</summary>
    private static Frame RandomFrame(int seed, int width, int height)
    {
        var rng = new Random(seed);
        var reads = new int[width * height][];
        for (int p = 0; p < reads.Length; p++)
            reads[p] = Enumerable.Range(0, rng.Next(0, 40)).Select(_ => rng.Next(4) == 0 ? rng.Next(6) : rng.Next(3000)).ToArray();
        return new Frame(width, height, reads);
    }

    /// <summary>Runs the frame through <see cref="FrameMemory"/> tile by tile, as the tracer does.</summary>
    internal static (MemoryResult Result, uint[] CacheLines) Model(Frame f, MemorySettings settings, int recordBytes = 24, bool gather = true, bool wide = true)
    {
        var memory = new FrameMemory(settings, new NodeLayout(recordBytes), f.Width, f.Height, gather, wide);
        var buffers = new uint[CounterNames.Count][];
        for (int c = 0; c < buffers.Length; c++)
            buffers[c] = new uint[f.Width * f.Height];
        for (int y0 = 0; y0 < f.Height; y0 += Tracer.TileSize)
        {
            for (int x0 = 0; x0 < f.Width; x0 += Tracer.TileSize)
            {
                int x1 = Math.Min(f.Width, x0 + Tracer.TileSize), y1 = Math.Min(f.Height, y0 + Tracer.TileSize);
                TileReads reads = memory.BeginTile(x0, y0, x1, y1);
                var tile = new uint[buffers.Length * TileCounts.Slots];
                for (int y = y0; y < y1; y++)
                {
                    for (int x = x0; x < x1; x++)
                    {
                        MemoryCounts<CostCounts, TestedRoom> counts = default;
                        foreach (int node in f.Reads[y * f.Width + x])
                            counts.NodeFetch(node);
                        counts.Flush(tile, (y - y0) * Tracer.TileSize + (x - x0), reads);
                    }
                }
                TileCounts.CopyTo(tile, buffers, f.Width, x0, y0, x1, y1);
                memory.EndTile(reads, buffers[(int)Counter.CacheLines]);
            }
        }
        buffers[(int)Counter.NodeFetches].Should().Equal(f.Reads.Select(r => (uint)r.Length), "the counts pass through unchanged");
        return (memory.Finish(), buffers[(int)Counter.CacheLines]);
    }

    private static IEnumerable<int> LinesOf(int node, int lineBytes, int recordBytes)
    {
        long start = (long)node * recordBytes, end = start + recordBytes - 1;
        for (long line = start / lineBytes; line <= end / lineBytes; line++)
            yield return (int)line;
    }

    private static IEnumerable<int> PixelsOf(int gx, int gy, SubgroupShape s, Frame f) =>
        from y in Enumerable.Range(gy * s.TileHeight, s.TileHeight)
        from x in Enumerable.Range(gx * s.TileWidth, s.TileWidth)
        where x < f.Width && y < f.Height
        select y * f.Width + x;

    /// <summary>
    /// Reads as the grid strategy makes them: every voxel rereads the path of nodes above it, neighbouring pixels share
    /// most of it, and leaves vary. Consecutive rereads of one node, lanes reading one node in one step, and a set's
    /// most recent line read again are the common case here, not an accident.
    /// </summary>
    private static Frame CoherentFrame(int seed, int width, int height)
    {
        var rng = new Random(seed);
        var reads = new int[width * height][];
        for (int p = 0; p < reads.Length; p++)
        {
            int x = p % width, y = p / width;
            var path = new List<int>();
            for (int voxel = 0; voxel < rng.Next(5, 30); voxel++)
            {
                path.Add(0);
                path.Add(1 + (x / 8 + voxel / 10) % 4);
                path.Add(5 + (x / 2 + y / 2 + voxel / 3) % 40);
                path.Add(rng.Next(2) == 0 ? path[^1] : 100 + rng.Next(500));
            }
            reads[p] = [.. path];
        }
        return new Frame(width, height, reads);
    }

    [Theory]
    [InlineData(1, 64, 16384, 4, 24, false)]
    [InlineData(2, 128, 4096, 2, 24, false)]
    [InlineData(3, 64, 1024, 1, 24, false)]
    [InlineData(4, 64, 16384, 4, 136, false)] // 8³ records: up to three 64-byte lines each
    [InlineData(5, 128, 4096, 2, 136, false)]
    [InlineData(6, 64, 4096, 2, 24, true)]
    [InlineData(7, 64, 1024, 1, 136, true)]
    // The lane-by-lane search the replay keeps where the vector step (AVX2) does not run
    [InlineData(1, 64, 16384, 4, 24, false, false)]
    [InlineData(6, 64, 4096, 2, 24, true, false)]
    [InlineData(7, 64, 1024, 1, 136, true, false)]
    // Replay groups other than 32 lanes: 4 (half a block of eight), 64 (the most the vector step takes), 128 (more)
    [InlineData(8, 64, 4096, 2, 24, true, true, 2, 2)]
    [InlineData(9, 64, 4096, 4, 24, true, true, 8, 8)]
    [InlineData(10, 64, 4096, 4, 24, false, true, 16, 8)]
    // Eight lanes at a time where sixteen could run (AVX-512): the code machines without it take
    [InlineData(6, 64, 4096, 2, 24, true, true, 8, 4, false)]
    [InlineData(7, 64, 1024, 1, 136, true, true, 8, 4, false)]
    [InlineData(9, 64, 4096, 4, 24, true, true, 8, 8, false)]
    public void Pixel_and_group_lines_and_the_cache_replay_agree_with_an_obvious_replay(int seed, int lineBytes, int cacheBytes, int ways, int recordBytes, bool coherent,
        bool gather = true, int groupWidth = 8, int groupHeight = 4, bool wide = true)
    {
        // 37 × 21: partial tracer tiles and partial groups at the right and bottom.
        Frame f = coherent ? CoherentFrame(seed, 37, 21) : RandomFrame(seed, 37, 21);
        var settings = new MemorySettings(lineBytes, cacheBytes, ways) { Group = new SubgroupShape(groupWidth, groupHeight) };
        (MemoryResult result, uint[] cacheLines) = Model(f, settings, recordBytes, gather, wide);

        for (int p = 0; p < f.Reads.Length; p++)
            cacheLines[p].Should().Be((uint)f.Reads[p].SelectMany(n => LinesOf(n, lineBytes, recordBytes)).Distinct().Count(), $"pixel {p}");

        foreach (SubgroupShape s in SubgroupShape.Standard)
        {
            uint[] groups = result.Of(s)!.Lines;
            groups.Should().HaveCount(s.TilesX(f.Width) * s.TilesY(f.Height));
            for (int gy = 0; gy < s.TilesY(f.Height); gy++)
            {
                for (int gx = 0; gx < s.TilesX(f.Width); gx++)
                {
                    int expected = PixelsOf(gx, gy, s, f).SelectMany(p => f.Reads[p]).SelectMany(n => LinesOf(n, lineBytes, recordBytes)).Distinct().Count();
                    groups[gy * s.TilesX(f.Width) + gx].Should().Be((uint)expected, $"{s.Name} group ({gx}, {gy})");
                }
            }
        }

        // The replay written out plainly: per tracer tile an empty cache; its groups in row order; step k
        // takes the k-th read of each lane in lane order; a step's distinct lines, first appearance first.
        long accesses = 0, hits = 0;
        SubgroupShape g = settings.Group;
        for (int ty = 0; ty < f.Height; ty += Tracer.TileSize)
        {
            for (int tx = 0; tx < f.Width; tx += Tracer.TileSize)
            {
                var cache = new List<int>[settings.Sets];
                for (int i = 0; i < cache.Length; i++)
                    cache[i] = [];
                for (int gy = ty / g.TileHeight; gy * g.TileHeight < Math.Min(f.Height, ty + Tracer.TileSize); gy++)
                {
                    for (int gx = tx / g.TileWidth; gx * g.TileWidth < Math.Min(f.Width, tx + Tracer.TileSize); gx++)
                    {
                        int[][] lanes = PixelsOf(gx, gy, g, f).Select(p => f.Reads[p]).ToArray();
                        for (int k = 0; k < lanes.Max(l => l.Length); k++)
                        {
                            foreach (int line in lanes.Where(l => k < l.Length).SelectMany(l => LinesOf(l[k], lineBytes, recordBytes)).Distinct())
                            {
                                List<int> set = cache[line % settings.Sets];
                                accesses++;
                                if (set.Remove(line))
                                    hits++;
                                set.Insert(0, line);
                                if (set.Count > settings.Ways)
                                    set.RemoveAt(set.Count - 1);
                            }
                        }
                    }
                }
            }
        }
        (result.Accesses, result.Hits).Should().Be((accesses, hits));
        result.BytesFetched.Should().Be((accesses - hits) * lineBytes);
        hits.Should().BeGreaterThan(0).And.BeLessThan(accesses, "the case should exercise both hits and misses");
    }

    [Fact]
    public void Lanes_reading_the_same_record_in_the_same_step_share_one_request()
    {
        // Every pixel of one 8×4 group reads node 0, then node 2 (bytes 48..71: lines 0 and 1 of 64 bytes).
        var reads = new int[8 * 4][];
        for (int p = 0; p < reads.Length; p++)
            reads[p] = [0, 2];
        (MemoryResult result, uint[] cacheLines) = Model(new Frame(8, 4, reads), MemorySettings.Default);
        cacheLines.Should().OnlyContain(c => c == 2);
        result.Of(SubgroupShape.Lanes32)!.Lines.Should().Equal(2u);
        // Step 0: line 0, a miss. Step 1: lines 0 (hit) and 1 (miss).
        (result.Accesses, result.Hits, result.BytesFetched).Should().Be((3L, 1L, 128L));
    }

    [Fact]
    public void Settings_the_cache_cannot_have_are_refused_with_what_was_expected()
    {
        new MemorySettings(96).Problem().Should().Be("line size: 96 is not valid, expected 64 or 128 bytes");
        new MemorySettings(Ways: 0).Problem().Should().StartWith("ways: 0 is not valid");
        new MemorySettings(CacheBytes: 1000).Problem().Should().StartWith("cache size: 1000 bytes is not valid");
        MemorySettings.Default.Problem().Should().BeNull();
        MemorySettings.Default.Sets.Should().Be(64, "16 KiB of 64-byte lines in sets of 4");
    }
}
