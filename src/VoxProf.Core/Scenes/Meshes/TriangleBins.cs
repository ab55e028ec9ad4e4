using System.Runtime.CompilerServices;
using VoxProf.Core.Geometry;

namespace VoxProf.Core.Scenes.Meshes;

/// <summary>
/// Triangles sorted into cubic bins (closed boxes of side 2^<see cref="Shift"/> voxels on a grid aligned with the
/// tree's cells), built once when the mesh is loaded. Only non-empty bins are stored, sorted by Morton code, so the
/// bins inside any aligned cube of bins are one contiguous run and "does anything lie in this cell?" is a binary
/// search. A second index sorts the same bins by (z, y, x) for walking one row of bins along +x.
/// </summary>
/// <remarks>
/// A triangle goes into every bin whose closed box it touches (by the padded separating-axis test), so the bin
/// holding a voxel holds every triangle that can touch the voxel's closed cube. Bins cover the layer's bounds; along
/// +x one extra bin past the last holds every triangle reaching beyond, because the inside test casts rays towards +x
/// and must see crossings outside the scene.
/// </remarks>
internal sealed class TriangleBins
{
    /// <summary>Growth of a box in voxels for conservative tests, far above the rounding of the projections.</summary>
    public const double Pad = 1e-3;

    private const int TriangleBits = 25; // TriangleMesh.MaxTriangles = 2^25
    private const int CoordBits = 13;    // bins per axis ≤ 65536 / 16 + 1 overflow bin

    private readonly float[] _v;
    private readonly int[] _tri;
    private readonly ulong[] _keys;
    private readonly int[] _start;
    private readonly int[] _items;
    private readonly long[] _rowKeys;
    private readonly int[] _rowBins;
    private readonly int _bx0, _by0, _bz0, _bx1, _by1, _bz1;

    public TriangleBins(float[] positions, int[] triangles, Box3i bounds)
    {
        _v = positions;
        _tri = triangles;
        Shift = ChooseShift(positions, triangles, bounds);
        (_bx0, _by0, _bz0) = (bounds.MinX >> Shift, bounds.MinY >> Shift, bounds.MinZ >> Shift);
        (_bx1, _by1, _bz1) = ((bounds.MaxX - 1) >> Shift, (bounds.MaxY - 1) >> Shift, (bounds.MaxZ - 1) >> Shift);

        ulong[] pairs = bounds.IsEmpty ? [] : CollectPairs();
        Array.Sort(pairs);
        int bins = 0;
        for (int i = 0; i < pairs.Length; i++)
        {
            if (i == 0 || pairs[i] >> TriangleBits != pairs[i - 1] >> TriangleBits)
                bins++;
        }
        _keys = new ulong[bins];
        _start = new int[bins + 1];
        _items = new int[pairs.Length];
        int b = -1;
        for (int i = 0; i < pairs.Length; i++)
        {
            ulong key = pairs[i] >> TriangleBits;
            if (b < 0 || key != _keys[b])
            {
                _keys[++b] = key;
                _start[b] = i;
            }
            _items[i] = (int)(pairs[i] & ((1UL << TriangleBits) - 1));
        }
        _start[bins] = pairs.Length;

        _rowKeys = new long[bins];
        _rowBins = new int[bins];
        for (int i = 0; i < bins; i++)
        {
            var (x, y, z) = Decode(_keys[i]);
            _rowKeys[i] = RowKey(x, y, z);
            _rowBins[i] = i;
        }
        Array.Sort(_rowKeys, _rowBins);
    }

    /// <summary>Log2 of the bin side in voxels (at least 4).</summary>
    public int Shift { get; }

    public int BinCount => _keys.Length;

    /// <summary>Triangle–bin pairs stored (a triangle counts once per bin it touches).</summary>
    public int PairCount => _items.Length;

    /// <summary>Approximate bytes held by the bins.</summary>
    public long Bytes => _keys.Length * 8L + _start.Length * 4L + _items.Length * 4L + _rowKeys.Length * 12L;

    /// <summary>Triangles of the bin at (bx, by, bz), or nothing when it is empty.</summary>
    public ReadOnlySpan<int> Bin(int bx, int by, int bz)
    {
        int i = Array.BinarySearch(_keys, Morton(bx, by, bz));
        return i < 0 ? [] : _items.AsSpan(_start[i], _start[i + 1] - _start[i]);
    }

    /// <summary>Appends the triangles of every bin in the inclusive bin range (duplicates possible).</summary>
    public void Gather(int bx0, int by0, int bz0, int bx1, int by1, int bz1, ref int[] buffer, ref int count)
    {
        for (int bz = bz0; bz <= bz1; bz++)
            for (int by = by0; by <= by1; by++)
                for (int bx = bx0; bx <= bx1; bx++)
                    Append(Bin(bx, by, bz), ref buffer, ref count);
    }

    /// <summary>Appends the triangles of the bins at (bx ≥ <paramref name="fromBx"/>, by, bz), overflow bin included.</summary>
    public void GatherRow(int fromBx, int by, int bz, ref int[] buffer, ref int count)
    {
        int i = LowerBound(_rowKeys, 0, _rowKeys.Length, RowKey(fromBx, by, bz));
        long end = RowKey(0, by, bz) + (1L << CoordBits);
        for (; i < _rowKeys.Length && _rowKeys[i] < end; i++)
        {
            int b = _rowBins[i];
            Append(_items.AsSpan(_start[b], _start[b + 1] - _start[b]), ref buffer, ref count);
        }
    }

    /// <summary>
    /// Whether any triangle may touch the closed box of the voxel region (conservative: the padded test). Bins wholly
    /// inside the region answer without a triangle test; only bins cut by the region's faces test their triangles.
    /// </summary>
    public bool AnyTouching(in Box3i r)
    {
        if (_keys.Length == 0 || r.IsEmpty)
            return false;
        int s = Shift;
        var q = new Query
        {
            Region = r,
            Bx0 = Math.Max(r.MinX >> s, _bx0),
            By0 = Math.Max(r.MinY >> s, _by0),
            Bz0 = Math.Max(r.MinZ >> s, _bz0),
            Bx1 = Math.Min((r.MaxX - 1) >> s, _bx1),
            By1 = Math.Min((r.MaxY - 1) >> s, _by1),
            Bz1 = Math.Min((r.MaxZ - 1) >> s, _bz1),
            Fx0 = (r.MinX + (1 << s) - 1) >> s,
            Fy0 = (r.MinY + (1 << s) - 1) >> s,
            Fz0 = (r.MinZ + (1 << s) - 1) >> s,
            Fx1 = (r.MaxX >> s) - 1,
            Fy1 = (r.MaxY >> s) - 1,
            Fz1 = (r.MaxZ >> s) - 1,
        };
        if (q.Bx0 > q.Bx1 || q.By0 > q.By1 || q.Bz0 > q.Bz1)
            return false;
        int level = 0;
        while ((q.Bx0 >> level) != (q.Bx1 >> level) || (q.By0 >> level) != (q.By1 >> level) || (q.Bz0 >> level) != (q.Bz1 >> level))
            level++;
        return Descend(level, q.Bx0 >> level, q.By0 >> level, q.Bz0 >> level, 0, _keys.Length, q);
    }

    /// <summary>The axes of triangle <paramref name="t"/>, from its float corners.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public TriangleAxes Axes(int t)
    {
        int a = 3 * _tri[3 * t], b = 3 * _tri[3 * t + 1], c = 3 * _tri[3 * t + 2];
        return TriangleAxes.Create(_v[a], _v[a + 1], _v[a + 2], _v[b], _v[b + 1], _v[b + 2], _v[c], _v[c + 1], _v[c + 2]);
    }

    private struct Query
    {
        public Box3i Region;
        public int Bx0, By0, Bz0, Bx1, By1, Bz1; // bins meeting the region
        public int Fx0, Fy0, Fz0, Fx1, Fy1, Fz1; // bins wholly inside it
    }

    private bool Descend(int level, int cx, int cy, int cz, int lo, int hi, in Query q)
    {
        ulong first = Morton(cx, cy, cz) << (3 * level);
        ulong end = first + (1UL << (3 * level));
        int i = LowerBound(_keys, lo, hi, first);
        int j = LowerBound(_keys, i, hi, end);
        if (i == j)
            return false;
        int x0 = cx << level, y0 = cy << level, z0 = cz << level, side = 1 << level;
        if (x0 >= q.Fx0 && x0 + side - 1 <= q.Fx1 && y0 >= q.Fy0 && y0 + side - 1 <= q.Fy1 && z0 >= q.Fz0 && z0 + side - 1 <= q.Fz1)
            return true;
        if (level == 0)
        {
            Box3i r = q.Region;
            foreach (int t in _items.AsSpan(_start[i], _start[i + 1] - _start[i]))
            {
                if (Axes(t).TouchesBox(r.MinX, r.MinY, r.MinZ, r.MaxX, r.MaxY, r.MaxZ, Pad))
                    return true;
            }
            return false;
        }
        for (int child = 0; child < 8; child++)
        {
            int nx = 2 * cx + (child & 1), ny = 2 * cy + ((child >> 1) & 1), nz = 2 * cz + (child >> 2);
            int h = level - 1;
            if ((nx + 1 << h) - 1 < q.Bx0 || nx << h > q.Bx1 || (ny + 1 << h) - 1 < q.By0 || ny << h > q.By1
                || (nz + 1 << h) - 1 < q.Bz0 || nz << h > q.Bz1)
                continue;
            if (Descend(h, nx, ny, nz, i, j, q))
                return true;
        }
        return false;
    }

    private ulong[] CollectPairs()
    {
        int triangles = _tri.Length / 3;
        const int Chunk = 1 << 14;
        int chunks = (triangles + Chunk - 1) / Chunk;
        // Two passes, counting then writing, so the pairs are allocated once at their final size: the bins of a
        // million triangles would otherwise pass through twice their size in growing lists.
        var counts = new long[chunks + 1];
        Parallel.For(0, chunks, c =>
        {
            long n = 0;
            for (int t = c * Chunk, end = Math.Min(triangles, (c + 1) * Chunk); t < end; t++)
                n += AddTriangle(t, default);
            counts[c + 1] = n;
        });
        for (int c = 0; c < chunks; c++)
            counts[c + 1] += counts[c];
        var all = new ulong[counts[chunks]];
        // Written at fixed offsets per chunk, then sorted: the same array for any thread count.
        Parallel.For(0, chunks, c =>
        {
            Span<ulong> part = all.AsSpan((int)counts[c], (int)(counts[c + 1] - counts[c]));
            for (int t = c * Chunk, end = Math.Min(triangles, (c + 1) * Chunk); t < end; t++)
                part = part[AddTriangle(t, part)..];
        });
        return all;
    }

    /// <summary>Writes the triangle's pairs into <paramref name="pairs"/> (when not empty) and returns how many there are.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private int AddTriangle(int t, Span<ulong> pairs)
    {
        int n = 0;
        var (lo, hi) = BinRange(t);
        int bx0 = Math.Max(lo.X, _bx0), by0 = Math.Max(lo.Y, _by0), bz0 = Math.Max(lo.Z, _bz0);
        int bx1 = Math.Min(hi.X, _bx1 + 1), by1 = Math.Min(hi.Y, _by1), bz1 = Math.Min(hi.Z, _bz1);
        if (bx0 > bx1 || by0 > by1 || bz0 > bz1)
            return 0;
        bool single = lo == hi;
        TriangleAxes axes = single ? default : Axes(t);
        int side = 1 << Shift;
        for (int bz = bz0; bz <= bz1; bz++)
        {
            for (int by = by0; by <= by1; by++)
            {
                for (int bx = bx0; bx <= bx1; bx++)
                {
                    bool overflow = bx == _bx1 + 1;
                    if (single || overflow || axes.TouchesBox((double)bx * side, (double)by * side, (double)bz * side,
                        (double)(bx + 1) * side, (double)(by + 1) * side, (double)(bz + 1) * side, Pad))
                    {
                        if (!pairs.IsEmpty)
                            pairs[n] = Morton(bx, by, bz) << TriangleBits | (uint)t;
                        n++;
                    }
                }
            }
        }
        return n;
    }

    // Bins whose closed box meets the triangle's bounding box: b·S ≤ max and (b + 1)·S ≥ min.
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private ((int X, int Y, int Z) Lo, (int X, int Y, int Z) Hi) BinRange(int t)
    {
        double side = 1 << Shift;
        Span<double> min = [double.MaxValue, double.MaxValue, double.MaxValue];
        Span<double> max = [double.MinValue, double.MinValue, double.MinValue];
        for (int k = 0; k < 3; k++)
        {
            int p = 3 * _tri[3 * t + k];
            for (int a = 0; a < 3; a++)
            {
                min[a] = Math.Min(min[a], _v[p + a]);
                max[a] = Math.Max(max[a], _v[p + a]);
            }
        }
        static int Lo(double m, double s) => (int)Math.Clamp(Math.Ceiling(m / s) - 1, -1, 1 << CoordBits);
        static int Hi(double m, double s) => (int)Math.Clamp(Math.Floor(m / s), -1, 1 << CoordBits);
        return ((Lo(min[0], side), Lo(min[1], side), Lo(min[2], side)), (Hi(max[0], side), Hi(max[1], side), Hi(max[2], side)));
    }

    /// <summary>
    /// Bins of 16 voxels unless that would store too many triangle–bin pairs (huge triangles): then the side doubles
    /// until the bounding-box estimate fits in 8 pairs per triangle plus 4 million.
    /// </summary>
    private static int ChooseShift(float[] v, int[] tri, Box3i bounds)
    {
        long budget = 8L * (tri.Length / 3) + (1L << 22);
        int shift = 4;
        while (shift < 16)
        {
            double side = 1 << shift;
            long estimate = 0;
            for (int t = 0; t < tri.Length && estimate <= budget; t += 3)
            {
                long bins = 1;
                for (int a = 0; a < 3; a++)
                {
                    double lo = Math.Max(Lower(bounds, a), Math.Min(v[3 * tri[t] + a], Math.Min(v[3 * tri[t + 1] + a], v[3 * tri[t + 2] + a])));
                    double hi = Math.Min(Upper(bounds, a), Math.Max(v[3 * tri[t] + a], Math.Max(v[3 * tri[t + 1] + a], v[3 * tri[t + 2] + a])));
                    bins *= Math.Max(1, (long)(Math.Floor(hi / side) - Math.Floor(lo / side)) + 2);
                }
                estimate += bins;
            }
            if (estimate <= budget)
                break;
            shift++;
        }
        return shift;
    }

    private static int Lower(in Box3i b, int axis) => axis == 0 ? b.MinX : axis == 1 ? b.MinY : b.MinZ;

    private static int Upper(in Box3i b, int axis) => axis == 0 ? b.MaxX : axis == 1 ? b.MaxY : b.MaxZ;

    private static void Append(ReadOnlySpan<int> items, ref int[] buffer, ref int count)
    {
        if (count + items.Length > buffer.Length)
            Array.Resize(ref buffer, Math.Max(buffer.Length * 2, count + items.Length));
        items.CopyTo(buffer.AsSpan(count));
        count += items.Length;
    }

    private static long RowKey(int bx, int by, int bz) => ((long)bz << (2 * CoordBits)) | ((long)by << CoordBits) | (long)bx;

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static int LowerBound<T>(T[] keys, int lo, int hi, T value) where T : IComparable<T>
    {
        while (lo < hi)
        {
            int mid = (lo + hi) >>> 1;
            if (keys[mid].CompareTo(value) < 0)
                lo = mid + 1;
            else
                hi = mid;
        }
        return lo;
    }

    internal static ulong Morton(int x, int y, int z) => Spread((uint)x) | Spread((uint)y) << 1 | Spread((uint)z) << 2;

    private static (int X, int Y, int Z) Decode(ulong m) => ((int)Compact(m), (int)Compact(m >> 1), (int)Compact(m >> 2));

    // Bits of a 13-bit value spread three apart (bit i to bit 3i).
    private static ulong Spread(uint v)
    {
        ulong x = v & 0x1FFFFF;
        x = (x | x << 32) & 0x1F00000000FFFFUL;
        x = (x | x << 16) & 0x1F0000FF0000FFUL;
        x = (x | x << 8) & 0x100F00F00F00F00FUL;
        x = (x | x << 4) & 0x10C30C30C30C30C3UL;
        x = (x | x << 2) & 0x1249249249249249UL;
        return x;
    }

    private static uint Compact(ulong x)
    {
        x &= 0x1249249249249249UL;
        x = (x ^ (x >> 2)) & 0x10C30C30C30C30C3UL;
        x = (x ^ (x >> 4)) & 0x100F00F00F00F00FUL;
        x = (x ^ (x >> 8)) & 0x1F0000FF0000FFUL;
        x = (x ^ (x >> 16)) & 0x1F00000000FFFFUL;
        x = (x ^ (x >> 32)) & 0x1FFFFFUL;
        return (uint)x;
    }
}
