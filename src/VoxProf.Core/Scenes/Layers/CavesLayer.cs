using System.Runtime.CompilerServices;
using VoxProf.Core.Geometry;
using VoxProf.Core.Noise;

namespace VoxProf.Core.Scenes.Layers;

/// <summary>How a caves layer turns its noise into a solid/empty decision.</summary>
public enum CaveShape
{
    /// <summary>Inside where two independent noise fields are both within ±threshold of zero: winding tubes.</summary>
    Tunnels,

    /// <summary>Inside where one noise field exceeds the threshold: rounded chambers.</summary>
    Chambers,
}

/// <summary>Parameters of a caves layer; noise is sampled at voxel centres.</summary>
public sealed record CaveSettings(ulong Seed, CaveShape Shape, double Threshold, int Octaves, double Frequency,
    double VerticalScale = 1.0);

/// <summary>
/// Seeded 3D noise within a region. Classification is only decided by the region and by thresholds beyond the
/// noise's proven bound; everything else inside the region is Partial (a tight bound on noise over a box is costly).
/// </summary>
public sealed class CavesLayer : Layer
{
    private readonly FractalNoise _a, _b;
    private readonly double _yScale;
    private readonly Coverage _inside;

    /// <param name="region">Voxels the caves may occupy; clipped to <paramref name="extent"/>.</param>
    public CavesLayer(LayerOp op, byte material, CaveSettings settings, Box3i region, Box3i extent)
        : base(op, material, region.Intersect(extent))
    {
        Settings = settings;
        _a = new FractalNoise(settings.Seed, settings.Octaves, settings.Frequency);
        _b = new FractalNoise(settings.Seed ^ 0x5DEECE66DUL, settings.Octaves, settings.Frequency);
        _yScale = settings.VerticalScale;
        // Beyond the noise bound the answer is the same everywhere in the region.
        double bound = GradientNoise.Bound * (1 + 1e-9);
        _inside = settings.Shape switch
        {
            CaveShape.Tunnels when settings.Threshold <= 0 => Coverage.None,
            CaveShape.Tunnels when settings.Threshold > bound => Coverage.Full,
            CaveShape.Chambers when settings.Threshold >= bound => Coverage.None,
            CaveShape.Chambers when settings.Threshold < -bound => Coverage.Full,
            _ => Coverage.Partial,
        };
    }

    public CaveSettings Settings { get; }

    public override string Kind => "caves";

    /// <summary>
    /// Every voxel of the region (classification cannot settle any part of it), one 3D noise sample per octave each,
    /// about nine voxel tests (a second field for tunnels where the first passes); none when the threshold settles it.
    /// </summary>
    public override LayerCost Cost(in Box3i extent)
    {
        if (_inside != Coverage.Partial || Bounds.IsEmpty)
            return LayerCost.None;
        double volume = Bounds.Volume;
        double perVoxel = 9.0 * Settings.Octaves * (Settings.Shape == CaveShape.Tunnels ? 1.3 : 1);
        // Caves leave the region full of mixed bricks; trees of the sample caves hold about 0.12 bytes per voxel.
        return new LayerCost(volume * perVoxel, volume * 0.03, 0,
            $"a region of {LayerCost.Figure(volume)} voxels × {Settings.Octaves} octave{(Settings.Octaves == 1 ? "" : "s")} of 3D noise");
    }

    public override Coverage Classify(in Box3i region)
    {
        if (region.IsEmpty || !Bounds.Intersects(region) || _inside == Coverage.None)
            return Coverage.None;
        return _inside == Coverage.Full && Bounds.ContainsBox(region) ? Coverage.Full : Coverage.Partial;
    }

    public override bool Contains(int x, int y, int z) => Bounds.Contains(x, y, z) && Inside(x, y, z);

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public override void Fill(in Box3i region, Span<bool> inside)
    {
        inside[..checked((int)region.Volume)].Clear();
        Box3i r = region.Intersect(Bounds);
        int sx = region.SizeX, sxy = sx * region.SizeY;
        for (int z = r.MinZ; z < r.MaxZ; z++)
        {
            for (int y = r.MinY; y < r.MaxY; y++)
            {
                int i = (z - region.MinZ) * sxy + (y - region.MinY) * sx + (r.MinX - region.MinX);
                for (int x = r.MinX; x < r.MaxX; x++)
                    inside[i++] = Inside(x, y, z);
            }
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private bool Inside(int x, int y, int z)
    {
        double px = x + 0.5, py = (y + 0.5) * _yScale, pz = z + 0.5;
        double t = Settings.Threshold;
        if (Settings.Shape == CaveShape.Chambers)
            return _a.Sample3(px, py, pz) > t;
        // The second field is sampled only where the first passes: most voxels fail the first test.
        return Math.Abs(_a.Sample3(px, py, pz)) < t && Math.Abs(_b.Sample3(px, py, pz)) < t;
    }
}
