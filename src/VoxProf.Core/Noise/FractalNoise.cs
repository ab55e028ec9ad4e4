using System.Runtime.CompilerServices;

namespace VoxProf.Core.Noise;

/// <summary>
/// Fractal sum of <see cref="GradientNoise"/> octaves (each octave's frequency times the lacunarity, its amplitude
/// times the gain), normalised by the sum of amplitudes so |value| ≤ <see cref="GradientNoise.Bound"/>.
/// Each octave is shifted by a seeded non-integer offset so the octaves' zero lattices do not line up.
/// </summary>
public sealed class FractalNoise
{
    private readonly GradientNoise _noise;
    private readonly double[] _frequency;
    private readonly double[] _weight;
    private readonly double[] _offset;

    public FractalNoise(ulong seed, int octaves, double frequency, double gain = 0.5, double lacunarity = 2.0)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(octaves, 1);
        _noise = new GradientNoise(seed);
        var rng = new SplitMix64(seed ^ 0xA5A5_5A5A_C3C3_3C3CUL);
        _frequency = new double[octaves];
        _weight = new double[octaves];
        _offset = new double[octaves * 3];
        double f = frequency, a = 1, sum = 0;
        for (int o = 0; o < octaves; o++)
        {
            _frequency[o] = f;
            _weight[o] = a;
            sum += a;
            f *= lacunarity;
            a *= gain;
            for (int k = 0; k < 3; k++)
                _offset[o * 3 + k] = rng.NextDouble() * 256.0;
        }
        for (int o = 0; o < octaves; o++)
            _weight[o] /= sum;
        Octaves = octaves;
    }

    public int Octaves { get; }

    /// <summary>Two-dimensional fractal noise (slices of the 3D noise).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double Sample2(double x, double z)
    {
        double s = 0;
        for (int o = 0; o < _frequency.Length; o++)
        {
            double f = _frequency[o];
            s += _weight[o] * _noise.Noise2(x * f + _offset[o * 3], z * f + _offset[o * 3 + 2]);
        }
        return s;
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double Sample3(double x, double y, double z)
    {
        double s = 0;
        for (int o = 0; o < _frequency.Length; o++)
        {
            double f = _frequency[o];
            s += _weight[o] * _noise.Noise3(x * f + _offset[o * 3], y * f + _offset[o * 3 + 1], z * f + _offset[o * 3 + 2]);
        }
        return s;
    }
}
