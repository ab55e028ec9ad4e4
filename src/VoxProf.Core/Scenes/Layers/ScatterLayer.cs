using System.Runtime.CompilerServices;
using VoxProf.Core.Geometry;
using VoxProf.Core.Noise;

namespace VoxProf.Core.Scenes.Layers;

/// <summary>
/// Seeded clumps (cubes of 1..<see cref="MaxClumpSize"/> voxels a side) placed uniformly in a region: tiny, far-apart
/// geometry. Clumps are bucketed in a uniform grid with a 3D prefix sum of bucket counts, so a region touching no
/// bucket with clumps is None after eight look-ups, and otherwise only the non-empty buckets are checked.
/// </summary>
public sealed class ScatterLayer : Layer
{
    public const int MaxClumpSize = 64;
    public const int MaxCount = 1_000_000;

    // Classify inspects at most this many non-empty buckets before settling for Partial.
    private const int ExactBucketLimit = 64;
    private const int MaxBuckets = 1 << 21;

    private readonly Box3i[] _clumps;
    private readonly int _shift, _nx, _ny, _nz;
    private readonly int[] _bucketStart; // CSR: clumps of bucket b are _bucketItems[_bucketStart[b].._bucketStart[b+1]).
    private readonly int[] _bucketItems;
    private readonly int[] _prefix;      // (nx+1)(ny+1)(nz+1) inclusive prefix sums of bucket counts.

    /// <param name="region">Where clumps are placed; clipped to <paramref name="extent"/>.</param>
    public ScatterLayer(LayerOp op, byte material, ulong seed, int count, int minSize, int maxSize, Box3i region,
        Box3i extent)
        : base(op, material, region.Intersect(extent))
    {
        ArgumentOutOfRangeException.ThrowIfNegative(count);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(count, MaxCount);
        ArgumentOutOfRangeException.ThrowIfLessThan(minSize, 1);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(maxSize, MaxClumpSize);
        ArgumentOutOfRangeException.ThrowIfLessThan(maxSize, minSize);
        Box3i b = Bounds;
        _clumps = b.IsEmpty ? [] : Place(seed, count, minSize, maxSize, b);

        // Buckets at least as large as a clump, so a clump touches at most two buckets per axis.
        _shift = 3;
        while ((1 << _shift) < maxSize)
            _shift++;
        while (BucketCount(b, _shift) > MaxBuckets)
            _shift++;
        _nx = Buckets(b.SizeX, _shift);
        _ny = Buckets(b.SizeY, _shift);
        _nz = Buckets(b.SizeZ, _shift);
        (_bucketStart, _bucketItems) = BuildBuckets();
        _prefix = BuildPrefix();
    }

    public override string Kind => "scatter";

    /// <summary>
    /// The clumps' surfaces (filled by runs, about four voxel tests per surface voxel) and a few blocks set up per
    /// clump, from the clumps as placed.
    /// </summary>
    public override LayerCost Cost(in Box3i extent)
    {
        double surface = 0;
        foreach (Box3i c in _clumps)
            surface += 2.0 * ((double)c.SizeX * c.SizeY + (double)c.SizeY * c.SizeZ + (double)c.SizeZ * c.SizeX);
        return new LayerCost(surface * 4 + _clumps.Length * 512.0, surface, 0,
            $"{LayerCost.Figure(_clumps.Length)} clumps with a surface of about {LayerCost.Figure(surface)} voxels");
    }

    /// <summary>The placed clumps (already clipped to the layer's bounds).</summary>
    public IReadOnlyList<Box3i> Clumps => _clumps;

    public override Coverage Classify(in Box3i region)
    {
        Box3i r = region.Intersect(Bounds);
        if (r.IsEmpty)
            return Coverage.None;
        var (x0, y0, z0, x1, y1, z1) = BucketRange(r);
        // A region no larger than a bucket may sit inside one clump: look at its (at most eight) buckets.
        if (r == region && x1 - x0 <= 2 && y1 - y0 <= 2 && z1 - z0 <= 2 && InsideOneClump(region, x0, y0, z0, x1, y1, z1))
            return Coverage.Full;
        int budget = ExactBucketLimit;
        return Probe(r, x0, y0, z0, x1, y1, z1, ref budget) == 0 ? Coverage.None : Coverage.Partial;
    }

    /// <summary>
    /// 0 if no clump touches <paramref name="r"/>, 1 if one does, -1 if the search gave up. Halves the bucket
    /// range and skips empty halves with the prefix sums, so only buckets holding clumps are visited.
    /// </summary>
    private int Probe(in Box3i r, int x0, int y0, int z0, int x1, int y1, int z1, ref int budget)
    {
        if (CountIn(x0, y0, z0, x1, y1, z1) == 0)
            return 0;
        int sx = x1 - x0, sy = y1 - y0, sz = z1 - z0;
        if (sx == 1 && sy == 1 && sz == 1)
        {
            if (--budget < 0)
                return -1;
            int b = (z0 * _ny + y0) * _nx + x0;
            for (int k = _bucketStart[b]; k < _bucketStart[b + 1]; k++)
            {
                if (_clumps[_bucketItems[k]].Intersects(r))
                    return 1;
            }
            return 0;
        }
        int first;
        if (sx >= sy && sx >= sz)
        {
            int m = x0 + sx / 2;
            first = Probe(r, x0, y0, z0, m, y1, z1, ref budget);
            return first != 0 ? first : Probe(r, m, y0, z0, x1, y1, z1, ref budget);
        }
        if (sy >= sz)
        {
            int m = y0 + sy / 2;
            first = Probe(r, x0, y0, z0, x1, m, z1, ref budget);
            return first != 0 ? first : Probe(r, x0, m, z0, x1, y1, z1, ref budget);
        }
        int mz = z0 + sz / 2;
        first = Probe(r, x0, y0, z0, x1, y1, mz, ref budget);
        return first != 0 ? first : Probe(r, x0, y0, mz, x1, y1, z1, ref budget);
    }

    private bool InsideOneClump(in Box3i region, int x0, int y0, int z0, int x1, int y1, int z1)
    {
        for (int bz = z0; bz < z1; bz++)
        {
            for (int by = y0; by < y1; by++)
            {
                for (int bx = x0; bx < x1; bx++)
                {
                    int b = (bz * _ny + by) * _nx + bx;
                    for (int k = _bucketStart[b]; k < _bucketStart[b + 1]; k++)
                    {
                        if (_clumps[_bucketItems[k]].ContainsBox(region))
                            return true;
                    }
                }
            }
        }
        return false;
    }

    public override bool Contains(int x, int y, int z)
    {
        if (!Bounds.Contains(x, y, z))
            return false;
        int b = (((z - Bounds.MinZ) >> _shift) * _ny + ((y - Bounds.MinY) >> _shift)) * _nx + ((x - Bounds.MinX) >> _shift);
        for (int k = _bucketStart[b]; k < _bucketStart[b + 1]; k++)
        {
            if (_clumps[_bucketItems[k]].Contains(x, y, z))
                return true;
        }
        return false;
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public override void Fill(in Box3i region, Span<bool> inside)
    {
        inside[..checked((int)region.Volume)].Clear();
        Box3i r = region.Intersect(Bounds);
        if (r.IsEmpty)
            return;
        var (x0, y0, z0, x1, y1, z1) = BucketRange(r);
        int sx = region.SizeX, sxy = sx * region.SizeY;
        for (int bz = z0; bz < z1; bz++)
        {
            for (int by = y0; by < y1; by++)
            {
                for (int bx = x0; bx < x1; bx++)
                {
                    int b = (bz * _ny + by) * _nx + bx;
                    for (int k = _bucketStart[b]; k < _bucketStart[b + 1]; k++)
                    {
                        // A clump in two buckets is written twice; writing true twice is harmless.
                        Box3i c = _clumps[_bucketItems[k]].Intersect(r);
                        for (int z = c.MinZ; z < c.MaxZ; z++)
                            for (int y = c.MinY; y < c.MaxY; y++)
                                inside.Slice((z - region.MinZ) * sxy + (y - region.MinY) * sx + c.MinX - region.MinX, c.SizeX).Fill(true);
                    }
                }
            }
        }
    }

    private static Box3i[] Place(ulong seed, int count, int minSize, int maxSize, Box3i b)
    {
        var rng = new SplitMix64(seed);
        var clumps = new Box3i[count];
        for (int i = 0; i < count; i++)
        {
            int s = minSize + rng.NextInt(maxSize - minSize + 1);
            int x = b.MinX + rng.NextInt(Math.Max(1, b.SizeX - s + 1));
            int y = b.MinY + rng.NextInt(Math.Max(1, b.SizeY - s + 1));
            int z = b.MinZ + rng.NextInt(Math.Max(1, b.SizeZ - s + 1));
            clumps[i] = new Box3i(x, y, z, x + s, y + s, z + s).Intersect(b);
        }
        return clumps;
    }

    private static int Buckets(int size, int shift) => Math.Max(1, (size + (1 << shift) - 1) >> shift);

    private static long BucketCount(Box3i b, int shift) =>
        (long)Buckets(b.SizeX, shift) * Buckets(b.SizeY, shift) * Buckets(b.SizeZ, shift);

    private (int X0, int Y0, int Z0, int X1, int Y1, int Z1) BucketRange(in Box3i r) => (
        (r.MinX - Bounds.MinX) >> _shift, (r.MinY - Bounds.MinY) >> _shift, (r.MinZ - Bounds.MinZ) >> _shift,
        ((r.MaxX - 1 - Bounds.MinX) >> _shift) + 1, ((r.MaxY - 1 - Bounds.MinY) >> _shift) + 1,
        ((r.MaxZ - 1 - Bounds.MinZ) >> _shift) + 1);

    private (int[] Start, int[] Items) BuildBuckets()
    {
        int n = _nx * _ny * _nz;
        var start = new int[n + 1];
        foreach (Box3i c in _clumps)
            ForEachBucket(c, b => start[b + 1]++);
        for (int b = 0; b < n; b++)
            start[b + 1] += start[b];
        var items = new int[start[n]];
        var next = (int[])start.Clone();
        for (int i = 0; i < _clumps.Length; i++)
        {
            int index = i;
            ForEachBucket(_clumps[i], b => items[next[b]++] = index);
        }
        return (start, items);
    }

    private void ForEachBucket(in Box3i c, Action<int> action)
    {
        if (c.IsEmpty)
            return;
        var (x0, y0, z0, x1, y1, z1) = BucketRange(c);
        for (int bz = z0; bz < z1; bz++)
            for (int by = y0; by < y1; by++)
                for (int bx = x0; bx < x1; bx++)
                    action((bz * _ny + by) * _nx + bx);
    }

    private int[] BuildPrefix()
    {
        int px = _nx + 1, pxy = px * (_ny + 1);
        var p = new int[pxy * (_nz + 1)];
        for (int z = 0; z < _nz; z++)
        {
            for (int y = 0; y < _ny; y++)
            {
                for (int x = 0; x < _nx; x++)
                {
                    int b = (z * _ny + y) * _nx + x;
                    int count = _bucketStart[b + 1] - _bucketStart[b];
                    int i = (z + 1) * pxy + (y + 1) * px + (x + 1);
                    // Inclusion–exclusion over the seven lower neighbours.
                    p[i] = count + p[i - 1] + p[i - px] + p[i - pxy] - p[i - 1 - px] - p[i - 1 - pxy] - p[i - px - pxy]
                        + p[i - 1 - px - pxy];
                }
            }
        }
        return p;
    }

    private int CountIn(int x0, int y0, int z0, int x1, int y1, int z1)
    {
        int px = _nx + 1, pxy = px * (_ny + 1);
        int At(int x, int y, int z) => _prefix[z * pxy + y * px + x];
        return At(x1, y1, z1) - At(x0, y1, z1) - At(x1, y0, z1) - At(x1, y1, z0)
            + At(x0, y0, z1) + At(x0, y1, z0) + At(x1, y0, z0) - At(x0, y0, z0);
    }
}
