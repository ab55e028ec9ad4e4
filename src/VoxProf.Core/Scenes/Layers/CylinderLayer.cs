using System.Runtime.CompilerServices;
using VoxProf.Core.Geometry;

namespace VoxProf.Core.Scenes.Layers;

/// <summary>The axis a cylinder runs along.</summary>
public enum Axis
{
    X,
    Y,
    Z,
}

/// <summary>
/// An axis-aligned round cylinder: a voxel is inside when its centre lies within <c>radius</c> of the axis line
/// and between the base and base + length along the axis (both ends included).
/// </summary>
public sealed class CylinderLayer : Layer
{
    // (a, b) are the two coordinates across the axis, in x, y, z order; the axial range is in whole voxels.
    private readonly Axis _axis;
    private readonly double _ca, _cb, _r2;
    private readonly int _axialMin, _axialMax;

    /// <param name="baseX">Centre of the base disc (x).</param>
    /// <param name="length">Distance from the base disc to the top disc along the positive axis direction.</param>
    public CylinderLayer(LayerOp op, byte material, Axis axis, double baseX, double baseY, double baseZ,
        double radius, double length, Box3i extent)
        : base(op, material, ComputeBounds(axis, baseX, baseY, baseZ, radius, length).Intersect(extent))
    {
        _axis = axis;
        (double along, _ca, _cb) = Split(axis, baseX, baseY, baseZ);
        (_axialMin, _axialMax) = ShapeMath.CentresIn(along, along + length);
        _r2 = radius * radius;
    }

    public override string Kind => "cylinder";

    /// <summary>The cylinder's area (side and ends), but no more than its clipped bounds' surface (a convex shape).</summary>
    public override LayerCost Cost(in Box3i extent)
    {
        double area = 2 * Math.PI * _r2 + 2 * Math.PI * Math.Sqrt(_r2) * (_axialMax - _axialMin);
        return LayerCost.OfSurface(Math.Min(area, ShapeMath.BoxArea(Bounds)), "a cylinder surface");
    }

    public Axis Axis => _axis;

    public override Coverage Classify(in Box3i region)
    {
        if (region.IsEmpty || !Bounds.Intersects(region))
            return Coverage.None;
        var (aMin, aMax, bMin, bMax, tMin, tMax) = SplitBox(region);
        if (tMax <= _axialMin || tMin >= _axialMax)
            return Coverage.None;
        // Monotone rounding makes the nearest/farthest centre tests sound (see SphereLayer).
        double na = ShapeMath.NearestOffset(aMin, aMax, _ca), nb = ShapeMath.NearestOffset(bMin, bMax, _cb);
        if (na * na + nb * nb > _r2)
            return Coverage.None;
        double fa = ShapeMath.FarthestOffset(aMin, aMax, _ca), fb = ShapeMath.FarthestOffset(bMin, bMax, _cb);
        bool full = fa * fa + fb * fb <= _r2 && tMin >= _axialMin && tMax <= _axialMax && Bounds.ContainsBox(region);
        return full ? Coverage.Full : Coverage.Partial;
    }

    public override bool Contains(int x, int y, int z)
    {
        if (!Bounds.Contains(x, y, z))
            return false;
        var (t, a, b) = Split(_axis, x, y, z);
        return t >= _axialMin && t < _axialMax && Radial(a, b);
    }

    // The base class's loop, repeated so the calls to Contains are direct (this class is sealed) and can be inlined.
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public override void Fill(in Box3i region, Span<bool> inside)
    {
        int i = 0;
        for (int z = region.MinZ; z < region.MaxZ; z++)
            for (int y = region.MinY; y < region.MaxY; y++)
                for (int x = region.MinX; x < region.MaxX; x++)
                    inside[i++] = Contains(x, y, z);
    }

    private bool Radial(int a, int b)
    {
        double da = a + 0.5 - _ca, db = b + 0.5 - _cb;
        return da * da + db * db <= _r2;
    }

    private static (T Along, T A, T B) Split<T>(Axis axis, T x, T y, T z) => axis switch
    {
        Axis.X => (x, y, z),
        Axis.Y => (y, x, z),
        _ => (z, x, y),
    };

    private (int AMin, int AMax, int BMin, int BMax, int TMin, int TMax) SplitBox(in Box3i r) => _axis switch
    {
        Axis.X => (r.MinY, r.MaxY, r.MinZ, r.MaxZ, r.MinX, r.MaxX),
        Axis.Y => (r.MinX, r.MaxX, r.MinZ, r.MaxZ, r.MinY, r.MaxY),
        _ => (r.MinX, r.MaxX, r.MinY, r.MaxY, r.MinZ, r.MaxZ),
    };

    private static Box3i ComputeBounds(Axis axis, double x, double y, double z, double radius, double length)
    {
        var (along, ca, cb) = Split(axis, x, y, z);
        var (t0, t1) = ShapeMath.CentresIn(along, along + length);
        var (a0, a1) = ShapeMath.Span(ca, radius);
        var (b0, b1) = ShapeMath.Span(cb, radius);
        return axis switch
        {
            Axis.X => new Box3i(t0, a0, b0, t1, a1, b1),
            Axis.Y => new Box3i(a0, t0, b0, a1, t1, b1),
            _ => new Box3i(a0, b0, t0, a1, b1, t1),
        };
    }
}
