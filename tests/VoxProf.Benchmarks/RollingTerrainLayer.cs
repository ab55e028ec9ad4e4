using System.Numerics;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;

namespace VoxProf.Benchmarks;

/// <summary>
/// A stand-in heightfield for timing the tree builder: column heights from a few seeded sine waves, stored once,
/// with min/max over every aligned power-of-two tile so that classifying an aligned region is exact and cheap.
/// A voxel is inside when y is below its column's height.
/// </summary>
public sealed class RollingTerrainLayer : Layer
{
    private readonly int _width;
    private readonly ushort[] _heights;
    private readonly ushort[][] _min; // _min[k - 1]: tiles of side 2^k
    private readonly ushort[][] _max;
    private readonly int[] _tilesX;

    public RollingTerrainLayer(byte material, Box3i extent, double baseHeight, double amplitude, double wavelength, int seed)
        : base(LayerOp.Add, material, extent)
    {
        _width = extent.SizeX;
        int depth = extent.SizeZ;
        _heights = new ushort[(long)_width * depth];
        var rng = new Random(seed);
        double[] phases = [.. Enumerable.Range(0, 6).Select(_ => rng.NextDouble() * 2 * Math.PI)];
        double f = 2 * Math.PI / wavelength;
        int cap = extent.SizeY;
        Parallel.For(0, depth, z =>
        {
            for (int x = 0; x < _width; x++)
            {
                double h = baseHeight + amplitude * (
                    Math.Sin(x * f + phases[0]) * Math.Cos(z * f * 0.8 + phases[1])
                    + 0.5 * Math.Sin((x + z) * f * 2.3 + phases[2])
                    + 0.25 * Math.Sin((x - 2 * z) * f * 5.1 + phases[3]) * Math.Cos(x * f * 7.7 + phases[4]));
                _heights[(long)z * _width + x] = (ushort)Math.Clamp(h, 0, cap);
            }
        });

        var mins = new List<ushort[]>();
        var maxs = new List<ushort[]>();
        var tilesX = new List<int>();
        int finerX = _width, finerZ = depth;
        ushort[] finerMin = _heights, finerMax = _heights;
        while (finerX > 1 || finerZ > 1)
        {
            int nx = (finerX + 1) / 2, nz = (finerZ + 1) / 2;
            var min = new ushort[nx * nz];
            var max = new ushort[nx * nz];
            int fx = finerX, fz = finerZ;
            ushort[] fMin = finerMin, fMax = finerMax;
            Parallel.For(0, nz, tz =>
            {
                for (int tx = 0; tx < nx; tx++)
                {
                    int lo = ushort.MaxValue, hi = 0;
                    for (int dz = 0; dz < 2 && 2 * tz + dz < fz; dz++)
                    {
                        for (int dx = 0; dx < 2 && 2 * tx + dx < fx; dx++)
                        {
                            long i = (long)(2 * tz + dz) * fx + 2 * tx + dx;
                            lo = Math.Min(lo, fMin[i]);
                            hi = Math.Max(hi, fMax[i]);
                        }
                    }
                    min[tz * nx + tx] = (ushort)lo;
                    max[tz * nx + tx] = (ushort)hi;
                }
            });
            mins.Add(min);
            maxs.Add(max);
            tilesX.Add(nx);
            (finerX, finerZ, finerMin, finerMax) = (nx, nz, min, max);
        }
        _min = [.. mins];
        _max = [.. maxs];
        _tilesX = [.. tilesX];
    }

    public override string Kind => "rolling-terrain";

    public override Coverage Classify(in Box3i region)
    {
        (int min, int max) = Range(region.MinX, region.MaxX, region.MinZ, region.MaxZ);
        if (max <= region.MinY)
            return Coverage.None;
        return region.MaxY <= min ? Coverage.Full : Coverage.Partial;
    }

    public override bool Contains(int x, int y, int z) => y < _heights[(long)z * _width + x];

    public override void Fill(in Box3i region, Span<bool> inside)
    {
        inside[..(int)region.Volume].Clear();
        int sx = region.SizeX, sxy = sx * region.SizeY;
        for (int z = region.MinZ; z < region.MaxZ; z++)
        {
            for (int x = region.MinX; x < region.MaxX; x++)
            {
                int top = Math.Min(_heights[(long)z * _width + x], region.MaxY);
                int i = (z - region.MinZ) * sxy + (x - region.MinX);
                for (int y = region.MinY; y < top; y++)
                    inside[i + (y - region.MinY) * sx] = true;
            }
        }
    }

    private (int Min, int Max) Range(int x0, int x1, int z0, int z1)
    {
        int size = Math.Max(x1 - x0, z1 - z0);
        if (size == 1)
        {
            int h = _heights[(long)z0 * _width + x0];
            return (h, h);
        }
        // Tiles of side 2^k ≥ size: an aligned region falls on one, any region on at most 2 × 2.
        int k = Math.Min(32 - BitOperations.LeadingZeroCount((uint)(size - 1)), _min.Length);
        ushort[] min = _min[k - 1], max = _max[k - 1];
        int nx = _tilesX[k - 1];
        int lo = ushort.MaxValue, hi = 0;
        for (int tz = z0 >> k; tz <= (z1 - 1) >> k; tz++)
        {
            for (int tx = x0 >> k; tx <= (x1 - 1) >> k; tx++)
            {
                lo = Math.Min(lo, min[tz * nx + tx]);
                hi = Math.Max(hi, max[tz * nx + tx]);
            }
        }
        return (lo, hi);
    }
}
