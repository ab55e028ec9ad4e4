using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Images;

/// <summary>A tick under a legend bar: <paramref name="Position"/> in [0, 1] from the bar's left end.</summary>
public readonly record struct LegendTick(double Position, string Label);

/// <summary>
/// The legend band under a heatmap: a colour bar across the width, tick marks, and labels in the pixel font. Used by
/// the cost heatmaps (sequential ramp) and by compare's difference heatmaps (diverging ramp). Sizes are in font
/// pixels, so the band grows with the font.
/// </summary>
public static class Legend
{
    public const int Margin = 4;
    public const int BarTop = 3;
    public const int BarHeight = 6;
    public const int TickLength = 2;
    public const int LabelTop = BarTop + BarHeight + TickLength + 1;
    public const int BottomPadding = 3;

    /// <summary>Prefix of an end label whose value clips: every value beyond it takes the end colour.</summary>
    public const string AtLeast = "≥", AtMost = "≤";

    public static readonly Rgba32 Ink = new(235, 235, 235, 255);

    /// <summary>Height of the band in image pixels at font scale <paramref name="scale"/>.</summary>
    public static int Height(int scale) => (LabelTop + PixelFont.CapHeight + BottomPadding) * scale;

    /// <summary>Left and right end (inclusive) of the bar for an image of this width.</summary>
    public static (int Left, int Right) BarSpan(int imageWidth, int scale)
    {
        int margin = Margin * scale;
        return imageWidth > 4 * margin ? (margin, imageWidth - 1 - margin) : (0, Math.Max(0, imageWidth - 1));
    }

    /// <summary>The bar pixel column that shows <paramref name="position"/>.</summary>
    public static int BarX(int imageWidth, int scale, double position)
    {
        var (left, right) = BarSpan(imageWidth, scale);
        return left + (int)Math.Round(Math.Clamp(position, 0, 1) * (right - left));
    }

    /// <summary>Where a label's left edge goes: flush with the bar at either end, centred on its tick inside.</summary>
    public static int LabelX(int imageWidth, int scale, LegendTick tick)
    {
        var (left, right) = BarSpan(imageWidth, scale);
        int w = PixelFont.MeasureWidth(tick.Label, scale);
        int x = tick.Position <= 0 ? left : tick.Position >= 1 ? right + 1 - w : BarX(imageWidth, scale, tick.Position) - w / 2;
        return Math.Clamp(x, 0, Math.Max(0, imageWidth - w));
    }

    /// <summary>
    /// Fills rows [<paramref name="top"/>, top + <see cref="Height"/>) of <paramref name="image"/>.
    /// <paramref name="colourAt"/> gives the colour at a bar position in [0, 1]. The two end labels are drawn first
    /// and always, inside the image; a label inside that would touch a label already drawn is left out (its tick
    /// mark stays).
    /// </summary>
    public static void Draw(Image<Rgba32> image, int top, int scale, Func<double, Rgba32> colourAt, IReadOnlyList<LegendTick> ticks)
    {
        int width = image.Width;
        var (left, right) = BarSpan(width, scale);
        int barTop = top + BarTop * scale, barBottom = Math.Min(image.Height, barTop + BarHeight * scale);
        for (int x = left; x <= right; x++)
        {
            Rgba32 c = colourAt(right == left ? 0 : (x - left) / (double)(right - left));
            for (int y = barTop; y < barBottom; y++)
                image[x, y] = c;
        }

        var placed = new List<(int Left, int Right)>();
        foreach (LegendTick tick in ticks.OrderBy(t => t.Position is <= 0 or >= 1 ? 0 : 1))
        {
            int tx = BarX(width, scale, tick.Position);
            for (int y = barBottom; y < Math.Min(image.Height, barBottom + TickLength * scale); y++)
                for (int x = tx; x < Math.Min(width, tx + Math.Max(1, scale / 2)); x++)
                    image[x, y] = Ink;
            int lx = LabelX(width, scale, tick);
            int rx = lx + PixelFont.MeasureWidth(tick.Label, scale);
            int gap = 2 * PixelFont.Advance * scale;
            if (rx > width || placed.Any(p => lx < p.Right + gap && rx + gap > p.Left))
                continue;
            PixelFont.Draw(image, lx, top + LabelTop * scale, tick.Label, Ink, scale);
            placed.Add((lx, rx));
        }
    }

    /// <summary>How many labels of about <paramref name="labelChars"/> characters the bar has room for.</summary>
    public static int TickRoom(int imageWidth, int scale, int labelChars = 5) =>
        Math.Clamp(imageWidth / ((labelChars + 3) * PixelFont.Advance * scale), 2, 11);
}
