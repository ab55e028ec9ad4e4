using System.Runtime.CompilerServices;

namespace VoxProf.Core.Noise;

/// <summary>
/// Perlin's improved gradient noise (K. Perlin, "Improving Noise", SIGGRAPH 2002): quintic fade and the twelve
/// cube-edge gradients, with the permutation shuffled from a seed instead of Perlin's fixed table.
/// Only +, -, * and floor are used (no FMA, no transcendental functions), so values are identical on every machine.
/// </summary>
/// <remarks>
/// Bound: every corner term g·d uses two of the three offset components, so |g·d| ≤ |dx| + |dy| + |dz|. Summed with
/// the fade weights, each axis contributes at most (1 - s(f))·f + s(f)·(1 - f) ≤ 1/2 (because s(f) ≤ f for f ≤ 1/2),
/// hence |noise| ≤ <see cref="Bound"/> = 1.5. In practice values stay near [-1, 1].
/// </remarks>
public sealed class GradientNoise
{
    /// <summary>Proven bound on |Noise3| and |Noise2| (see remarks).</summary>
    public const double Bound = 1.5;

    // Doubled so corner hashes index without a wrap-around mask.
    private readonly byte[] _perm = new byte[512];

    public GradientNoise(ulong seed)
    {
        var rng = new SplitMix64(seed);
        Span<byte> p = stackalloc byte[256];
        for (int i = 0; i < 256; i++)
            p[i] = (byte)i;
        // Fisher–Yates shuffle driven by our own generator.
        for (int i = 255; i > 0; i--)
        {
            int j = rng.NextInt(i + 1);
            (p[i], p[j]) = (p[j], p[i]);
        }
        for (int i = 0; i < 512; i++)
            _perm[i] = p[i & 255];
    }

    /// <summary>Uses a given permutation of 0..255 (for checks against published reference values).</summary>
    internal GradientNoise(ReadOnlySpan<byte> permutation)
    {
        if (permutation.Length != 256)
            throw new ArgumentException("expected 256 entries", nameof(permutation));
        for (int i = 0; i < 512; i++)
            _perm[i] = permutation[i & 255];
    }

    /// <summary>Gradient noise at a point; zero at every integer lattice point.</summary>
    // Fully optimised from the first call: the tree builder evaluates millions of samples in about a second, before
    // tiered compilation would promote these methods (seen in a profile of the demo build).
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double Noise3(double x, double y, double z)
    {
        double fx = Math.Floor(x), fy = Math.Floor(y), fz = Math.Floor(z);
        int xi = (int)(long)fx & 255, yi = (int)(long)fy & 255, zi = (int)(long)fz & 255;
        x -= fx;
        y -= fy;
        z -= fz;
        double u = Fade(x), v = Fade(y), w = Fade(z);

        byte[] p = _perm;
        int a = p[xi] + yi, aa = p[a] + zi, ab = p[a + 1] + zi;
        int b = p[xi + 1] + yi, ba = p[b] + zi, bb = p[b + 1] + zi;

        double x1 = x - 1, y1 = y - 1, z1 = z - 1;
        double l0 = Lerp(v,
            Lerp(u, Grad(p[aa], x, y, z), Grad(p[ba], x1, y, z)),
            Lerp(u, Grad(p[ab], x, y1, z), Grad(p[bb], x1, y1, z)));
        double l1 = Lerp(v,
            Lerp(u, Grad(p[aa + 1], x, y, z1), Grad(p[ba + 1], x1, y, z1)),
            Lerp(u, Grad(p[ab + 1], x, y1, z1), Grad(p[bb + 1], x1, y1, z1)));
        return Lerp(w, l0, l1);
    }

    /// <summary>
    /// The slice z = 0 of <see cref="Noise3"/>, computed with four corners instead of eight.
    /// Bit-identical to Noise3(x, y, 0) because the z blend weight there is exactly zero.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double Noise2(double x, double y)
    {
        double fx = Math.Floor(x), fy = Math.Floor(y);
        int xi = (int)(long)fx & 255, yi = (int)(long)fy & 255;
        x -= fx;
        y -= fy;
        double u = Fade(x), v = Fade(y);

        byte[] p = _perm;
        int a = p[xi] + yi, aa = p[a], ab = p[a + 1];
        int b = p[xi + 1] + yi, ba = p[b], bb = p[b + 1];

        double x1 = x - 1, y1 = y - 1;
        return Lerp(v,
            Lerp(u, Grad(p[aa], x, y, 0), Grad(p[ba], x1, y, 0)),
            Lerp(u, Grad(p[ab], x, y1, 0), Grad(p[bb], x1, y1, 0)));
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static double Fade(double t) => t * t * t * (t * (t * 6 - 15) + 10);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static double Lerp(double t, double a, double b) => a + t * (b - a);

    // Perlin 2002: the low four hash bits pick one of the twelve cube-edge directions (four repeated).
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static double Grad(int hash, double x, double y, double z)
    {
        int h = hash & 15;
        double u = h < 8 ? x : y;
        double v = h < 4 ? y : h == 12 || h == 14 ? x : z;
        return ((h & 1) == 0 ? u : -u) + ((h & 2) == 0 ? v : -v);
    }
}
