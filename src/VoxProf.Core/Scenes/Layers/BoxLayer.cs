using System.Runtime.CompilerServices;
using VoxProf.Core.Geometry;

namespace VoxProf.Core.Scenes.Layers;

/// <summary>An axis-aligned box of whole voxels.</summary>
public sealed class BoxLayer : Layer
{
    /// <param name="box">The voxels inside (half-open); clipped to <paramref name="extent"/>.</param>
    public BoxLayer(LayerOp op, byte material, Box3i box, Box3i extent)
        : base(op, material, box.Intersect(extent))
    {
    }

    public override string Kind => "box";

    public override LayerCost Cost(in Box3i extent) => LayerCost.OfSurface(LayerCost.InnerFaceArea(Bounds, extent), "a box surface");

    public override Coverage Classify(in Box3i region)
    {
        if (!Bounds.Intersects(region))
            return Coverage.None;
        return Bounds.ContainsBox(region) ? Coverage.Full : Coverage.Partial;
    }

    public override bool Contains(int x, int y, int z) => Bounds.Contains(x, y, z);

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public override void Fill(in Box3i region, Span<bool> inside)
    {
        inside[..checked((int)region.Volume)].Clear();
        Box3i r = region.Intersect(Bounds);
        if (r.IsEmpty)
            return;
        int sx = region.SizeX, sxy = sx * region.SizeY;
        for (int z = r.MinZ; z < r.MaxZ; z++)
        {
            for (int y = r.MinY; y < r.MaxY; y++)
            {
                int row = (z - region.MinZ) * sxy + (y - region.MinY) * sx;
                inside.Slice(row + r.MinX - region.MinX, r.SizeX).Fill(true);
            }
        }
    }
}
