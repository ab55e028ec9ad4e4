using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Images;

/// <summary>A colour and what it means, for a <see cref="SwatchLegend"/>; no colour for a plain note.</summary>
public readonly record struct Swatch(Rgba32? Colour, string Label);

/// <summary>
/// A legend band of colour squares with labels, in rows that wrap at the image width: the preview's materials and
/// sky, the mismatch image's marks. Items that do not fit in <see cref="MaxRows"/> rows are summed up as "+N more".
/// </summary>
public static class SwatchLegend
{
    public const int MaxRows = 3;
    public const int Padding = 3;
    public static readonly Rgba32 Outline = new(120, 120, 128, 255);

    public static int Height(int width, int scale, IReadOnlyList<Swatch> items) =>
        (2 * Padding + Rows(width, scale, items).Count * PixelFont.LineHeight - (PixelFont.LineHeight - PixelFont.CapHeight)) * scale;

    public static void Draw(Image<Rgba32> image, int top, int scale, IReadOnlyList<Swatch> items)
    {
        var rows = Rows(image.Width, scale, items);
        for (int r = 0; r < rows.Count; r++)
        {
            int y = top + (Padding + r * PixelFont.LineHeight) * scale;
            foreach (var (x, item) in rows[r])
            {
                if (item.Colour is not { } colour)
                {
                    PixelFont.Draw(image, x, y, item.Label, Legend.Ink, scale);
                    continue;
                }
                int size = PixelFont.CapHeight * scale;
                for (int sy = 0; sy < size; sy++)
                {
                    for (int sx = 0; sx < size; sx++)
                    {
                        bool edge = sy == 0 || sx == 0 || sy == size - 1 || sx == size - 1;
                        if (x + sx < image.Width && y + sy < image.Height)
                            image[x + sx, y + sy] = edge ? Outline : colour;
                    }
                }
                PixelFont.Draw(image, x + size + 2 * scale, y, item.Label, Legend.Ink, scale);
            }
        }
    }

    /// <summary>Each row's items with their left edges.</summary>
    private static List<List<(int X, Swatch Item)>> Rows(int width, int scale, IReadOnlyList<Swatch> items)
    {
        int left = TitleBand.TextLeft(scale), gap = 2 * PixelFont.Advance * scale;
        var rows = new List<List<(int X, Swatch Item)>> { new() };
        int x = left;
        for (int i = 0; i < items.Count; i++)
        {
            int w = ItemWidth(items[i], scale);
            if (x > left && x + w > width - left)
            {
                if (rows.Count == MaxRows)
                {
                    Overflow(rows[^1], items.Count - i, width, scale);
                    break;
                }
                rows.Add([]);
                x = left;
            }
            rows[^1].Add((x, items[i]));
            x += w + gap;
        }
        return rows;
    }

    /// <summary>Ends a full last row with "+N more", dropping items from its end until that fits.</summary>
    private static void Overflow(List<(int X, Swatch Item)> row, int left, int width, int scale)
    {
        while (true)
        {
            var more = new Swatch(null, $"+{left} more");
            int x = row.Count == 0 ? TitleBand.TextLeft(scale) : row[^1].X + ItemWidth(row[^1].Item, scale) + 2 * PixelFont.Advance * scale;
            if (row.Count == 0 || x + PixelFont.MeasureWidth(more.Label, scale) <= width)
            {
                row.Add((x, more));
                return;
            }
            row.RemoveAt(row.Count - 1);
            left++;
        }
    }

    private static int ItemWidth(Swatch item, int scale) =>
        (item.Colour is null ? 0 : (PixelFont.CapHeight + 2) * scale) + PixelFont.MeasureWidth(item.Label, scale);
}
