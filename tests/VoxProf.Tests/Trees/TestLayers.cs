using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;

namespace VoxProf.Tests.Trees;

/// <summary>An axis-aligned box of voxels with an exact classification.</summary>
internal sealed class BoxLayer(LayerOp op, byte material, Box3i box, Box3i extent)
    : Layer(op, material, box.Intersect(extent))
{
    public override string Kind => "test-box";

    public override Coverage Classify(in Box3i region) =>
        !Bounds.Intersects(region) ? Coverage.None : Bounds.ContainsBox(region) ? Coverage.Full : Coverage.Partial;

    public override bool Contains(int x, int y, int z) => Bounds.Contains(x, y, z);
}

/// <summary>A ball: a voxel is inside when its centre is within <c>radius</c> of the ball's centre.</summary>
internal sealed class SphereLayer(LayerOp op, byte material, double cx, double cy, double cz, double radius, Box3i extent)
    : Layer(op, material, BoundsOf(cx, cy, cz, radius).Intersect(extent))
{
    public override string Kind => "test-sphere";

    public override Coverage Classify(in Box3i region)
    {
        // Voxel centres of the region span [Min + 0.5, Max - 0.5] on each axis.
        double near = 0, far = 0;
        Axis(region.MinX, region.MaxX, cx, ref near, ref far);
        Axis(region.MinY, region.MaxY, cy, ref near, ref far);
        Axis(region.MinZ, region.MaxZ, cz, ref near, ref far);
        double r2 = radius * radius;
        return near > r2 ? Coverage.None : far <= r2 ? Coverage.Full : Coverage.Partial;
    }

    public override bool Contains(int x, int y, int z)
    {
        double dx = x + 0.5 - cx, dy = y + 0.5 - cy, dz = z + 0.5 - cz;
        return dx * dx + dy * dy + dz * dz <= radius * radius;
    }

    private static void Axis(int min, int max, double c, ref double near, ref double far)
    {
        double lo = min + 0.5, hi = max - 0.5;
        double d = c < lo ? lo - c : c > hi ? c - hi : 0;
        near += d * d;
        double f = Math.Max(Math.Abs(c - lo), Math.Abs(hi - c));
        far += f * f;
    }

    private static Box3i BoundsOf(double cx, double cy, double cz, double r) => new(
        (int)Math.Floor(cx - r - 1), (int)Math.Floor(cy - r - 1), (int)Math.Floor(cz - r - 1),
        (int)Math.Ceiling(cx + r + 1), (int)Math.Ceiling(cy + r + 1), (int)Math.Ceiling(cz + r + 1));
}

/// <summary>
/// Seeded white noise inside a box: each voxel is in with the given probability. It only ever answers Partial,
/// so every region it touches is evaluated densely and may turn out empty or full.
/// </summary>
internal sealed class NoiseLayer(LayerOp op, byte material, Box3i box, Box3i extent, uint seed, double density)
    : Layer(op, material, box.Intersect(extent))
{
    public override string Kind => "test-noise";

    public override Coverage Classify(in Box3i region) => Bounds.Intersects(region) ? Coverage.Partial : Coverage.None;

    public override bool Contains(int x, int y, int z) => Hash(x, y, z, seed) < density * 4294967296.0;

    /// <summary>A 32-bit integer mix (the lowbias32 finaliser, from memory).</summary>
    internal static uint Hash(int x, int y, int z, uint seed)
    {
        uint h = seed ^ (uint)x * 0x9E3779B1u ^ (uint)y * 0x85EBCA77u ^ (uint)z * 0xC2B2AE3Du;
        h ^= h >> 16;
        h *= 0x7FEB352Du;
        h ^= h >> 15;
        h *= 0x846CA68Bu;
        h ^= h >> 16;
        return h;
    }
}

/// <summary>Wraps a layer and never answers Full: the builder must find uniform regions by evaluating them.</summary>
internal sealed class VagueLayer(Layer inner) : Layer(inner.Op, inner.Material, inner.Bounds)
{
    public override string Kind => "test-vague";

    public override Coverage Classify(in Box3i region) =>
        inner.Classify(region) == Coverage.None ? Coverage.None : Coverage.Partial;

    public override bool Contains(int x, int y, int z) => inner.Contains(x, y, z);
}

/// <summary>
/// Rolling ground: a voxel is inside when its centre lies below a smooth height h(x, z) made of sines.
/// Classify bounds h over a region from its value at the region's middle and the slope limits; Fill evaluates each
/// column once, as a heightfield layer would.
/// </summary>
internal sealed class HillsLayer : Layer
{
    private readonly double _baseHeight;
    private readonly double _amplitude;
    private readonly double _frequency;
    private readonly double _slope;

    public HillsLayer(byte material, double baseHeight, double amplitude, double wavelength, Box3i extent)
        : base(LayerOp.Add, material, new Box3i(0, 0, 0, extent.MaxX, (int)Math.Ceiling(baseHeight + 2 * amplitude) + 1, extent.MaxZ).Intersect(extent))
    {
        _baseHeight = baseHeight;
        _amplitude = amplitude;
        _frequency = 2 * Math.PI / wavelength;
        // Differentiating the three terms of Height: |dh/dx| <= A·f·(1 + 0.85 + 0.45), |dh/dz| <= A·f·(0.8 + 0.85 + 0.9).
        _slope = 2.6 * amplitude * _frequency;
    }

    public override string Kind => "test-hills";

    public double Height(double x, double z)
    {
        double f = _frequency;
        return _baseHeight + _amplitude * (Math.Sin(x * f) * Math.Cos(z * f * 0.8)
            + 0.5 * Math.Sin((x + z) * f * 1.7 + 1.3)
            + 0.5 * Math.Cos((x - 2 * z) * f * 0.9));
    }

    public override Coverage Classify(in Box3i region)
    {
        double mx = (region.MinX + region.MaxX) * 0.5, mz = (region.MinZ + region.MaxZ) * 0.5;
        double h = Height(mx, mz);
        // Rounding slack keeps the bound conservative against floating-point error.
        double spread = _slope * (region.SizeX + region.SizeZ) * 0.5 + 1e-6 * _amplitude + 1e-9;
        if (region.MinY + 0.5 >= h + spread)
            return Coverage.None;
        if (region.MaxY - 0.5 < h - spread)
            return Coverage.Full;
        return Coverage.Partial;
    }

    public override bool Contains(int x, int y, int z) => y + 0.5 < Height(x + 0.5, z + 0.5);

    public override void Fill(in Box3i region, Span<bool> inside)
    {
        int sx = region.SizeX, sy = region.SizeY;
        int i = 0;
        for (int z = region.MinZ; z < region.MaxZ; z++)
        {
            for (int x = 0; x < sx; x++)
            {
                double h = Height(region.MinX + x + 0.5, z + 0.5);
                for (int y = 0; y < sy; y++)
                    inside[i + y * sx + x] = region.MinY + y + 0.5 < h;
            }
            i += sx * sy;
        }
    }
}
