using VoxProf.Core.Traversal;

namespace VoxProf.Core.Memory;

/// <summary>Buffers one thread reuses from tile to tile.</summary>
internal sealed class TileScratch
{
    private int[] _lines = new int[8192];
    private int[] _groupLines = new int[1024];
    private LruCache? _cache;

    /// <summary>Where each pixel's distinct lines end in <see cref="Lines"/>.</summary>
    public int[] PixelEnds { get; private set; } = new int[Tracer.TileSize * Tracer.TileSize];

    /// <summary>Each pixel's distinct lines, one pixel after another; grown, keeping what it holds, to <paramref name="capacity"/>.</summary>
    public int[] Lines(int capacity)
    {
        if (_lines.Length < capacity)
            Array.Resize(ref _lines, Math.Max(capacity, 2 * _lines.Length));
        return _lines;
    }

    /// <summary>The set a pixel's or a group's distinct lines are counted in.</summary>
    public LineSet Set { get; } = new();

    public ReadOnlySpan<int> PixelLinesOf(int k)
    {
        int start = k == 0 ? 0 : PixelEnds[k - 1];
        return _lines.AsSpan(start, PixelEnds[k] - start);
    }

    /// <summary>Where each of the tile's smallest groups' distinct lines end in <see cref="GroupLines"/>, group after group in row order.</summary>
    public int[] GroupEnds { get; } = new int[Tracer.TileSize * Tracer.TileSize];

    /// <summary>The smallest groups' distinct lines; grown, keeping what it holds, to <paramref name="capacity"/>.</summary>
    public int[] GroupLines(int capacity)
    {
        if (_groupLines.Length < capacity)
            Array.Resize(ref _groupLines, Math.Max(capacity, 2 * _groupLines.Length));
        return _groupLines;
    }

    public ReadOnlySpan<int> GroupLinesOf(int group)
    {
        int start = group == 0 ? 0 : GroupEnds[group - 1];
        return _groupLines.AsSpan(start, GroupEnds[group] - start);
    }

    public void EnsurePixels(int pixels)
    {
        if (PixelEnds.Length < pixels)
            PixelEnds = new int[pixels];
    }

    public LruCache Cache(MemorySettings settings)
    {
        if (_cache is null || _cache.Sets != settings.Sets || _cache.Ways != settings.Ways)
            _cache = new LruCache(settings.Sets, settings.Ways);
        return _cache;
    }
}
