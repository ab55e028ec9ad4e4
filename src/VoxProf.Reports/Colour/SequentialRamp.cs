using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Colour;

/// <summary>
/// VoxProf's cost ramp, designed in Oklab: lightness rises linearly from dark (no cost) to light (highest cost) so
/// the order survives greyscale printing and colour-vision deficiency; the hue turns from indigo through magenta and
/// orange to a pale yellow only to separate neighbouring levels further. Chroma is lowered where sRGB cannot show it,
/// which leaves lightness untouched.
/// </summary>
public static class SequentialRamp
{
    public const int Entries = 256;
    public const double LightnessLow = 0.22;
    public const double LightnessHigh = 0.96;

    private static readonly Rgba32[] Table = Build();

    /// <summary>The 8-bit colours from lowest to highest; their Oklab lightness strictly increases.</summary>
    public static ReadOnlySpan<Rgba32> Colours => Table;

    /// <summary>Colour of a position in [0, 1] along the ramp (clamped; NaN maps to 0).</summary>
    public static Rgba32 Map(double fraction) => Table[Index(fraction)];

    public static int Index(double fraction) =>
        double.IsNaN(fraction) ? 0 : (int)Math.Round(Math.Clamp(fraction, 0, 1) * (Entries - 1));

    /// <summary>The designed colour before 8-bit rounding (inside the sRGB gamut).</summary>
    public static Oklab Design(double t)
    {
        t = Math.Clamp(t, 0, 1);
        double l = LightnessLow + (LightnessHigh - LightnessLow) * t;
        double hue = 270 + 190 * t; // indigo (270°) → magenta → orange → yellow (100°, i.e. 460°)
        double chroma = 0.07 + 0.11 * Math.Sin(Math.PI * Math.Pow(t, 0.8));
        return Oklab.FromLch(l, chroma, hue).ClipChromaToSrgb();
    }

    private static Rgba32[] Build()
    {
        var table = new Rgba32[Entries];
        double previous = double.NegativeInfinity;
        for (int i = 0; i < Entries; i++)
        {
            table[i] = RampTable.Quantise(Design(i / (double)(Entries - 1)), previous);
            previous = Oklab.FromSrgb(table[i]).L;
        }
        return table;
    }
}
