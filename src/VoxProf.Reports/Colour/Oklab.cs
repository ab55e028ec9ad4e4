using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Colour;

/// <summary>
/// A colour in Oklab (Ottosson 2020): L is perceived lightness (0 black, 1 white), a and b the green–red and
/// blue–yellow axes. Matrices as published by Ottosson.
/// </summary>
public readonly record struct Oklab(double L, double A, double B)
{
    /// <summary>Chroma: distance from the grey axis.</summary>
    public double C => Math.Sqrt(A * A + B * B);

    /// <summary>Builds a colour from lightness, chroma and hue angle in degrees.</summary>
    public static Oklab FromLch(double l, double c, double hueDegrees)
    {
        double h = hueDegrees * Math.PI / 180;
        return new Oklab(l, c * Math.Cos(h), c * Math.Sin(h));
    }

    /// <summary>From CIE XYZ (D65, Y = 1 for white) through Ottosson's M1 and M2.</summary>
    public static Oklab FromXyz(double x, double y, double z)
    {
        double l = 0.8189330101 * x + 0.3618667424 * y - 0.1288597137 * z;
        double m = 0.0329845436 * x + 0.9293118715 * y + 0.0361456387 * z;
        double s = 0.0482003018 * x + 0.2643662691 * y + 0.6338517070 * z;
        return FromLms(l, m, s);
    }

    /// <summary>From linear-light sRGB through Ottosson's combined matrix.</summary>
    public static Oklab FromLinearSrgb(double r, double g, double b)
    {
        double l = 0.4122214708 * r + 0.5363325363 * g + 0.0514459929 * b;
        double m = 0.2119034982 * r + 0.6806995451 * g + 0.1073969566 * b;
        double s = 0.0883024619 * r + 0.2817188376 * g + 0.6299787005 * b;
        return FromLms(l, m, s);
    }

    public static Oklab FromSrgb(Rgba32 c) => FromLinearSrgb(Srgb.FromByte(c.R), Srgb.FromByte(c.G), Srgb.FromByte(c.B));

    /// <summary>To linear-light sRGB; components outside [0, 1] mean the colour is out of the sRGB gamut.</summary>
    public (double R, double G, double B) ToLinearSrgb()
    {
        double l = Cube(L + 0.3963377774 * A + 0.2158037573 * B);
        double m = Cube(L - 0.1055613458 * A - 0.0638541728 * B);
        double s = Cube(L - 0.0894841775 * A - 1.2914855480 * B);
        return (
            4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s,
            -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s,
            -0.0041960863 * l - 0.7034186147 * m + 1.7076147010 * s);
    }

    public bool InSrgbGamut(double tolerance = 1e-9)
    {
        var (r, g, b) = ToLinearSrgb();
        return r >= -tolerance && r <= 1 + tolerance && g >= -tolerance && g <= 1 + tolerance && b >= -tolerance && b <= 1 + tolerance;
    }

    /// <summary>Keeps lightness and hue and lowers chroma until the colour fits in sRGB (bisection).</summary>
    public Oklab ClipChromaToSrgb()
    {
        if (InSrgbGamut())
            return this;
        double c = C;
        double ua = c == 0 ? 0 : A / c;
        double ub = c == 0 ? 0 : B / c;
        double lo = 0, hi = c;
        for (int i = 0; i < 40; i++)
        {
            double mid = 0.5 * (lo + hi);
            if (new Oklab(L, ua * mid, ub * mid).InSrgbGamut())
                lo = mid;
            else
                hi = mid;
        }
        return new Oklab(L, ua * lo, ub * lo);
    }

    /// <summary>Rounds to 8-bit sRGB (opaque).</summary>
    public Rgba32 ToRgba32()
    {
        var (r, g, b) = ToLinearSrgb();
        return new Rgba32(Srgb.ToByte(r), Srgb.ToByte(g), Srgb.ToByte(b), 255);
    }

    private static Oklab FromLms(double l, double m, double s)
    {
        double l_ = Math.Cbrt(l), m_ = Math.Cbrt(m), s_ = Math.Cbrt(s);
        return new Oklab(
            0.2104542553 * l_ + 0.7936177850 * m_ - 0.0040720468 * s_,
            1.9779984951 * l_ - 2.4285922050 * m_ + 0.4505937099 * s_,
            0.0259040371 * l_ + 0.7827717662 * m_ - 0.8086757660 * s_);
    }

    private static double Cube(double v) => v * v * v;
}
