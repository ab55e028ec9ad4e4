namespace VoxProf.Core.Noise;

/// <summary>
/// SplitMix64 (Steele, Lea and Flood, "Fast splittable pseudorandom number generators", OOPSLA 2014):
/// a tiny 64-bit generator whose output depends only on the seed, so every machine builds the same scene.
/// </summary>
public struct SplitMix64
{
    private ulong _state;

    public SplitMix64(ulong seed) => _state = seed;

    public ulong NextUInt64()
    {
        ulong z = _state += 0x9E3779B97F4A7C15UL;
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
        return z ^ (z >> 31);
    }

    /// <summary>Uniform integer in [0, bound); bound must be positive. Uses the 128-bit multiply-high reduction.</summary>
    public int NextInt(int bound)
    {
        ulong hi = Math.BigMul(NextUInt64(), (ulong)bound, out _);
        return (int)hi;
    }

    /// <summary>Uniform double in [0, 1) from the top 53 bits.</summary>
    public double NextDouble() => (NextUInt64() >> 11) * (1.0 / (1UL << 53));
}
