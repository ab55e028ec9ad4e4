using System.Runtime.CompilerServices;
using VoxProf.Core.Statistics;

namespace VoxProf.Core.Memory;

/// <summary>The memory model's replay of a tile's reads through its cache (docs/counters.md, "Memory traffic").</summary>
public sealed partial class FrameMemory
{
    /// <summary>
    /// Replays the tile through an empty cache: the lockstep groups in row-major order; within a group, step k
    /// issues the k-th read of every lane that still has one, in lane order, and the distinct lines of that step
    /// (lanes reading one line share one request) go to the cache in the order they first appear.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private (long Accesses, long Hits) Replay(TileReads reads, TileScratch scratch)
    {
        SubgroupShape shape = _settings.Group;
        LruCache cache = scratch.Cache(_settings);
        cache.Clear();
        int shift = _settings.LineShift;
        int tileWidth = reads.X1 - reads.X0;
        // Whole blocks of eight lanes for the vector step; a lane past the group's stays empty (start = end = 0).
        int padded = VectorReads.PaddedLanes(shape.Lanes);
        Span<int> starts = stackalloc int[padded];
        Span<int> ends = stackalloc int[padded];
        Span<int> nodes = stackalloc int[shape.Lanes];
        Span<int> lines = stackalloc int[shape.Lanes * _layout.MaxLinesPerRecord(shift)];
        long accesses = 0, hits = 0;
        for (int gy = reads.Y0; gy < reads.Y1; gy += shape.TileHeight)
        {
            for (int gx = reads.X0; gx < reads.X1; gx += shape.TileWidth)
            {
                int lanes = 0, longest = 0;
                for (int y = gy; y < Math.Min(gy + shape.TileHeight, reads.Y1); y++)
                {
                    for (int x = gx; x < Math.Min(gx + shape.TileWidth, reads.X1); x++)
                    {
                        int k = (y - reads.Y0) * tileWidth + x - reads.X0;
                        starts[lanes] = reads.Start(k);
                        ends[lanes] = starts[lanes] + reads.Of(k).Length;
                        longest = Math.Max(longest, ends[lanes] - starts[lanes]);
                        lanes++;
                    }
                }
                starts[lanes..].Clear();
                ends[lanes..].Clear();
                if (_gather)
                {
                    (long a, long h) = VectorReads.Replay(reads.All, starts, ends, longest, nodes, lines, _layout, shift, cache, _wide);
                    accesses += a;
                    hits += h;
                    continue;
                }
                for (int s = 0; s < longest; s++)
                {
                    int nodeCount = StepNodes(reads.All, starts[..lanes], ends[..lanes], s, nodes);
                    int lineCount = StepLines(_layout, nodes[..nodeCount], lines, shift);
                    hits += Issue(cache, lines[..lineCount]);
                    accesses += lineCount;
                }
            }
        }
        return (accesses, hits);
    }

    /// <summary>
    /// The distinct nodes lanes read at step <paramref name="step"/>, first appearance first, lane by lane: where the
    /// vector step (<see cref="VectorReads"/>, AVX2) does not run. A node seen again adds nothing. The lanes of a step
    /// mostly read the same few nodes (about 2.3 distinct ones per 32-lane step on the sample scene's grid trace, which
    /// makes over a thousand reads a pixel), so they are kept in a short list searched straight through: hashing every
    /// read, as before, made the replay about a quarter slower (docs/performance.md, "The memory model's replay").
    /// </summary>
    private static int StepNodes(ReadOnlySpan<int> all, ReadOnlySpan<int> starts, ReadOnlySpan<int> ends, int step, Span<int> nodes)
    {
        int nodeCount = 0, previous = -1;
        for (int lane = 0; lane < starts.Length && lane < ends.Length; lane++)
        {
            int at = starts[lane] + step;
            if (at >= ends[lane])
                continue;
            int node = all[at];
            // Neighbouring lanes often read the same node at the same step.
            if (node == previous)
                continue;
            previous = node;
            if (IndexOf(nodes, nodeCount, node) < 0)
                nodes[nodeCount++] = node;
        }
        return nodeCount;
    }

    /// <summary>
    /// The distinct lines of a step's distinct <paramref name="nodes"/>, in the order they first appear, into
    /// <paramref name="lines"/>; returns how many. The lines of the nodes in the order the nodes first appear are the
    /// step's lines in order.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static int StepLines(NodeLayout layout, ReadOnlySpan<int> nodes, Span<int> lines, int shift)
    {
        int lineCount = 0;
        foreach (int node in nodes)
        {
            int last = layout.LastLine(node, shift);
            for (int line = layout.FirstLine(node, shift); line <= last; line++)
            {
                if (IndexOf(lines, lineCount, line) < 0)
                    lines[lineCount++] = line;
            }
        }
        return lineCount;
    }

    /// <summary>A step's lines sent to the cache in order; returns how many hit.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static int Issue(LruCache cache, ReadOnlySpan<int> lines)
    {
        int hits = 0;
        foreach (int line in lines)
        {
            if (cache.Access(line))
                hits++;
        }
        return hits;
    }

    /// <summary>
    /// Where <paramref name="value"/> is among the first <paramref name="count"/> items, or -1. Inlined: a step's lists
    /// are a few items long, and a call per lookup to the library's vectorised search made the replay slower here.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static int IndexOf(Span<int> items, int count, int value)
    {
        for (int i = 0; i < count && i < items.Length; i++)
        {
            if (items[i] == value)
                return i;
        }
        return -1;
    }
}
