namespace VoxProf.Core.Scenes.Layers;

/// <summary>
/// Parameters of a fractal heightfield: height(x, z) = floor(BaseHeight + Amplitude · fbm(x + ½, z + ½)), where fbm is
/// <see cref="Noise.FractalNoise"/> with these octaves, frequency (cycles per voxel), gain and lacunarity.
/// </summary>
public sealed record TerrainSettings(ulong Seed, int Octaves, double Frequency, double Amplitude, double BaseHeight,
    double Gain = 0.5, double Lacunarity = 2.0);
