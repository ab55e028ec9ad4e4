using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Images;

/// <summary>A tick under a legend bar: <paramref name="Position"/> in [0, 1] from the bar's left end.</summary>
public readonly record struct LegendTick(double Position, string Label);

/// <summary>
/// Draws the legend band under a heatmap: a colour bar across the width, tick marks, and labels in the pixel font.
/// Used by the cost heatmaps (sequential ramp) and by compare's difference heatmaps (diverging ramp).
/// </summary>
public static class Legend
{
    public const int FontScale = 2;
    public const int Margin = 8;
    public const int BarTop = 6;
    public const int BarHeight = 12;
    public const int TickLength = 3;
    public const int LabelTop = BarTop + BarHeight + TickLength + 2;

    /// <summary>Height of the band in pixels.</summary>
    public const int Height = LabelTop + PixelFont.GlyphHeight * FontScale + 6;

    public static readonly Rgba32 Background = new(24, 24, 28, 255);
    public static readonly Rgba32 Ink = new(235, 235, 235, 255);

    /// <summary>Left and right end (inclusive) of the bar for an image of this width.</summary>
    public static (int Left, int Right) BarSpan(int imageWidth)
    {
        int margin = imageWidth > 4 * Margin ? Margin : 0;
        return (margin, Math.Max(margin, imageWidth - 1 - margin));
    }

    /// <summary>The bar pixel column that shows <paramref name="position"/>.</summary>
    public static int BarX(int imageWidth, double position)
    {
        var (left, right) = BarSpan(imageWidth);
        return left + (int)Math.Round(Math.Clamp(position, 0, 1) * (right - left));
    }

    /// <summary>
    /// Fills rows [<paramref name="top"/>, top + <see cref="Height"/>) of <paramref name="image"/>.
    /// <paramref name="colourAt"/> gives the colour at a bar position in [0, 1]. Labels that would overlap the one
    /// before, or leave the image, are left out; tick marks are always drawn.
    /// </summary>
    public static void Draw(Image<Rgba32> image, int top, Func<double, Rgba32> colourAt, IReadOnlyList<LegendTick> ticks)
    {
        int width = image.Width;
        for (int y = top; y < Math.Min(image.Height, top + Height); y++)
            for (int x = 0; x < width; x++)
                image[x, y] = Background;

        var (left, right) = BarSpan(width);
        for (int x = left; x <= right; x++)
        {
            double position = right == left ? 0 : (x - left) / (double)(right - left);
            Rgba32 c = colourAt(position);
            for (int y = top + BarTop; y < top + BarTop + BarHeight && y < image.Height; y++)
                image[x, y] = c;
        }

        int lastLabelEnd = int.MinValue;
        foreach (LegendTick tick in ticks)
        {
            int tx = BarX(width, tick.Position);
            for (int y = top + BarTop + BarHeight; y < top + BarTop + BarHeight + TickLength && y < image.Height; y++)
                image[tx, y] = Ink;
            int w = PixelFont.MeasureWidth(tick.Label, FontScale);
            int lx = Math.Clamp(tx - w / 2, 0, Math.Max(0, width - w));
            if (lx <= lastLabelEnd + FontScale * 2 || lx + w > width)
                continue;
            PixelFont.Draw(image, lx, top + LabelTop, tick.Label, Ink, FontScale);
            lastLabelEnd = lx + w;
        }
    }
}
