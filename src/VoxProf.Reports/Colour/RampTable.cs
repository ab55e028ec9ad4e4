using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Colour;

/// <summary>Quantises a ramp designed in Oklab to 8-bit sRGB entries whose lightness follows the design's order.</summary>
internal static class RampTable
{
    /// <summary>
    /// Rounds <paramref name="target"/> to the 8-bit colour (among the 8 floor/ceil choices per channel) nearest in
    /// Oklab whose lightness is strictly above <paramref name="floorL"/>; plain rounding alone can make two neighbouring
    /// entries swap lightness by a fraction of a code.
    /// </summary>
    public static Rgba32 Quantise(Oklab target, double floorL)
    {
        var (r, g, b) = target.ToLinearSrgb();
        double er = Srgb.Encode(Math.Clamp(r, 0, 1)) * 255, eg = Srgb.Encode(Math.Clamp(g, 0, 1)) * 255, eb = Srgb.Encode(Math.Clamp(b, 0, 1)) * 255;
        Rgba32 best = target.ToRgba32();
        double bestDistance = double.MaxValue;
        for (int i = 0; i < 8; i++)
        {
            var c = new Rgba32(Pick(er, (i & 1) != 0), Pick(eg, (i & 2) != 0), Pick(eb, (i & 4) != 0), 255);
            Oklab o = Oklab.FromSrgb(c);
            if (o.L <= floorL)
                continue;
            double d = Sq(o.L - target.L) + Sq(o.A - target.A) + Sq(o.B - target.B);
            if (d < bestDistance)
            {
                bestDistance = d;
                best = c;
            }
        }
        return best;
    }

    private static byte Pick(double code, bool up) => (byte)Math.Clamp(up ? Math.Ceiling(code) : Math.Floor(code), 0, 255);

    private static double Sq(double v) => v * v;
}
