using VoxProf.Core.Noise;

namespace VoxProf.Tests.Noise;

public class GradientNoiseTests
{
    // The permutation printed in Perlin's reference implementation of improved noise (2002).
    private static readonly byte[] PerlinPermutation =
    [
        151, 160, 137, 91, 90, 15, 131, 13, 201, 95, 96, 53, 194, 233, 7, 225, 140, 36, 103, 30, 69, 142, 8, 99, 37,
        240, 21, 10, 23, 190, 6, 148, 247, 120, 234, 75, 0, 26, 197, 62, 94, 252, 219, 203, 117, 35, 11, 32, 57, 177,
        33, 88, 237, 149, 56, 87, 174, 20, 125, 136, 171, 168, 68, 175, 74, 165, 71, 134, 139, 48, 27, 166, 77, 146,
        158, 231, 83, 111, 229, 122, 60, 211, 133, 230, 220, 105, 92, 41, 55, 46, 245, 40, 244, 102, 143, 54, 65, 25,
        63, 161, 1, 216, 80, 73, 209, 76, 132, 187, 208, 89, 18, 169, 200, 196, 135, 130, 116, 188, 159, 86, 164, 100,
        109, 198, 173, 186, 3, 64, 52, 217, 226, 250, 124, 123, 5, 202, 38, 147, 118, 126, 255, 82, 85, 212, 207, 206,
        59, 227, 47, 16, 58, 17, 182, 189, 28, 42, 223, 183, 170, 213, 119, 248, 152, 2, 44, 154, 163, 70, 221, 153,
        101, 155, 167, 43, 172, 9, 129, 22, 39, 253, 19, 98, 108, 110, 79, 113, 224, 232, 178, 185, 112, 104, 218, 246,
        97, 228, 251, 34, 242, 193, 238, 210, 144, 12, 191, 179, 162, 241, 81, 51, 145, 235, 249, 14, 239, 107, 49, 192,
        214, 31, 181, 199, 106, 157, 184, 84, 204, 176, 115, 121, 50, 45, 127, 4, 150, 254, 138, 236, 205, 93, 222, 114,
        67, 29, 24, 72, 243, 141, 128, 195, 78, 66, 215, 61, 156, 180,
    ];

    [Fact]
    public void With_Perlins_permutation_the_noise_matches_the_reference_implementation()
    {
        // Perlin, "Improving Noise" (SIGGRAPH 2002), reference Java code ImprovedNoise: noise(3.14, 42, 7) prints
        // 0.13691995878400012 (value from memory of ports of that code; reproduced here by an independent
        // line-by-line transcription of the reference code before this test was written).
        var noise = new GradientNoise(PerlinPermutation);
        noise.Noise3(3.14, 42, 7).Should().BeApproximately(0.13691995878400012, 1e-15);
    }

    [Fact]
    public void Noise_is_zero_at_every_integer_lattice_point()
    {
        // Perlin 2002: gradient noise is the blend of g·d terms, and at a lattice point the only term with
        // non-zero weight has offset d = 0, so the value there is exactly zero.
        var rng = new Random(5);
        foreach (ulong seed in new ulong[] { 0, 1, 12345 })
        {
            var noise = new GradientNoise(seed);
            for (int i = 0; i < 2000; i++)
            {
                int x = rng.Next(-1000, 1000), y = rng.Next(-1000, 1000), z = rng.Next(-1000, 1000);
                noise.Noise3(x, y, z).Should().Be(0);
                noise.Noise2(x, z).Should().Be(0);
            }
        }
    }

    [Fact]
    public void Same_seed_gives_the_same_values_and_a_different_seed_different_ones()
    {
        var a = new GradientNoise(42);
        var b = new GradientNoise(42);
        var c = new GradientNoise(43);
        var rng = new Random(9);
        int differing = 0;
        for (int i = 0; i < 1000; i++)
        {
            double x = rng.NextDouble() * 300, y = rng.NextDouble() * 300, z = rng.NextDouble() * 300;
            a.Noise3(x, y, z).Should().Be(b.Noise3(x, y, z));
            if (a.Noise3(x, y, z) != c.Noise3(x, y, z))
                differing++;
        }
        differing.Should().BeGreaterThan(900);
    }

    [Fact]
    public void Values_stay_within_the_proven_bound_and_use_most_of_it()
    {
        var noise = new GradientNoise(7);
        var rng = new Random(3);
        double max = 0;
        for (int i = 0; i < 200_000; i++)
        {
            double v = noise.Noise3(rng.NextDouble() * 256, rng.NextDouble() * 256, rng.NextDouble() * 256);
            Math.Abs(v).Should().BeLessThanOrEqualTo(GradientNoise.Bound);
            max = Math.Max(max, Math.Abs(v));
        }
        // Not a flat or tiny field: typical peaks of improved noise reach well past 0.7 (common practice).
        max.Should().BeGreaterThan(0.7);
    }

    [Fact]
    public void Two_dimensional_noise_is_bit_identical_to_the_z_zero_slice()
    {
        var noise = new GradientNoise(99);
        var rng = new Random(4);
        for (int i = 0; i < 10_000; i++)
        {
            double x = (rng.NextDouble() - 0.5) * 1000, y = (rng.NextDouble() - 0.5) * 1000;
            noise.Noise2(x, y).Should().Be(noise.Noise3(x, y, 0));
        }
    }

    [Fact]
    public void Fractal_noise_stays_within_the_bound_and_depends_on_the_seed()
    {
        var a = new FractalNoise(1, 5, 0.01);
        var b = new FractalNoise(2, 5, 0.01);
        var rng = new Random(8);
        int differing = 0;
        for (int i = 0; i < 20_000; i++)
        {
            double x = rng.NextDouble() * 5000, z = rng.NextDouble() * 5000;
            Math.Abs(a.Sample2(x, z)).Should().BeLessThanOrEqualTo(GradientNoise.Bound * (1 + 1e-12));
            if (a.Sample2(x, z) != b.Sample2(x, z))
                differing++;
        }
        differing.Should().BeGreaterThan(19_000);
    }
}
