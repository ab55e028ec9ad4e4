using System.Runtime.CompilerServices;

namespace VoxProf.Core.Traversal;

/// <summary>
/// One tile's per-pixel counts, counter by counter: counter c of the pixel in slot s (row-major within the tile) is
/// element c·<see cref="Slots"/> + s. Rays flush their counts here, in the first-level cache, and the tile goes into
/// the image's per-counter buffers when it is done, leaving out the counters that stayed zero on it: every counter
/// written costs the cache misses of sixteen rows scattered over the image, and most strategies leave several counters
/// at zero everywhere (`dda` the two mask counters, a run without the prepass its three; the memory model writes the
/// cache lines itself). Flushed straight into the image's buffers, every ray wrote all eight built-in counters
/// (docs/performance.md, "Fewer scattered writes per pixel").
/// </summary>
internal static class TileCounts
{
    /// <summary>Pixels of a whole tile.</summary>
    public const int Slots = Tracer.TileSize * Tracer.TileSize;

    /// <summary>Index of counter <paramref name="counter"/> of slot <paramref name="slot"/> in a tile's counts.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static int Index(int counter, int slot) => counter * Slots + slot;

    /// <summary>Counters a tile's counts <paramref name="tile"/> holds per pixel.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static int Counters(ReadOnlySpan<uint> tile) => tile.Length / Slots;

    /// <summary>
    /// Copies the tile [x0, x1) × [y0, y1) of <paramref name="tile"/> into the image's buffers (one per counter, rows
    /// <paramref name="width"/> pixels long, zero where no tile has written yet). A counter that is zero on the whole
    /// tile is not copied: most strategies leave several counters at zero everywhere, and each counter copied costs the
    /// cache misses of sixteen scattered rows.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void CopyTo(ReadOnlySpan<uint> tile, uint[][] buffers, int width, int x0, int y0, int x1, int y1)
    {
        int w = x1 - x0;
        for (int c = 0; c < buffers.Length; c++)
        {
            ReadOnlySpan<uint> counts = tile.Slice(Index(c, 0), Slots);
            if (!counts.ContainsAnyExcept(0u))
                continue;
            uint[] buffer = buffers[c];
            for (int y = y0; y < y1; y++)
                counts.Slice((y - y0) * Tracer.TileSize, w).CopyTo(buffer.AsSpan(y * width + x0, w));
        }
    }
}
