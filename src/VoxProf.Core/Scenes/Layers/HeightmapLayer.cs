using System.Runtime.CompilerServices;
using VoxProf.Core.Geometry;

namespace VoxProf.Core.Scenes.Layers;

/// <summary>
/// Column heights from a greyscale image: pixel (px, row) covers the columns
/// <c>origin.x + px·cell ≤ x &lt; origin.x + (px + 1)·cell</c>, <c>origin.z + row·cell ≤ z &lt; …</c>, and those columns are
/// solid for <c>origin.y ≤ y &lt; origin.y + floor(h0 + (h1 − h0) · value / maxValue)</c>. Classification and
/// filling are the terrain's: a min/max pyramid over the column tops.
/// </summary>
public sealed class HeightmapLayer : Layer
{
    private readonly HeightPyramid? _pyramid;

    /// <param name="values">Pixel values, row by row (row 0 at the smallest z).</param>
    /// <param name="maxValue">255 for an 8-bit image, 65535 for a 16-bit one.</param>
    public HeightmapLayer(LayerOp op, byte material, ushort[] values, int width, int depth, int maxValue,
        int originX, int originY, int originZ, int cellSize, double lowHeight, double highHeight, Box3i extent)
        : base(op, material, ComputeBounds(values, maxValue, width, depth, originX, originY, originZ, cellSize, lowHeight, highHeight, extent))
    {
        (Width, Depth, CellSize) = (width, depth, cellSize);
        if (Bounds.IsEmpty)
            return;
        Box3i b = Bounds;
        var tops = new ushort[(long)b.SizeX * b.SizeZ];
        for (int z = b.MinZ; z < b.MaxZ; z++)
        {
            int row = (z - originZ) / cellSize;
            for (int x = b.MinX; x < b.MaxX; x++)
            {
                int top = Top(values[row * width + (x - originX) / cellSize], maxValue, originY, lowHeight, highHeight, extent);
                tops[(long)(z - b.MinZ) * b.SizeX + (x - b.MinX)] = (ushort)Math.Max(top, b.MinY);
            }
        }
        _pyramid = new HeightPyramid(b.MinX, b.MinZ, b.SizeX, b.SizeZ, tops);
    }

    public override string Kind => "heightmap";

    /// <summary>The columns' tops, and as much again for the walls between them (the heights are already in memory).</summary>
    public override LayerCost Cost(in Box3i extent) =>
        LayerCost.OfSurface(2.0 * Bounds.SizeX * Bounds.SizeZ, "a heightfield surface");

    public override string Details => FormattableString.Invariant($"{Width} x {Depth} pixels, cell {CellSize}");

    public int Width { get; }
    public int Depth { get; }
    public int CellSize { get; }

    /// <summary>Top of column (x, z): its voxels are solid below this y (from <see cref="Layer.Bounds"/>.MinY up).</summary>
    public int TopAt(int x, int z) =>
        _pyramid is null || x < Bounds.MinX || x >= Bounds.MaxX || z < Bounds.MinZ || z >= Bounds.MaxZ ? 0 : _pyramid.Height(x, z);

    public override Coverage Classify(in Box3i region) => _pyramid?.Classify(region, Bounds) ?? Coverage.None;

    public override bool Contains(int x, int y, int z) => Bounds.Contains(x, y, z) && y < _pyramid!.Height(x, z);

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public override void Fill(in Box3i region, Span<bool> inside)
    {
        if (_pyramid is null)
            inside[..checked((int)region.Volume)].Clear();
        else
            _pyramid.Fill(region, Bounds, inside);
    }

    /// <summary>The absolute top of a column from its pixel value, clamped to [0, min(extent y, 65535)].</summary>
    private static int Top(int value, int maxValue, int originY, double low, double high, Box3i extent)
    {
        double h = Math.Floor(low + (high - low) * ((double)value / maxValue));
        double top = originY + h;
        double cap = Math.Min(extent.MaxY, TerrainLayer.MaxHeight);
        return (int)Math.Clamp(top, 0, cap);
    }

    private static Box3i ComputeBounds(ushort[] values, int maxValue, int width, int depth, int ox, int oy, int oz, int cell,
        double low, double high, Box3i extent)
    {
        int highest = 0;
        foreach (ushort v in values)
            highest = Math.Max(highest, Top(v, maxValue, oy, low, high, extent));
        long x1 = ox + (long)width * cell, z1 = oz + (long)depth * cell;
        var box = new Box3i(ox, Math.Max(oy, 0), oz, (int)Math.Min(x1, int.MaxValue), highest, (int)Math.Min(z1, int.MaxValue));
        return box.Intersect(extent);
    }
}
