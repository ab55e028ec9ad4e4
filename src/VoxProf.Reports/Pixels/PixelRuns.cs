using VoxProf.Core.Traversal;

namespace VoxProf.Reports.Pixels;

/// <summary>
/// Which pixels of a whole image a reader keeps: every pixel, or those of one share's tracer tiles (a merge of tile
/// shards, where each shard's file holds the whole image with zeros in the other shards' tiles). Pixels, numbered
/// y * width + x, come in runs that are all kept or all passed over, each at most a tile's row.
/// </summary>
internal readonly struct PixelRuns
{
    private readonly bool[]? _held;
    private readonly int _width;
    private readonly int _tilesX;

    /// <summary>Every pixel kept: one run to the end of whatever is asked.</summary>
    public static PixelRuns All => default;

    public PixelRuns(TileShare share, int width, int height)
    {
        _width = width;
        _tilesX = Tracer.TilesX(width);
        _held = new bool[_tilesX * Tracer.TilesY(height)];
        foreach (int tile in share.Tiles(width, height))
            _held[tile] = true;
    }

    /// <summary>The end of the run that starts at pixel <paramref name="i"/>, at most <paramref name="end"/>, and whether its pixels are kept.</summary>
    public int RunEnd(int i, int end, out bool held)
    {
        if (_held is null)
        {
            held = true;
            return end;
        }
        int y = i / _width, tx = (i - y * _width) / Tracer.TileSize;
        held = _held[y / Tracer.TileSize * _tilesX + tx];
        return Math.Min(end, y * _width + Math.Min(_width, (tx + 1) * Tracer.TileSize));
    }
}
