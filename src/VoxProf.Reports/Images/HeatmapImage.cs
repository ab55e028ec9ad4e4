using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Reports.Colour;

namespace VoxProf.Reports.Images;

/// <summary>A cost image coloured with <see cref="SequentialRamp"/>, with the legend band underneath.</summary>
public static class HeatmapImage
{
    public const int MaxLegendTicks = 6;

    /// <summary>
    /// Renders <paramref name="values"/> (row-major, row 0 at the top) as a <paramref name="width"/> ×
    /// (<paramref name="height"/> + <see cref="Legend.Height"/>) image.
    /// </summary>
    public static Image<Rgba32> Render(ReadOnlySpan<uint> values, int width, int height, HeatmapScale scale)
    {
        if (values.Length != width * height)
            throw new ArgumentException("value image size does not match width × height", nameof(values));
        var image = new Image<Rgba32>(width, height + Legend.Height);
        ReadOnlySpan<Rgba32> ramp = SequentialRamp.Colours;
        for (int y = 0; y < height; y++)
        {
            ReadOnlySpan<uint> row = values.Slice(y * width, width);
            for (int x = 0; x < width; x++)
                image[x, y] = ramp[SequentialRamp.Index(scale.Fraction(row[x]))];
        }
        Legend.Draw(image, height, SequentialRamp.Map, LegendTicks(scale));
        return image;
    }

    public static IReadOnlyList<LegendTick> LegendTicks(HeatmapScale scale) =>
        scale.Ticks(MaxLegendTicks).Select(t => new LegendTick(t.Position, TickFormat.Compact(t.Value))).ToList();
}
