using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Colour;

/// <summary>
/// VoxProf's signed ramp for differences, designed in Oklab: a neutral near-white at zero, darkening symmetrically
/// with the size of the difference. Each side turns in hue as it darkens: negative (less work) from pale sky blue to deep
/// blue, positive (more work) from gold to rust. The first steps away from zero are told apart by hue (sky blue against
/// gold, which stay apart for the common colour-vision deficiencies), the far ends by depth as well. Equal distances
/// either side of zero have equal Oklab lightness, so neither sign looks more important than the other.
/// </summary>
public static class DivergingRamp
{
    public const double LightnessAtZero = 0.97;
    public const double LightnessAtEnds = 0.42;
    public const double ChromaAtEnds = 0.15;

    /// <summary>Hue just below zero and at −1.</summary>
    public const double NegativeHueNearZero = 220, NegativeHueAtEnd = 265;

    /// <summary>Hue just above zero and at +1.</summary>
    public const double PositiveHueNearZero = 90, PositiveHueAtEnd = 35;

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

    /// <summary>The 8-bit colours from −1 to +1; entry Entries / 2 is zero.</summary>
    public static ReadOnlySpan<Rgba32> Colours => Table;

    /// <summary>Colour at a position along a legend bar, 0 at the left (−1) and 1 at the right (+1).</summary>
    public static Rgba32 MapBar(double barFraction) => Map(2 * barFraction - 1);

    /// <summary>The designed colour before 8-bit rounding (inside the sRGB gamut).</summary>
    public static Oklab Design(double signedFraction)
    {
        double d = Math.Clamp(Math.Abs(signedFraction), 0, 1);
        double l = LightnessAtZero - (LightnessAtZero - LightnessAtEnds) * d;
        // Chroma grows faster than lightness falls near zero, so small differences already show their sign.
        double chroma = ChromaAtEnds * Math.Pow(d, 0.7);
        double hue = signedFraction < 0
            ? NegativeHueNearZero + (NegativeHueAtEnd - NegativeHueNearZero) * d
            : PositiveHueNearZero + (PositiveHueAtEnd - PositiveHueNearZero) * d;
        return Oklab.FromLch(l, chroma, hue).ClipChromaToSrgb();
    }

    private static Rgba32[] Build()
    {
        // Outward from zero, each entry strictly darker than the one nearer zero: monotone after 8-bit rounding.
        var table = new Rgba32[Entries];
        int mid = Entries / 2;
        table[mid] = RampTable.Quantise(Design(0));
        foreach (int side in (ReadOnlySpan<int>)[-1, 1])
        {
            for (int k = 1; k <= mid; k++)
                table[mid + side * k] = RampTable.Quantise(Design(side * k / (double)mid), table[mid + side * (k - 1)], direction: -1);
        }
        return table;
    }
}
