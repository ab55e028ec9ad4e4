using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Colour;

namespace VoxProf.Reports.Images;

/// <summary>
/// The scene as the camera sees it (material colours of <see cref="MaterialPalette"/> shaded by entry face, misses
/// in the sky colour), with a title band and a legend of the materials in view; and the mismatch image built on it.
/// </summary>
public static class PreviewImage
{
    public static readonly Rgba32 Sky = MaterialPalette.Sky;
    public static readonly Rgba32 Marker = new(255, 0, 220, 255);
    public static readonly Rgba32 Halo = new(255, 255, 255, 255);
    public const int HaloRadius = 2;

    /// <summary>Up to this many differing pixels each also get a ring around them, to be found at a glance.</summary>
    public const int LocatorLimit = 64;

    /// <summary>Radius of a locator ring, in font pixels (so it grows with the image like the text).</summary>
    public const int LocatorRadius = 8;

    public static Image<Rgba32> Render(ReadOnlySpan<PixelHit> hits, int width, int height, ImageTitle title)
    {
        CheckSize(hits.Length, width, height);
        var swatches = MaterialSwatches(hits);
        var (image, layout) = ImageLayout.Create(width, height, title, (w, s) => SwatchLegend.Height(w, s, swatches));
        for (int y = 0; y < height; y++)
        {
            Span<Rgba32> row = layout.DataRow(image, y);
            ReadOnlySpan<PixelHit> source = hits.Slice(y * width, width);
            for (int x = 0; x < row.Length; x++)
                row[x] = Shade(source[x]);
        }
        SwatchLegend.Draw(image, layout.LegendTop, layout.FontScale, swatches);
        return image;
    }

    /// <summary>
    /// The preview of <paramref name="reference"/>, dimmed, with every pixel whose hit differs in
    /// <paramref name="hits"/> in <see cref="Marker"/>, ringed by <see cref="Halo"/> out to <see cref="HaloRadius"/>
    /// pixels so that a lone differing pixel is still found at full image size. The heading gets how many pixels differ
    /// and from which strategy.
    /// </summary>
    public static Image<Rgba32> RenderMismatch(ReadOnlySpan<PixelHit> hits, ReadOnlySpan<PixelHit> reference, int width, int height, string referenceName, ImageTitle title)
    {
        CheckSize(hits.Length, width, height);
        CheckSize(reference.Length, width, height);
        var differs = new bool[width * height];
        int count = 0;
        for (int i = 0; i < differs.Length; i++)
        {
            differs[i] = !hits[i].SameVoxel(reference[i]);
            count += differs[i] ? 1 : 0;
        }
        string what = $"{count} {(count == 1 ? "pixel hits" : "pixels hit")} differently from {referenceName}";
        title = title with { Heading = [.. title.Heading, what] };
        Swatch[] swatches = [new(Marker, $"hit differs from {referenceName}"), new(null, $"elsewhere: {referenceName}'s preview in grey")];
        var (image, layout) = ImageLayout.Create(width, height, title, (w, s) => SwatchLegend.Height(w, s, swatches));
        for (int y = 0; y < height; y++)
        {
            Span<Rgba32> row = layout.DataRow(image, y);
            ReadOnlySpan<PixelHit> source = reference.Slice(y * width, width);
            for (int x = 0; x < row.Length; x++)
                row[x] = source[x].Hit ? MaterialPalette.ShadeGrey(source[x].Material, source[x].Face) : MaterialPalette.GreySky;
        }
        if (count <= LocatorLimit)
        {
            for (int i = 0; i < differs.Length; i++)
            {
                if (differs[i])
                    DrawRing(image, layout, i % width, i / width, LocatorRadius * layout.FontScale, layout.FontScale / 2 + 1);
            }
        }
        for (int y = 0; y < height; y++)
        {
            for (int x = 0; x < width; x++)
            {
                if (!differs[y * width + x])
                    continue;
                for (int hy = Math.Max(0, y - HaloRadius); hy <= Math.Min(height - 1, y + HaloRadius); hy++)
                    for (int hx = Math.Max(0, x - HaloRadius); hx <= Math.Min(width - 1, x + HaloRadius); hx++)
                        image[hx, layout.DataTop + hy] = differs[hy * width + hx] ? Marker : Halo;
            }
        }
        SwatchLegend.Draw(image, layout.LegendTop, layout.FontScale, swatches);
        return image;
    }

    /// <summary>A circle outline of the marker colour round picture pixel (cx, cy), clipped to the picture.</summary>
    private static void DrawRing(Image<Rgba32> image, ImageLayout layout, int cx, int cy, int radius, int thickness)
    {
        int outer = radius * radius, inner = (radius - thickness) * (radius - thickness);
        for (int y = Math.Max(0, cy - radius); y <= Math.Min(layout.DataHeight - 1, cy + radius); y++)
        {
            for (int x = Math.Max(0, cx - radius); x <= Math.Min(layout.DataWidth - 1, cx + radius); x++)
            {
                int d = (x - cx) * (x - cx) + (y - cy) * (y - cy);
                if (d <= outer && d > inner)
                    image[x, layout.DataTop + y] = Marker;
            }
        }
    }

    public static Rgba32 Shade(in PixelHit hit) => hit.Hit ? MaterialPalette.Shade(hit.Material, hit.Face) : Sky;

    /// <summary>A swatch per material in view, in id order, then the sky if any ray missed.</summary>
    public static IReadOnlyList<Swatch> MaterialSwatches(ReadOnlySpan<PixelHit> hits)
    {
        Span<bool> seen = stackalloc bool[256];
        bool miss = false;
        foreach (ref readonly PixelHit h in hits)
        {
            if (h.Hit)
                seen[h.Material] = true;
            else
                miss = true;
        }
        var swatches = new List<Swatch> { new(null, "material") };
        for (int m = 0; m < seen.Length; m++)
        {
            if (seen[m])
                swatches.Add(new Swatch(MaterialPalette.Material((byte)m), m.ToString(System.Globalization.CultureInfo.InvariantCulture)));
        }
        if (miss)
            swatches.Add(new Swatch(Sky, "sky: no hit"));
        return swatches;
    }

    private static void CheckSize(int length, int width, int height)
    {
        if (length != width * height)
            throw new ArgumentException($"expected {width}x{height} = {width * height} pixels, got {length}");
    }
}
