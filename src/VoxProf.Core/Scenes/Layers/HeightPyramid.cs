using System.Runtime.CompilerServices;
using VoxProf.Core.Geometry;

namespace VoxProf.Core.Scenes.Layers;

/// <summary>
/// Column heights of a footprint plus min/max of every power-of-two tile, tiles aligned to global multiples of their
/// size so the tree builder's aligned regions each fall on one tile and get an exact answer.
/// </summary>
internal sealed class HeightPyramid
{
    private readonly int _x0, _z0, _width, _depth;
    private readonly ushort[] _heights;
    private readonly Level[] _levels; // _levels[k - 1] holds tiles of side 2^k.

    private sealed class Level(int tx0, int tz0, int nx, int nz)
    {
        public readonly int Tx0 = tx0, Tz0 = tz0, Nx = nx;
        public readonly ushort[] Min = new ushort[nx * nz], Max = new ushort[nx * nz];
    }

    public HeightPyramid(int x0, int z0, int width, int depth, ushort[] heights)
    {
        _x0 = x0;
        _z0 = z0;
        _width = width;
        _depth = depth;
        _heights = heights;
        var levels = new List<Level>();
        for (int k = 1; ; k++)
        {
            int tx0 = x0 >> k, tz0 = z0 >> k;
            int nx = ((x0 + width - 1) >> k) - tx0 + 1, nz = ((z0 + depth - 1) >> k) - tz0 + 1;
            var level = new Level(tx0, tz0, nx, nz);
            Build(level, k, k == 1 ? null : levels[^1]);
            levels.Add(level);
            if (nx == 1 && nz == 1)
                break;
        }
        _levels = levels.ToArray();
    }

    public int Height(int x, int z) => _heights[(z - _z0) * _width + (x - _x0)];

    /// <summary>
    /// Classifies a region against columns solid for <c>bounds.MinY ≤ y &lt; height(x, z)</c>, columns inside
    /// <paramref name="bounds"/> only: exact for the tree builder's aligned regions, conservative for others.
    /// </summary>
    public Coverage Classify(in Box3i region, in Box3i bounds)
    {
        Box3i r = region.Intersect(bounds);
        if (r.IsEmpty)
            return Coverage.None;
        var (min, max) = Range(r.MinX, r.MaxX, r.MinZ, r.MaxZ);
        if (max <= r.MinY)
            return Coverage.None;
        return region.MaxY <= min && bounds.ContainsBox(region) ? Coverage.Full : Coverage.Partial;
    }

    /// <summary>Fills the inside test of the same columns, reading each column's height once.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Fill(in Box3i region, in Box3i bounds, Span<bool> inside)
    {
        inside[..checked((int)region.Volume)].Clear();
        Box3i r = region.Intersect(bounds);
        if (r.IsEmpty)
            return;
        int sx = region.SizeX, sxy = sx * region.SizeY;
        for (int z = r.MinZ; z < r.MaxZ; z++)
        {
            for (int x = r.MinX; x < r.MaxX; x++)
            {
                // One height per column, then a run of solid voxels from the bottom of the block up.
                int top = Math.Min(Height(x, z), r.MaxY);
                int i = (z - region.MinZ) * sxy + (r.MinY - region.MinY) * sx + (x - region.MinX);
                for (int y = r.MinY; y < top; y++, i += sx)
                    inside[i] = true;
            }
        }
    }

    /// <summary>Bounds on the heights of columns [x0, x1) × [z0, z1), which must lie inside the footprint.</summary>
    public (int Min, int Max) Range(int x0, int x1, int z0, int z1)
    {
        int size = Math.Max(x1 - x0, z1 - z0);
        if (size == 1)
        {
            int h = Height(x0, z0);
            return (h, h);
        }
        // Tiles of side ≥ size: the region touches at most 2 × 2 of them.
        int k = Math.Min(32 - System.Numerics.BitOperations.LeadingZeroCount((uint)(size - 1)), _levels.Length);
        Level level = _levels[k - 1];
        int min = ushort.MaxValue, max = 0;
        for (int tz = (z0 >> k) - level.Tz0; tz <= ((z1 - 1) >> k) - level.Tz0; tz++)
        {
            for (int tx = (x0 >> k) - level.Tx0; tx <= ((x1 - 1) >> k) - level.Tx0; tx++)
            {
                int i = tz * level.Nx + tx;
                min = Math.Min(min, level.Min[i]);
                max = Math.Max(max, level.Max[i]);
            }
        }
        return (min, max);
    }

    private void Build(Level level, int k, Level? finer)
    {
        int nz = level.Min.Length / level.Nx;
        Parallel.For(0, nz, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (tz) =>
        {
            for (int tx = 0; tx < level.Nx; tx++)
            {
                int min = ushort.MaxValue, max = 0;
                // Each tile is the union of up to four tiles of the finer level (or columns at level 1).
                for (int dz = 0; dz < 2; dz++)
                {
                    for (int dx = 0; dx < 2; dx++)
                    {
                        int cx = ((level.Tx0 + tx) << 1) + dx, cz = ((level.Tz0 + tz) << 1) + dz;
                        if (finer is null)
                        {
                            if (cx < _x0 || cx >= _x0 + _width || cz < _z0 || cz >= _z0 + _depth)
                                continue;
                            int h = Height(cx, cz);
                            min = Math.Min(min, h);
                            max = Math.Max(max, h);
                        }
                        else
                        {
                            int fx = cx - finer.Tx0, fz = cz - finer.Tz0;
                            if (fx < 0 || fx >= finer.Nx || fz < 0 || fz >= finer.Min.Length / finer.Nx)
                                continue;
                            int i = fz * finer.Nx + fx;
                            min = Math.Min(min, finer.Min[i]);
                            max = Math.Max(max, finer.Max[i]);
                        }
                    }
                }
                level.Min[tz * level.Nx + tx] = (ushort)min;
                level.Max[tz * level.Nx + tx] = (ushort)max;
            }
        });
    }
}
