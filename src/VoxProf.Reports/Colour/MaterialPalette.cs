using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Core.Traversal;

namespace VoxProf.Reports.Colour;

/// <summary>
/// Colours of the preview: a fixed palette of twelve distinct hues for material ids 1–12 (docs/reports.md lists
/// them), repeated darker and then lighter for 13–24 and 25–36 and so on, shaded by the face the ray entered through;
/// and a sky near white, lighter than any lit material, so a miss never reads as a material. Every shaded colour is
/// computed once, into a table: colouring a pixel is a lookup.
/// </summary>
public static class MaterialPalette
{
    /// <summary>Oklab lightness, chroma and hue of materials 1–12.</summary>
    public static ReadOnlySpan<(double L, double C, double H)> Base => BaseList;

    /// <summary>Lightness added to the palette on its second, third… round (materials 13–24, 25–36, …).</summary>
    public static ReadOnlySpan<double> RoundLightness => RoundList;

    public static readonly Rgba32 Sky = Oklab.FromLch(0.95, 0.025, 235).ToRgba32();

    /// <summary>Face light in linear light: from above and slightly to one side, so a box's visible faces read apart.</summary>
    public static double FaceLight(HitFace face) => face switch
    {
        HitFace.PosY => 1.0,
        HitFace.NegY => 0.45,
        HitFace.PosX => 0.82,
        HitFace.NegX => 0.72,
        HitFace.PosZ => 0.64,
        HitFace.NegZ => 0.56,
        _ => 0.9, // the ray started inside the voxel
    };

    public const int Faces = 7;

    private static readonly (double L, double C, double H)[] BaseList =
    [
        (0.70, 0.13, 140), // 1 meadow green
        (0.58, 0.10, 265), // 2 slate blue
        (0.64, 0.13, 45),  // 3 terracotta
        (0.66, 0.10, 195), // 4 teal
        (0.80, 0.14, 95),  // 5 ochre
        (0.56, 0.13, 315), // 6 violet
        (0.58, 0.17, 15),  // 7 crimson
        (0.56, 0.09, 115), // 8 olive
        (0.48, 0.07, 60),  // 9 umber
        (0.76, 0.10, 350), // 10 rose
        (0.82, 0.09, 170), // 11 mint
        (0.45, 0.12, 285), // 12 indigo
    ];

    private static readonly double[] RoundList = [0, -0.12, 0.06];

    // [material * Faces + face]; the grey copy is the mismatch image's background.
    private static readonly Rgba32[] Shaded = Build(grey: false);
    private static readonly Rgba32[] GreyShaded = Build(grey: true);

    /// <summary>
    /// Dimming (in linear light) of the grey preview under mismatch markers, so that the marks are the only colour
    /// in the image and the brightest thing in it.
    /// </summary>
    public const double MismatchDim = 0.35;

    public static readonly Rgba32 GreySky = Grey(Sky);

    /// <summary>The lit (+y) colour of a material: what the preview's legend shows.</summary>
    public static Rgba32 Material(byte material) => Shaded[material * Faces + (int)HitFace.PosY];

    public static Rgba32 Shade(byte material, HitFace face) => Shaded[material * Faces + Math.Min((int)face, Faces - 1)];

    /// <summary>The shaded colour as a dimmed grey of the same luminance: the mismatch image's background.</summary>
    public static Rgba32 ShadeGrey(byte material, HitFace face) => GreyShaded[material * Faces + Math.Min((int)face, Faces - 1)];

    /// <summary>The unshaded design colour of a material id (0, which no hit carries, is a neutral grey).</summary>
    public static Oklab Design(byte material)
    {
        if (material == 0)
            return new Oklab(0.6, 0, 0);
        int i = material - 1;
        var (l, c, h) = BaseList[i % BaseList.Length];
        double round = RoundList[i / BaseList.Length % RoundList.Length];
        return Oklab.FromLch(l + round, c, h).ClipChromaToSrgb();
    }

    private static Rgba32[] Build(bool grey)
    {
        var table = new Rgba32[256 * Faces];
        for (int m = 0; m < 256; m++)
        {
            var (r, g, b) = Design((byte)m).ToLinearSrgb();
            for (int f = 0; f < Faces; f++)
            {
                // Shade in linear light so a darker face keeps the hue, as scaling encoded values would not.
                double k = FaceLight((HitFace)f);
                var lit = new Rgba32(Srgb.ToByte(r * k), Srgb.ToByte(g * k), Srgb.ToByte(b * k), 255);
                table[m * Faces + f] = grey ? Grey(lit) : lit;
            }
        }
        return table;
    }

    /// <summary>Relative luminance (ITU-R BT.709 weights on linear sRGB), dimmed, as an sRGB grey.</summary>
    private static Rgba32 Grey(Rgba32 c)
    {
        double y = 0.2126 * Srgb.FromByte(c.R) + 0.7152 * Srgb.FromByte(c.G) + 0.0722 * Srgb.FromByte(c.B);
        byte v = Srgb.ToByte(y * MismatchDim);
        return new Rgba32(v, v, v, 255);
    }
}
