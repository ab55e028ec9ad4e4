using System.Collections.Concurrent;
using System.Runtime.CompilerServices;
using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Memory;

/// <summary>
/// The memory model of one strategy's image, fed one tracer tile at a time from any thread: each tile's recorded
/// node reads become the pixels' <see cref="Counter.CacheLines"/>, the lockstep groups' distinct lines, and a replay
/// through a cache of its own that starts empty (docs/counters.md, "Memory traffic"). Every tile is processed alone
/// and the totals are sums of integers, so results do not depend on the thread count or the order tiles finish in.
/// </summary>
public sealed partial class FrameMemory
{
    /// <summary>Size of the per-pixel memory of recent nodes (a power of two).</summary>
    private const int RecentNodes = 32;

    private readonly MemorySettings _settings;
    private readonly NodeLayout _layout;
    private readonly int _width;
    private readonly uint[][] _groupLines;
    private readonly ConcurrentBag<TileReads> _pool = [];
    private readonly bool _gather;
    private readonly bool _wide;
    private long _accesses;
    private long _hits;

    public FrameMemory(MemorySettings settings, NodeLayout layout, int width, int height)
        : this(settings, layout, width, height, allowGather: true, allowWide: true)
    {
    }

    /// <param name="allowGather">False keeps the pixels' lines and the replay on the one-at-a-time code even where <see cref="VectorReads"/> runs, so tests can hold the two to one answer.</param>
    /// <param name="allowWide">False keeps <see cref="VectorReads"/> to eight lanes even where it could take sixteen, for the same reason.</param>
    internal FrameMemory(MemorySettings settings, NodeLayout layout, int width, int height, bool allowGather, bool allowWide)
    {
        if (settings.Problem() is { } problem)
            throw new ArgumentException(problem, nameof(settings));
        foreach (SubgroupShape s in SubgroupShape.Standard.Append(settings.Group))
        {
            // A group must lie inside one tracer tile, since each tile is modelled alone.
            if (Tracer.TileSize % s.TileWidth != 0 || Tracer.TileSize % s.TileHeight != 0)
                throw new InvalidOperationException($"{s.Name} tiles do not divide the tracer's {Tracer.TileSize}-pixel tiles");
        }
        _settings = settings;
        _layout = layout;
        _width = width;
        _groupLines = SubgroupShape.Standard.Select(s => new uint[s.TilesX(width) * s.TilesY(height)]).ToArray();
        _gather = allowGather && VectorReads.IsSupported && settings.Group.Lanes <= VectorReads.MaxLanes;
        // VectorReads takes sixteen lanes only where the processor has them.
        _wide = allowWide;
    }

    /// <summary>
    /// A recorder for the tile [x0, x1) × [y0, y1), attached to this thread's <see cref="MemoryCounts{TCounts, TRoom}"/> until
    /// <see cref="EndTile"/>, which must run on the same thread.
    /// </summary>
    public TileReads BeginTile(int x0, int y0, int x1, int y1)
    {
        if (!_pool.TryTake(out TileReads? reads))
            reads = new TileReads();
        reads.Begin(x0, y0, x1, y1);
        TileReads.Attach(reads);
        return reads;
    }

    /// <summary>Models the recorded tile, writing each pixel's distinct lines into <paramref name="cacheLines"/> (the image's buffer).</summary>
    public void EndTile(TileReads reads, uint[] cacheLines)
    {
        TileReads.Attach(null);
        if (reads.Pixels != (reads.X1 - reads.X0) * (reads.Y1 - reads.Y0))
            throw new InvalidOperationException($"the tile's {reads.Pixels} pixels were not all flushed");
        TileScratch scratch = reads.Scratch;
        PixelLines(reads, scratch, cacheLines);
        SubgroupShape smallest = SubgroupShape.Standard[0];
        GroupsOf(reads, scratch, smallest, _groupLines[0], keep: true);
        for (int i = 1; i < _groupLines.Length; i++)
        {
            SubgroupShape shape = SubgroupShape.Standard[i];
            if (shape.TileWidth % smallest.TileWidth == 0 && shape.TileHeight % smallest.TileHeight == 0)
                GroupsOfGroups(reads, scratch, smallest, shape, _groupLines[i]);
            else
                GroupsOf(reads, scratch, shape, _groupLines[i], keep: false);
        }
        (long accesses, long hits) = Replay(reads, scratch);
        Interlocked.Add(ref _accesses, accesses);
        Interlocked.Add(ref _hits, hits);
        _pool.Add(reads);
    }

    /// <summary>The result once every tile has ended.</summary>
    public MemoryResult Finish() => new(_settings,
        SubgroupShape.Standard.Select((s, i) => new GroupLines(s, _groupLines[i])).ToArray(),
        Interlocked.Read(ref _accesses), Interlocked.Read(ref _hits));

    /// <summary>
    /// Each pixel's distinct lines, kept per pixel in the scratch for the group unions (which need them in no order).
    /// A pixel of a few reads (a tree strategy's, about eight) counts its lines in a small table on the stack, emptied
    /// per pixel; one of many reads (grid's, over a thousand, rereading a few dozen nodes) goes through the set.
    /// </summary>
    [SkipLocalsInit]
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void PixelLines(TileReads reads, TileScratch scratch, uint[] cacheLines)
    {
        int shift = _settings.LineShift;
        int perRecord = _layout.MaxLinesPerRecord(shift);
        int fewReads = FewSlots / 2 / perRecord;
        LineSet set = scratch.Set;
        Span<int> recent = stackalloc int[RecentNodes];
        Span<int> slots = stackalloc int[FewSlots];
        int at = 0;
        int x = reads.X0, row = reads.Y0 * _width;
        for (int k = 0; k < reads.Pixels; k++)
        {
            ReadOnlySpan<int> nodes = reads.Of(k);
            int count;
            if (nodes.Length <= fewReads)
            {
                count = FewLines(nodes, slots, scratch.Lines(at + nodes.Length * perRecord).AsSpan(at), _layout, shift);
            }
            else
            {
                set.Clear();
                recent.Fill(-1);
                if (_gather)
                {
                    VectorReads.AddPixel(nodes, recent, set, _layout, shift, _wide);
                }
                else
                {
                    foreach (int node in nodes)
                        AddRead(node, recent, set, _layout, shift);
                }
                count = set.Count;
                set.Members.CopyTo(scratch.Lines(at + count).AsSpan(at));
            }
            at += count;
            scratch.PixelEnds[k] = at;
            cacheLines[row + x] = (uint)count;
            if (++x == reads.X1)
            {
                x = reads.X0;
                row += _width;
            }
        }
    }

    /// <summary>Slots of a pixel's table of lines: it takes 32 lines.</summary>
    private const int FewSlots = 64;

    /// <summary>Slots of a group's table of lines: it takes 128 lines; a group with more goes through the set.</summary>
    private const int GroupSlots = 256;

    /// <summary>
    /// The distinct lines of a few reads' records into <paramref name="lines"/>, first appearance first, counted in a
    /// <see cref="LineTable"/> on <paramref name="slots"/>, which must take every line the reads can touch.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static int FewLines(ReadOnlySpan<int> nodes, Span<int> slots, Span<int> lines, NodeLayout layout, int shift)
    {
        var table = new LineTable(slots, lines);
        foreach (int node in nodes)
        {
            int last = layout.LastLine(node, shift);
            for (int line = layout.FirstLine(node, shift); line <= last; line++)
            {
                if (!table.Add(line))
                    throw new InvalidOperationException("a pixel of few reads touched more lines than its table takes");
            }
        }
        return table.Count;
    }

    /// <summary>
    /// Adds the lines of one read's node to a pixel's set, unless the pixel's memory of recent nodes has it: a
    /// direct-mapped memory that skips most rereads (grid rereads the few nodes above each voxel for every voxel)
    /// before their lines are hashed.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal static void AddRead(int node, Span<int> recent, LineSet set, NodeLayout layout, int shift)
    {
        ref int seen = ref recent[node & (recent.Length - 1)];
        if (seen == node)
            return;
        seen = node;
        int last = layout.LastLine(node, shift);
        for (int line = layout.FirstLine(node, shift); line <= last; line++)
            set.Add(line);
    }

    /// <summary>
    /// Each group's distinct lines, the union of its pixels' lines, in a <see cref="LineTable"/> (a set when a group
    /// has more than it takes); with <paramref name="keep"/>, also kept in the scratch, group after group in row order
    /// within the tile, for <see cref="GroupsOfGroups"/>.
    /// </summary>
    [SkipLocalsInit]
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void GroupsOf(TileReads reads, TileScratch scratch, SubgroupShape shape, uint[] groups, bool keep)
    {
        int tileWidth = reads.X1 - reads.X0;
        int tilesX = shape.TilesX(_width);
        Span<int> slots = stackalloc int[GroupSlots];
        Span<int> unkept = stackalloc int[GroupSlots / 2];
        int group = 0, at = 0;
        for (int gy = reads.Y0; gy < reads.Y1; gy += shape.TileHeight)
        {
            for (int gx = reads.X0; gx < reads.X1; gx += shape.TileWidth)
            {
                int y1 = Math.Min(gy + shape.TileHeight, reads.Y1), x1 = Math.Min(gx + shape.TileWidth, reads.X1);
                var table = new LineTable(slots, keep ? scratch.GroupLines(at + GroupSlots / 2).AsSpan(at) : unkept);
                bool fits = true;
                for (int y = gy; y < y1 && fits; y++)
                {
                    for (int x = gx; x < x1 && fits; x++)
                    {
                        foreach (int line in scratch.PixelLinesOf((y - reads.Y0) * tileWidth + x - reads.X0))
                            fits &= table.Add(line);
                    }
                }
                int count = table.Count;
                if (!fits)
                {
                    LineSet set = scratch.Set;
                    set.Clear();
                    for (int y = gy; y < y1; y++)
                    {
                        for (int x = gx; x < x1; x++)
                        {
                            foreach (int line in scratch.PixelLinesOf((y - reads.Y0) * tileWidth + x - reads.X0))
                                set.Add(line);
                        }
                    }
                    count = set.Count;
                    if (keep)
                        set.Members.CopyTo(scratch.GroupLines(at + count).AsSpan(at));
                }
                groups[gy / shape.TileHeight * tilesX + gx / shape.TileWidth] = (uint)count;
                if (keep)
                {
                    at += count;
                    scratch.GroupEnds[group++] = at;
                }
            }
        }
    }

    /// <summary>
    /// The groups of <paramref name="shape"/>, each made of whole groups of <paramref name="smaller"/> (a 64-lane 8×8
    /// group is two 32-lane 8×4 ones): the union of those groups' lines, which <see cref="GroupsOf"/> kept. A line is
    /// then added once per smaller group that touched it rather than once per pixel, about a twelfth as many adds on a
    /// tree strategy. Both tiles start on the tracer tile's corner, which the constructor holds both shapes to divide.
    /// </summary>
    [SkipLocalsInit]
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void GroupsOfGroups(TileReads reads, TileScratch scratch, SubgroupShape smaller, SubgroupShape shape, uint[] groups)
    {
        int tilesX = shape.TilesX(_width);
        int smallerPerRow = (reads.X1 - reads.X0 + smaller.TileWidth - 1) / smaller.TileWidth;
        Span<int> slots = stackalloc int[GroupSlots];
        Span<int> members = stackalloc int[GroupSlots / 2];
        for (int gy = reads.Y0; gy < reads.Y1; gy += shape.TileHeight)
        {
            for (int gx = reads.X0; gx < reads.X1; gx += shape.TileWidth)
            {
                int y1 = Math.Min(gy + shape.TileHeight, reads.Y1), x1 = Math.Min(gx + shape.TileWidth, reads.X1);
                var table = new LineTable(slots, members);
                bool fits = true;
                for (int sy = gy; sy < y1 && fits; sy += smaller.TileHeight)
                {
                    for (int sx = gx; sx < x1 && fits; sx += smaller.TileWidth)
                    {
                        foreach (int line in scratch.GroupLinesOf((sy - reads.Y0) / smaller.TileHeight * smallerPerRow + (sx - reads.X0) / smaller.TileWidth))
                            fits &= table.Add(line);
                    }
                }
                int count = table.Count;
                if (!fits)
                {
                    LineSet set = scratch.Set;
                    set.Clear();
                    for (int sy = gy; sy < y1; sy += smaller.TileHeight)
                    {
                        for (int sx = gx; sx < x1; sx += smaller.TileWidth)
                        {
                            foreach (int line in scratch.GroupLinesOf((sy - reads.Y0) / smaller.TileHeight * smallerPerRow + (sx - reads.X0) / smaller.TileWidth))
                                set.Add(line);
                        }
                    }
                    count = set.Count;
                }
                groups[gy / shape.TileHeight * tilesX + gx / shape.TileWidth] = (uint)count;
            }
        }
    }
}
