using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Colour;

/// <summary>
/// Quantises a ramp designed in Oklab to 8-bit sRGB entries that keep the design's order of lightness, and also of
/// the two usual greyscale conversions, so that a ramp printed in grey still reads in order.
/// </summary>
internal static class RampTable
{
    /// <summary>
    /// Rounds <paramref name="target"/> to the 8-bit colour, among the 8 floor/ceil choices per channel, nearest in
    /// Oklab that lies strictly beyond <paramref name="previous"/> (lighter for <paramref name="direction"/> +1, darker
    /// for −1) in Oklab L, in relative luminance Y and in Rec. 709 luma Y′; plain rounding alone can make two
    /// neighbouring entries swap by a fraction of a code. When no choice passes all three, Oklab L alone decides.
    /// </summary>
    public static Rgba32 Quantise(Oklab target, Rgba32? previous = null, int direction = 1)
    {
        var (r, g, b) = target.ToLinearSrgb();
        double er = Srgb.Encode(Math.Clamp(r, 0, 1)) * 255, eg = Srgb.Encode(Math.Clamp(g, 0, 1)) * 255, eb = Srgb.Encode(Math.Clamp(b, 0, 1)) * 255;
        Rgba32? strict = null, loose = null;
        double strictDistance = double.MaxValue, looseDistance = double.MaxValue;
        for (int i = 0; i < 8; i++)
        {
            var c = new Rgba32(Pick(er, (i & 1) != 0), Pick(eg, (i & 2) != 0), Pick(eb, (i & 4) != 0), 255);
            Oklab o = Oklab.FromSrgb(c);
            double d = Sq(o.L - target.L) + Sq(o.A - target.A) + Sq(o.B - target.B);
            if (previous is { } p && direction * (o.L - Oklab.FromSrgb(p).L) <= 0)
                continue;
            if (d < looseDistance)
                (loose, looseDistance) = (c, d);
            bool greyOrder = previous is not { } q
                || (direction * (Greyscale.Luminance(c) - Greyscale.Luminance(q)) > 0 && direction * (Greyscale.Luma(c) - Greyscale.Luma(q)) > 0);
            if (greyOrder && d < strictDistance)
                (strict, strictDistance) = (c, d);
        }
        return strict ?? loose ?? target.ToRgba32();
    }

    private static byte Pick(double code, bool up) => (byte)Math.Clamp(up ? Math.Ceiling(code) : Math.Floor(code), 0, 255);

    private static double Sq(double v) => v * v;
}

/// <summary>The two usual ways of turning a colour into grey.</summary>
public static class Greyscale
{
    /// <summary>Relative luminance Y from linear sRGB (IEC 61966-2-1 / ITU-R BT.709 primaries): what a colour-managed conversion keeps.</summary>
    public static double Luminance(Rgba32 c) =>
        0.2126 * Srgb.FromByte(c.R) + 0.7152 * Srgb.FromByte(c.G) + 0.0722 * Srgb.FromByte(c.B);

    /// <summary>Rec. 709 luma Y′ from the encoded values, in 0..255: what most quick greyscale conversions compute.</summary>
    public static double Luma(Rgba32 c) => 0.2126 * c.R + 0.7152 * c.G + 0.0722 * c.B;
}
