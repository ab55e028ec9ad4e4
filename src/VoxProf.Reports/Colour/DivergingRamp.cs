using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Colour;

/// <summary>
/// VoxProf's signed ramp for differences, designed in Oklab: near-white at zero, darkening symmetrically with the
/// size of the difference, blue for negative and orange for positive (a pair that stays apart for the common
/// colour-vision deficiencies). Equal distances either side of zero have equal Oklab lightness, so neither sign looks
/// more important than the other.
/// </summary>
public static class DivergingRamp
{
    public const double LightnessAtZero = 0.97;
    public const double LightnessAtEnds = 0.45;
    public const double NegativeHue = 250;
    public const double PositiveHue = 55;

    /// <summary>Odd, so that index Entries / 2 is exactly zero.</summary>
    public const int Entries = 511;

    private static readonly Rgba32[] Table = Build();

    /// <summary>Colour of a signed position in [-1, 1] (clamped; NaN maps to zero).</summary>
    public static Rgba32 Map(double signedFraction) => Table[Index(signedFraction)];

    public static int Index(double signedFraction)
    {
        double f = double.IsNaN(signedFraction) ? 0 : Math.Clamp(signedFraction, -1, 1);
        return (Entries / 2) + (int)Math.Round(f * (Entries / 2), MidpointRounding.AwayFromZero);
    }

    /// <summary>Colour at a position along a legend bar, 0 at the left (−1) and 1 at the right (+1).</summary>
    public static Rgba32 MapBar(double barFraction) => Map(2 * barFraction - 1);

    /// <summary>The designed colour before 8-bit rounding (inside the sRGB gamut).</summary>
    public static Oklab Design(double signedFraction)
    {
        double d = Math.Clamp(Math.Abs(signedFraction), 0, 1);
        double l = LightnessAtZero - (LightnessAtZero - LightnessAtEnds) * d;
        double chroma = 0.15 * Math.Pow(d, 0.7);
        double hue = signedFraction < 0 ? NegativeHue : PositiveHue;
        return Oklab.FromLch(l, chroma, hue).ClipChromaToSrgb();
    }

    private static Rgba32[] Build()
    {
        var table = new Rgba32[Entries];
        int mid = Entries / 2;
        for (int i = 0; i < Entries; i++)
        {
            double f = (i - mid) / (double)mid;
            table[i] = RampTable.Quantise(Design(f), double.NegativeInfinity);
        }
        return table;
    }
}
