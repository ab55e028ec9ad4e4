using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Reports.Colour;

namespace VoxProf.Tests.Reports;

public class ColourTests
{
    // Ottosson (2020), "A perceptual color space for image processing", table of XYZ → Oklab values (3 decimals).
    [Theory]
    [InlineData(0.950, 1.000, 1.089, 1.000, 0.000, 0.000)]
    [InlineData(1.000, 0.000, 0.000, 0.450, 1.236, -0.019)]
    [InlineData(0.000, 1.000, 0.000, 0.922, -0.671, 0.263)]
    [InlineData(0.000, 0.000, 1.000, 0.153, -1.415, -0.449)]
    public void Oklab_from_XYZ_matches_the_published_table(double x, double y, double z, double l, double a, double b)
    {
        Oklab o = Oklab.FromXyz(x, y, z);
        o.L.Should().BeApproximately(l, 1e-3);
        o.A.Should().BeApproximately(a, 1e-3);
        o.B.Should().BeApproximately(b, 1e-3);
    }

    // Ottosson (2020): sRGB white is Oklab (1, 0, 0), and the linear sRGB path is the inverse of the published inverse.
    [Fact]
    public void Linear_sRGB_to_Oklab_gives_white_at_one_and_round_trips()
    {
        Oklab white = Oklab.FromLinearSrgb(1, 1, 1);
        white.L.Should().BeApproximately(1, 1e-4);
        white.C.Should().BeLessThan(1e-4);
        var rng = new Random(5);
        for (int i = 0; i < 200; i++)
        {
            double r = rng.NextDouble(), g = rng.NextDouble(), b = rng.NextDouble();
            var back = Oklab.FromLinearSrgb(r, g, b).ToLinearSrgb();
            back.R.Should().BeApproximately(r, 1e-6);
            back.G.Should().BeApproximately(g, 1e-6);
            back.B.Should().BeApproximately(b, 1e-6);
        }
    }

    // IEC 61966-2-1 transfer function: linear 0.5 encodes to 0.735357 (1.055 × 0.5^(1/2.4) − 0.055).
    [Fact]
    public void sRGB_encoding_of_one_half_matches_IEC_61966_2_1()
    {
        Srgb.Encode(0.5).Should().BeApproximately(0.735357, 1e-6);
        Srgb.Encode(0.002).Should().BeApproximately(0.02584, 1e-9); // linear segment, slope 12.92
    }

    // IEC 61966-2-1: decoding and re-encoding every 8-bit code returns the same code.
    [Fact]
    public void Every_8_bit_sRGB_code_round_trips()
    {
        for (int code = 0; code < 256; code++)
            Srgb.ToByte(Srgb.FromByte((byte)code)).Should().Be((byte)code);
    }

    [Fact]
    public void Sequential_ramp_lightness_strictly_increases_after_8_bit_rounding()
    {
        ReadOnlySpan<Rgba32> colours = SequentialRamp.Colours;
        double previous = double.NegativeInfinity;
        for (int i = 0; i < colours.Length; i++)
        {
            double l = Oklab.FromSrgb(colours[i]).L;
            l.Should().BeGreaterThan(previous, $"entry {i} must be lighter than entry {i - 1}");
            previous = l;
        }
        Oklab.FromSrgb(SequentialRamp.Map(0)).L.Should().BeApproximately(SequentialRamp.LightnessLow, 0.01);
        Oklab.FromSrgb(SequentialRamp.Map(1)).L.Should().BeApproximately(SequentialRamp.LightnessHigh, 0.01);
    }
}
