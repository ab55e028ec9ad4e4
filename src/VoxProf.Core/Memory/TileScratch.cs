using VoxProf.Core.Traversal;

namespace VoxProf.Core.Memory;

/// <summary>Buffers one thread reuses from tile to tile.</summary>
internal sealed class TileScratch
{
    private int[] _lines = new int[8192];
    private int[] _union = new int[8192];
    private LruCache? _cache;

    /// <summary>Where each pixel's sorted distinct lines end in <see cref="Lines"/>.</summary>
    public int[] PixelEnds { get; private set; } = new int[Tracer.TileSize * Tracer.TileSize];

    public int[] Lines(int capacity)
    {
        if (_lines.Length < capacity)
            _lines = new int[Math.Max(capacity, 2 * _lines.Length)];
        return _lines;
    }

    public int[] Union(int capacity)
    {
        if (_union.Length < capacity)
            _union = new int[Math.Max(capacity, 2 * _union.Length)];
        return _union;
    }

    public ReadOnlySpan<int> PixelLinesOf(int k)
    {
        int start = k == 0 ? 0 : PixelEnds[k - 1];
        return _lines.AsSpan(start, PixelEnds[k] - start);
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
