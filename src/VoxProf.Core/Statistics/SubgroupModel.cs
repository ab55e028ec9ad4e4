using System.Buffers;
using System.Numerics;
using System.Runtime.CompilerServices;

namespace VoxProf.Core.Statistics;

/// <summary>
/// A subgroup (the lanes a GPU runs in lockstep) laid over the image as a tile of pixels. The lane-to-pixel layout
/// (8×4 for 32 lanes, 8×8 for 64) is a modelling choice, common practice for screen-space dispatches, not a property
/// of any one device.
/// </summary>
public readonly record struct SubgroupShape(int TileWidth, int TileHeight)
{
    /// <summary>32 lanes as 8×4 pixels.</summary>
    public static SubgroupShape Lanes32 => new(8, 4);

    /// <summary>64 lanes as 8×8 pixels.</summary>
    public static SubgroupShape Lanes64 => new(8, 8);

    /// <summary>The shapes every report models, in report order.</summary>
    public static IReadOnlyList<SubgroupShape> Standard { get; } = [Lanes32, Lanes64];

    public int Lanes => TileWidth * TileHeight;

    /// <summary>"subgroup32", "subgroup64": the name of the shape in reports, heatmaps and gate rules.</summary>
    public string Name => $"subgroup{Lanes}";

    public int TilesX(int width) => (width + TileWidth - 1) / TileWidth;

    public int TilesY(int height) => (height + TileHeight - 1) / TileHeight;
}

/// <summary>What one subgroup size predicts for one strategy's loop-iteration image.</summary>
/// <param name="Tiles">Tiles covering the image, partial edge tiles included.</param>
/// <param name="MeanTileMax">Mean over tiles of the largest lane cost in the tile: a subgroup runs until its slowest lane ends.</param>
/// <param name="SimdEfficiency">Lane work done over lane slots spent: Σ lane cost / (lanes × Σ tile max), in [0, 1].</param>
/// <param name="MaxTileMax">The costliest tile.</param>
public readonly record struct SubgroupSummary(SubgroupShape Shape, int Tiles, double MeanTileMax, double SimdEfficiency, uint MaxTileMax);

/// <summary>
/// Lockstep model of a per-pixel cost image. SIMD efficiency is the measure of Aila &amp; Laine (2009), "Understanding
/// the efficiency of ray traversal on GPUs": the share of lane slots that do useful work, here counted in loop
/// iterations. A partial tile at the right or bottom edge counts as a whole subgroup whose lanes outside the image
/// are idle (cost 0 but still occupying their slot), as a dispatch rounds up to whole groups. A tile whose lanes all
/// cost 0 counts in the mean tile max as 0 and adds nothing to either side of the efficiency; an image with no work
/// at all has efficiency 1 (no slot was wasted).
/// </summary>
public static class SubgroupModel
{
    /// <summary>Writes each tile's maximum into <paramref name="tileMax"/> (TilesX × TilesY, row-major).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void TileMax(ReadOnlySpan<uint> costs, int width, int height, SubgroupShape shape, Span<uint> tileMax)
    {
        int tilesX = shape.TilesX(width);
        int tilesY = shape.TilesY(height);
        if (costs.Length != width * height)
            throw new ArgumentException("cost image size does not match width × height", nameof(costs));
        if (tileMax.Length != tilesX * tilesY)
            throw new ArgumentException("tileMax must hold TilesX × TilesY values", nameof(tileMax));
        // A band of TileHeight rows is first reduced to one row of column maxima, a vector at a time, and that row
        // then to the band's tiles: no division per pixel (a profile of a 72-view run had the per-pixel loop at 5% of
        // its CPU). Maxima do not depend on the order they are taken in, so the result is the per-pixel loop's.
        uint[] rented = ArrayPool<uint>.Shared.Rent(width);
        try
        {
            Span<uint> band = rented.AsSpan(0, width);
            for (int ty = 0; ty < tilesY; ty++)
            {
                int y0 = ty * shape.TileHeight, y1 = Math.Min(y0 + shape.TileHeight, height);
                costs.Slice(y0 * width, width).CopyTo(band);
                for (int y = y0 + 1; y < y1; y++)
                    MaxInto(band, costs.Slice(y * width, width));
                Span<uint> tileRow = tileMax.Slice(ty * tilesX, tilesX);
                for (int tx = 0; tx < tilesX; tx++)
                {
                    uint m = 0;
                    foreach (uint v in band.Slice(tx * shape.TileWidth, Math.Min(shape.TileWidth, width - tx * shape.TileWidth)))
                        m = Math.Max(m, v);
                    tileRow[tx] = m;
                }
            }
        }
        finally
        {
            ArrayPool<uint>.Shared.Return(rented);
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void MaxInto(Span<uint> maxima, ReadOnlySpan<uint> row)
    {
        int i = 0;
        if (Vector.IsHardwareAccelerated)
        {
            for (; i <= maxima.Length - Vector<uint>.Count; i += Vector<uint>.Count)
                Vector.Max(new Vector<uint>(maxima[i..]), new Vector<uint>(row[i..])).CopyTo(maxima[i..]);
        }
        for (; i < maxima.Length; i++)
            maxima[i] = Math.Max(maxima[i], row[i]);
    }

    /// <summary>Per-pixel image in which every pixel holds its tile's maximum, for a heatmap at image size.</summary>
    public static void ExpandTiles(ReadOnlySpan<uint> tileMax, int width, int height, SubgroupShape shape, Span<uint> pixels)
    {
        int tilesX = shape.TilesX(width);
        if (pixels.Length != width * height)
            throw new ArgumentException("pixel image size does not match width × height", nameof(pixels));
        for (int y = 0; y < height; y++)
        {
            Span<uint> row = pixels.Slice(y * width, width);
            // The rows of a band are alike: each after the first is a copy of the one above it.
            if (y % shape.TileHeight != 0)
            {
                pixels.Slice((y - 1) * width, width).CopyTo(row);
                continue;
            }
            ReadOnlySpan<uint> tileRow = tileMax.Slice(y / shape.TileHeight * tilesX, tilesX);
            for (int tx = 0; tx < tilesX; tx++)
                row.Slice(tx * shape.TileWidth, Math.Min(shape.TileWidth, width - tx * shape.TileWidth)).Fill(tileRow[tx]);
        }
    }

    public static SubgroupSummary Summarise(ReadOnlySpan<uint> costs, int width, int height, SubgroupShape shape)
    {
        int tiles = shape.TilesX(width) * shape.TilesY(height);
        if (tiles == 0)
            return new SubgroupSummary(shape, 0, 0, 1, 0);
        uint[] rented = ArrayPool<uint>.Shared.Rent(tiles);
        try
        {
            Span<uint> tileMax = rented.AsSpan(0, tiles);
            TileMax(costs, width, height, shape, tileMax);
            long work = 0;
            foreach (uint c in costs)
                work += c;
            long maxSum = 0;
            uint maxMax = 0;
            foreach (uint m in tileMax)
            {
                maxSum += m;
                maxMax = Math.Max(maxMax, m);
            }
            double efficiency = maxSum == 0 ? 1.0 : work / ((double)shape.Lanes * maxSum);
            return new SubgroupSummary(shape, tiles, (double)maxSum / tiles, efficiency, maxMax);
        }
        finally
        {
            ArrayPool<uint>.Shared.Return(rented);
        }
    }
}
