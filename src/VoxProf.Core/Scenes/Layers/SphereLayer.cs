using System.Runtime.CompilerServices;
using VoxProf.Core.Geometry;

namespace VoxProf.Core.Scenes.Layers;

/// <summary>A ball: a voxel is inside when the squared distance from its centre to the ball's centre is at most r².</summary>
public sealed class SphereLayer : Layer
{
    private readonly double _cx, _cy, _cz, _r2;

    public SphereLayer(LayerOp op, byte material, double centerX, double centerY, double centerZ, double radius, Box3i extent)
        : base(op, material, ShapeMath.BallBounds(centerX, centerY, centerZ, radius).Intersect(extent))
    {
        _cx = centerX;
        _cy = centerY;
        _cz = centerZ;
        _r2 = radius * radius;
        Radius = radius;
    }

    public double Radius { get; }

    public override string Kind => "sphere";

    /// <summary>
    /// The sphere's area, but no more than its clipped bounds' surface: the boundary of a convex shape inside a box
    /// has no more area than the box. Nothing when the ball holds the whole extent.
    /// </summary>
    public override LayerCost Cost(in Box3i extent)
    {
        double fx = ShapeMath.FarthestOffset(extent.MinX, extent.MaxX, _cx);
        double fy = ShapeMath.FarthestOffset(extent.MinY, extent.MaxY, _cy);
        double fz = ShapeMath.FarthestOffset(extent.MinZ, extent.MaxZ, _cz);
        if (fx * fx + fy * fy + fz * fz <= _r2)
            return LayerCost.None;
        return LayerCost.OfSurface(Math.Min(4 * Math.PI * _r2, ShapeMath.BoxArea(Bounds)), "a sphere surface");
    }

    public override Coverage Classify(in Box3i region)
    {
        if (region.IsEmpty || !Bounds.Intersects(region))
            return Coverage.None;
        // Rounding is monotone, so the computed distance of any voxel centre lies between the computed
        // distances of the nearest and farthest centres of the region: both tests below are sound.
        double nx = ShapeMath.NearestOffset(region.MinX, region.MaxX, _cx);
        double ny = ShapeMath.NearestOffset(region.MinY, region.MaxY, _cy);
        double nz = ShapeMath.NearestOffset(region.MinZ, region.MaxZ, _cz);
        if (nx * nx + (ny * ny + nz * nz) > _r2)
            return Coverage.None;
        double fx = ShapeMath.FarthestOffset(region.MinX, region.MaxX, _cx);
        double fy = ShapeMath.FarthestOffset(region.MinY, region.MaxY, _cy);
        double fz = ShapeMath.FarthestOffset(region.MinZ, region.MaxZ, _cz);
        bool full = fx * fx + (fy * fy + fz * fz) <= _r2 && Bounds.ContainsBox(region);
        return full ? Coverage.Full : Coverage.Partial;
    }

    public override bool Contains(int x, int y, int z)
    {
        if (!Bounds.Contains(x, y, z))
            return false;
        double dx = x + 0.5 - _cx, dy = y + 0.5 - _cy, dz = z + 0.5 - _cz;
        return dx * dx + (dy * dy + dz * dz) <= _r2;
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public override void Fill(in Box3i region, Span<bool> inside)
    {
        inside[..checked((int)region.Volume)].Clear();
        Box3i r = region.Intersect(Bounds);
        int sx = region.SizeX, sxy = sx * region.SizeY;
        for (int z = r.MinZ; z < r.MaxZ; z++)
        {
            double dz = z + 0.5 - _cz;
            for (int y = r.MinY; y < r.MaxY; y++)
            {
                double dy = y + 0.5 - _cy;
                // Same operation order as Contains, so both agree bit for bit.
                double dyz = dy * dy + dz * dz;
                int i = (z - region.MinZ) * sxy + (y - region.MinY) * sx + (r.MinX - region.MinX);
                for (int x = r.MinX; x < r.MaxX; x++)
                {
                    double dx = x + 0.5 - _cx;
                    inside[i++] = dx * dx + dyz <= _r2;
                }
            }
        }
    }
}
