using System.Runtime.CompilerServices;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes.Meshes;

namespace VoxProf.Core.Scenes.Layers;

/// <summary>How a mesh layer turns triangles into voxels.</summary>
public enum MeshFill
{
    /// <summary>A voxel is inside when its closed unit cube overlaps a triangle (Akenine-Möller's test).</summary>
    Surface,
    /// <summary>The surface plus every voxel whose centre is inside the closed mesh.</summary>
    Solid,
}

/// <summary>How a solid mesh layer decides that a voxel centre is inside.</summary>
public enum InsideRule
{
    /// <summary>No interior: the layer is a surface.</summary>
    None,
    /// <summary>Winding number along a ray towards +x is non-zero (closed, consistently oriented meshes).</summary>
    Winding,
    /// <summary>A ray towards +x crosses the mesh an odd number of times (closed meshes whose faces disagree in orientation).</summary>
    Parity,
}

/// <summary>
/// Triangles in voxel coordinates, voxelised straight into the tree: <see cref="Classify"/> asks the triangle bins
/// whether anything can touch a region, <see cref="Fill"/> voxelises only the triangles binned near the block, and
/// nothing of the size of the whole extent is ever allocated.
/// </summary>
public sealed partial class MeshLayer : Layer
{
    private readonly float[] _v;
    private readonly int[] _tri;
    private readonly TriangleBins _bins;

    /// <param name="positions">x, y, z per vertex, already placed in voxel coordinates.</param>
    /// <param name="triangles">Three vertex indices per triangle; zero-area triangles already removed.</param>
    public MeshLayer(LayerOp op, byte material, float[] positions, int[] triangles, MeshFill fill, InsideRule rule, Box3i extent)
        : base(op, material, ComputeBounds(positions, triangles, extent))
    {
        if (fill == MeshFill.Solid && rule == InsideRule.None)
            throw new ArgumentException("a solid mesh needs an inside rule", nameof(rule));
        _v = positions;
        _tri = triangles;
        FillMode = fill;
        Rule = fill == MeshFill.Solid ? rule : InsideRule.None;
        _bins = new TriangleBins(positions, triangles, Bounds);
    }

    public override string Kind => "mesh";

    /// <summary>
    /// The triangles' total area in voxels, crossed in dense blocks like any surface, plus their bins. Not capped by
    /// the bounds' area as a convex shape's is: a mesh may fold many times inside its box.
    /// </summary>
    public override LayerCost Cost(in Box3i extent)
    {
        if (Bounds.IsEmpty)
            return LayerCost.None;
        double area = 0;
        for (int t = 0; t < _tri.Length; t += 3)
        {
            var a = new System.Numerics.Vector3(_v[3 * _tri[t]], _v[3 * _tri[t] + 1], _v[3 * _tri[t] + 2]);
            var b = new System.Numerics.Vector3(_v[3 * _tri[t + 1]], _v[3 * _tri[t + 1] + 1], _v[3 * _tri[t + 1] + 2]);
            var c = new System.Numerics.Vector3(_v[3 * _tri[t + 2]], _v[3 * _tri[t + 2] + 1], _v[3 * _tri[t + 2] + 2]);
            area += 0.5 * System.Numerics.Vector3.Cross(b - a, c - a).Length();
        }
        // A triangle smaller than a voxel still costs at least one voxel of surface.
        double surface = Math.Max(area, TriangleCount);
        return new LayerCost(surface * LayerCost.DenseSide + TriangleCount * 64.0, surface, 0,
            $"{LayerCost.Figure(TriangleCount)} triangles with a surface of about {LayerCost.Figure(surface)} voxels");
    }

    public override string Details => FormattableString.Invariant(
        $"{TriangleCount} triangles, {ZeroAreaTriangles} zero-area skipped, {(Rule == InsideRule.None ? "surface" : Rule == InsideRule.Winding ? "solid by winding number" : "solid by parity")}");

    public MeshFill FillMode { get; }

    public InsideRule Rule { get; }

    public int TriangleCount => _tri.Length / 3;

    public int VertexCount => _v.Length / 3;

    /// <summary>Bytes held by the triangles, the vertices and the bins.</summary>
    public long Bytes => _v.Length * 4L + _tri.Length * 4L + _bins.Bytes;

    /// <summary>Side of a triangle bin in voxels.</summary>
    public int BinSide => 1 << _bins.Shift;

    /// <summary>Zero-area triangles found in the file and skipped.</summary>
    public int ZeroAreaTriangles { get; init; }

    public override Coverage Classify(in Box3i region)
    {
        Box3i r = region.Intersect(Bounds);
        if (r.IsEmpty)
            return Coverage.None;
        if (_bins.AnyTouching(r))
            return Coverage.Partial;
        if (Rule == InsideRule.None)
            return Coverage.None;
        // No triangle touches the region, so all of it lies on one side of the surface.
        if (!InteriorAt(r.MinX, r.MinY, r.MinZ))
            return Coverage.None;
        return r == region ? Coverage.Full : Coverage.Partial;
    }

    public override bool Contains(int x, int y, int z)
    {
        if (!Bounds.Contains(x, y, z))
            return false;
        int s = _bins.Shift;
        foreach (int t in _bins.Bin(x >> s, y >> s, z >> s))
        {
            TriangleAxes axes = _bins.Axes(t);
            int k = axes.RowAxis;
            int lo = Pick(x, y, z, k), hi = lo;
            if (axes.RowSpan(Pick(x, y, z, (k + 1) % 3), Pick(x, y, z, (k + 2) % 3), ref lo, ref hi))
                return true;
        }
        return Rule != InsideRule.None && InteriorAt(x, y, z);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public override void Fill(in Box3i region, Span<bool> inside)
    {
        inside = inside[..checked((int)region.Volume)];
        inside.Clear();
        Box3i r = region.Intersect(Bounds);
        if (r.IsEmpty)
            return;
        Scratch scratch = Scratch.ForThread();
        int s = _bins.Shift;
        int count = 0;
        _bins.Gather(r.MinX >> s, r.MinY >> s, r.MinZ >> s, (r.MaxX - 1) >> s, (r.MaxY - 1) >> s, (r.MaxZ - 1) >> s,
            ref scratch.Triangles, ref count);
        foreach (int t in Unique(scratch.Triangles, count))
            StampSurface(_bins.Axes(t), region, r, inside);
        if (Rule != InsideRule.None)
            FillInterior(region, r, inside, scratch);
    }

    /// <summary>Marks the voxels of <paramref name="clip"/> that the triangle overlaps, one run per row.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void StampSurface(in TriangleAxes axes, in Box3i region, in Box3i clip, Span<bool> inside)
    {
        int k = axes.RowAxis, kv = (k + 1) % 3, kw = (k + 2) % 3;
        Span<int> stride = [1, region.SizeX, region.SizeX * region.SizeY];
        Span<int> origin = [region.MinX, region.MinY, region.MinZ];
        Span<int> lo = [clip.MinX, clip.MinY, clip.MinZ];
        Span<int> hi = [clip.MaxX - 1, clip.MaxY - 1, clip.MaxZ - 1];
        int v0 = Math.Max(lo[kv], (int)Math.Ceiling(axes.MinV) - 1), v1 = Math.Min(hi[kv], (int)Math.Floor(axes.MaxV));
        int w0 = Math.Max(lo[kw], (int)Math.Ceiling(axes.MinW) - 1), w1 = Math.Min(hi[kw], (int)Math.Floor(axes.MaxW));
        int su = stride[k];
        for (int w = w0; w <= w1; w++)
        {
            for (int v = v0; v <= v1; v++)
            {
                int a = lo[k], b = hi[k];
                if (!axes.RowSpan(v, w, ref a, ref b))
                    continue;
                int i = (a - origin[k]) * su + (v - origin[kv]) * stride[kv] + (w - origin[kw]) * stride[kw];
                for (int u = a; u <= b; u++, i += su)
                    inside[i] = true;
            }
        }
    }

    private static int Pick(int x, int y, int z, int axis) => axis == 0 ? x : axis == 1 ? y : z;

    /// <summary>Sorts the gathered triangle indices and drops repeats (a triangle may sit in several bins).</summary>
    private static ReadOnlySpan<int> Unique(int[] buffer, int count)
    {
        Span<int> items = buffer.AsSpan(0, count);
        items.Sort();
        int n = 0;
        for (int i = 0; i < items.Length; i++)
        {
            if (n == 0 || items[i] != items[n - 1])
                items[n++] = items[i];
        }
        return items[..n];
    }

    private static Box3i ComputeBounds(float[] v, int[] tri, Box3i extent)
    {
        if (tri.Length == 0)
            return Box3i.Empty;
        double minX = double.MaxValue, minY = double.MaxValue, minZ = double.MaxValue;
        double maxX = double.MinValue, maxY = double.MinValue, maxZ = double.MinValue;
        foreach (int i in tri)
        {
            minX = Math.Min(minX, v[3 * i]);
            minY = Math.Min(minY, v[3 * i + 1]);
            minZ = Math.Min(minZ, v[3 * i + 2]);
            maxX = Math.Max(maxX, v[3 * i]);
            maxY = Math.Max(maxY, v[3 * i + 1]);
            maxZ = Math.Max(maxZ, v[3 * i + 2]);
        }
        // Voxel k's closed cube [k, k + 1] meets [min, max] for ceil(min) − 1 ≤ k ≤ floor(max).
        static int Lo(double m) => (int)Math.Clamp(Math.Ceiling(m) - 1, int.MinValue / 2, int.MaxValue / 2);
        static int Hi(double m) => (int)Math.Clamp(Math.Floor(m) + 1, int.MinValue / 2, int.MaxValue / 2);
        return new Box3i(Lo(minX), Lo(minY), Lo(minZ), Hi(maxX), Hi(maxY), Hi(maxZ)).Intersect(extent);
    }
}
