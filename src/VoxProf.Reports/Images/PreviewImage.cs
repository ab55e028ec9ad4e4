using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Colour;

namespace VoxProf.Reports.Images;

/// <summary>The scene as the camera sees it: material colour shaded by entry face, misses in a sky colour.</summary>
public static class PreviewImage
{
    public static readonly Rgba32 Sky = Oklab.FromLch(0.86, 0.04, 235).ClipChromaToSrgb().ToRgba32();
    public static readonly Rgba32 Marker = new(255, 0, 220, 255);
    public static readonly Rgba32 Halo = new(255, 255, 255, 255);
    public const int HaloRadius = 2;

    /// <summary>Dimming of the preview under mismatch markers, so the marked pixels stand out.</summary>
    public const double MismatchDim = 0.35;

    public static Image<Rgba32> Render(ReadOnlySpan<PixelHit> hits, int width, int height)
    {
        var image = new Image<Rgba32>(width, height);
        for (int y = 0; y < height; y++)
            for (int x = 0; x < width; x++)
                image[x, y] = Shade(hits[y * width + x]);
        return image;
    }

    /// <summary>
    /// Dimmed preview of <paramref name="reference"/> with every pixel whose hit differs in <paramref name="hits"/> in
    /// <see cref="Marker"/>, ringed by <see cref="Halo"/> out to <see cref="HaloRadius"/> pixels so that a lone
    /// differing pixel is still found at full image size.
    /// </summary>
    public static Image<Rgba32> RenderMismatch(ReadOnlySpan<PixelHit> hits, ReadOnlySpan<PixelHit> reference, int width, int height)
    {
        var image = new Image<Rgba32>(width, height);
        var differs = new bool[width * height];
        for (int i = 0; i < differs.Length; i++)
            differs[i] = !hits[i].SameVoxel(reference[i]);
        for (int y = 0; y < height; y++)
            for (int x = 0; x < width; x++)
                image[x, y] = Dim(Shade(reference[y * width + x]));
        for (int y = 0; y < height; y++)
        {
            for (int x = 0; x < width; x++)
            {
                if (!differs[y * width + x])
                    continue;
                for (int hy = Math.Max(0, y - HaloRadius); hy <= Math.Min(height - 1, y + HaloRadius); hy++)
                    for (int hx = Math.Max(0, x - HaloRadius); hx <= Math.Min(width - 1, x + HaloRadius); hx++)
                        image[hx, hy] = differs[hy * width + hx] ? Marker : Halo;
            }
        }
        return image;
    }

    public static Rgba32 Shade(in PixelHit hit)
    {
        if (!hit.Hit)
            return Sky;
        return Scale(MaterialColour(hit.Material), FaceLight(hit.Face));
    }

    /// <summary>Distinct hues by the golden angle at one lightness, so no material outshines another.</summary>
    public static Rgba32 MaterialColour(byte material) =>
        Oklab.FromLch(0.74, 0.11, material * 137.508).ClipChromaToSrgb().ToRgba32();

    /// <summary>Light from above and slightly to one side, so the three visible faces of a box read apart.</summary>
    public static double FaceLight(HitFace face) => face switch
    {
        HitFace.PosY => 1.0,
        HitFace.NegY => 0.45,
        HitFace.PosX => 0.82,
        HitFace.NegX => 0.72,
        HitFace.PosZ => 0.64,
        HitFace.NegZ => 0.56,
        _ => 0.9,
    };

    private static Rgba32 Dim(Rgba32 c) => Scale(c, MismatchDim);

    private static Rgba32 Scale(Rgba32 c, double k)
    {
        // Scale in linear light so shading does not shift hue the way scaling encoded values would.
        return new Rgba32(
            Srgb.ToByte(Srgb.FromByte(c.R) * k),
            Srgb.ToByte(Srgb.FromByte(c.G) * k),
            Srgb.ToByte(Srgb.FromByte(c.B) * k),
            255);
    }
}
