namespace VoxProf.Core.Traversal;

/// <summary>
/// Share <see cref="Index"/> (1-based) of <see cref="Count"/> of an image's <see cref="Tracer.TileSize"/>-pixel tiles:
/// tile t (row-major over the tile grid) belongs to share t mod Count + 1, so the rows of a view, which cost about
/// the same side by side, spread over the shares. The assignment depends only on the image size, never on threads.
/// </summary>
public sealed record TileShare(int Index, int Count)
{
    /// <summary>Whether tile <paramref name="tile"/> belongs to this share.</summary>
    public bool Holds(int tile) => tile % Count == Index - 1;

    /// <summary>The tiles of a <paramref name="width"/> × <paramref name="height"/> image in this share, in row-major order.</summary>
    public int[] Tiles(int width, int height)
    {
        if (Count < 1 || Index < 1 || Index > Count)
            throw new ArgumentOutOfRangeException(nameof(Index), "tile share index must be 1..count");
        int all = Tracer.TilesX(width) * Tracer.TilesY(height);
        var held = new int[Math.Max(0, (all - Index + Count) / Count)];
        for (int i = 0, t = Index - 1; t < all; t += Count)
            held[i++] = t;
        return held;
    }
}
