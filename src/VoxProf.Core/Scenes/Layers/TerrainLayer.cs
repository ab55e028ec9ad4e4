using System.Runtime.CompilerServices;
using VoxProf.Core.Geometry;
using VoxProf.Core.Noise;

namespace VoxProf.Core.Scenes.Layers;

/// <summary>
/// A fractal-noise heightfield over a footprint: voxel (x, y, z) is inside when y &lt; height(x, z).
/// Heights are computed once, on first use, in parallel, into a min/max pyramid, so classifying any region costs
/// at most four tile look-ups and filling a block reads each column's height once.
/// </summary>
public sealed class TerrainLayer : Layer
{
    /// <summary>Heights are stored in 16 bits; at an extent of 65,536 the top voxel row is never terrain.</summary>
    public const int MaxHeight = ushort.MaxValue;

    private readonly FractalNoise _noise;
    private readonly int _heightCap;
    private readonly Lazy<HeightPyramid> _pyramid;

    /// <param name="footprint">Columns the terrain covers (y ignored); clipped to <paramref name="extent"/>.</param>
    public TerrainLayer(LayerOp op, byte material, TerrainSettings settings, Box3i footprint, Box3i extent)
        : base(op, material, ComputeBounds(settings, footprint, extent))
    {
        Settings = settings;
        _noise = new FractalNoise(settings.Seed, settings.Octaves, settings.Frequency, settings.Gain, settings.Lacunarity);
        _heightCap = Math.Min(extent.MaxY, MaxHeight);
        _pyramid = new Lazy<HeightPyramid>(BuildPyramid, LazyThreadSafetyMode.ExecutionAndPublication);
    }

    public TerrainSettings Settings { get; }

    public override string Kind => "terrain";

    /// <summary>
    /// Every column's height (one 2D noise sample per octave, about two voxel tests each) and the surface: the
    /// columns, plus the walls the relief raises between neighbours, at most the terrain's height range.
    /// </summary>
    public override LayerCost Cost(in Box3i extent)
    {
        if (Bounds.IsEmpty)
            return LayerCost.None;
        double columns = (double)Bounds.SizeX * Bounds.SizeZ;
        var s = Settings;
        // Slope of the normalised fractal sum: each octave's weight times its frequency (gradient noise changes by
        // about its bound per lattice cell, common practice for a rough bound).
        double slope = 0, weight = 1, frequency = s.Frequency, weights = 0;
        for (int o = 0; o < s.Octaves; o++)
        {
            slope += weight * frequency;
            weights += weight;
            weight *= s.Gain;
            frequency *= s.Lacunarity;
        }
        double relief = Math.Min(Bounds.SizeY, Math.Abs(s.Amplitude) * GradientNoise.Bound * slope / weights);
        double surface = columns * (1 + relief);
        double heights = columns * s.Octaves * 2;
        return new LayerCost(surface * LayerCost.DenseSide + heights, surface, columns * sizeof(ushort) * 4 / 3,
            $"{LayerCost.Figure(columns)} columns × {s.Octaves} octave{(s.Octaves == 1 ? "" : "s")} and a surface of about {LayerCost.Figure(surface)} voxels");
    }

    /// <summary>Height of column (x, z) straight from the noise (the definition the stored heights must equal).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public int ComputeHeight(int x, int z)
    {
        double h = Math.Floor(Settings.BaseHeight + Settings.Amplitude * _noise.Sample2(x + 0.5, z + 0.5));
        return h <= 0 ? 0 : h >= _heightCap ? _heightCap : (int)h;
    }

    /// <summary>Stored height of a column inside the footprint; 0 outside it.</summary>
    public int HeightAt(int x, int z) =>
        Bounds.IsEmpty || x < Bounds.MinX || x >= Bounds.MaxX || z < Bounds.MinZ || z >= Bounds.MaxZ
            ? 0
            : _pyramid.Value.Height(x, z);

    public override Coverage Classify(in Box3i region) =>
        Bounds.IsEmpty ? Coverage.None : _pyramid.Value.Classify(region, Bounds);

    // Before the heights exist, one column is computed on its own: a few spot checks through
    // Scene.EvaluateMaterial should not pay for the whole heightfield. The two agree exactly.
    public override bool Contains(int x, int y, int z) =>
        Bounds.Contains(x, y, z) && y < (_pyramid.IsValueCreated ? _pyramid.Value.Height(x, z) : ComputeHeight(x, z));

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public override void Fill(in Box3i region, Span<bool> inside)
    {
        if (Bounds.IsEmpty)
            inside[..checked((int)region.Volume)].Clear();
        else
            _pyramid.Value.Fill(region, Bounds, inside);
    }

    private HeightPyramid BuildPyramid()
    {
        Box3i b = Bounds;
        int width = b.SizeX, depth = b.SizeZ;
        var heights = new ushort[(long)width * depth];
        Parallel.For(0, depth, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (dz) =>
        {
            int z = b.MinZ + dz;
            int row = dz * width;
            for (int dx = 0; dx < width; dx++)
                heights[row + dx] = (ushort)ComputeHeight(b.MinX + dx, z);
        });
        return new HeightPyramid(b.MinX, b.MinZ, width, depth, heights);
    }

    private static Box3i ComputeBounds(TerrainSettings s, Box3i footprint, Box3i extent)
    {
        // Noise is bounded, so no column rises above base + |amplitude| · bound.
        double top = Math.Floor(s.BaseHeight + Math.Abs(s.Amplitude) * GradientNoise.Bound) + 1;
        int maxY = (int)Math.Clamp(top, 0, Math.Min(extent.MaxY, MaxHeight));
        return new Box3i(footprint.MinX, 0, footprint.MinZ, footprint.MaxX, maxY, footprint.MaxZ).Intersect(extent);
    }
}
