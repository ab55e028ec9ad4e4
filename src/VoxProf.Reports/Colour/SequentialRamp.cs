using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Colour;

/// <summary>
/// VoxProf's cost ramp, designed in Oklab. Lightness rises linearly from dark (no cost) to light (highest cost), so
/// the order survives greyscale printing and colour-vision deficiency; the hue path is our own, from fired clay to
/// ice: oxblood, brick, amber, olive gold, sage, pale aqua (the anchors below). It turns one way round the hue circle,
/// through the warm half first, so that the cheap bulk of an image reads warm and dark and the costliest pixels pale
/// and cool, with the colours in between set apart by hue as well as lightness. Chroma is lowered where sRGB cannot
/// show it, which leaves lightness untouched.
/// </summary>
public static class SequentialRamp
{
    public const int Entries = 256;
    public const double LightnessLow = 0.22;
    public const double LightnessHigh = 0.96;

    /// <summary>Chroma and hue at t = 0, 0.2, 0.4, 0.6, 0.8, 1 (docs/reports.md lists them with their names).</summary>
    public static ReadOnlySpan<HueAnchor> Anchors => AnchorList;

    // Declared before Table: static initialisers run in text order and Build reads the anchors.
    private static readonly HueAnchor[] AnchorList =
    [
        new(0.07, 5),    // oxblood
        new(0.11, 35),   // brick
        new(0.15, 65),   // amber
        new(0.12, 105),  // olive gold
        new(0.08, 150),  // sage
        new(0.05, 200),  // pale aqua
    ];

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
        var (chroma, hue) = HuePath.At(Anchors, t);
        return Oklab.FromLch(l, chroma, hue).ClipChromaToSrgb();
    }

    private static Rgba32[] Build()
    {
        var table = new Rgba32[Entries];
        for (int i = 0; i < Entries; i++)
            table[i] = RampTable.Quantise(Design(i / (double)(Entries - 1)), i == 0 ? null : table[i - 1]);
        return table;
    }
}
