using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Reports.Colour;

namespace VoxProf.Reports.Images;

/// <summary>
/// A cost image coloured with <see cref="SequentialRamp"/> between a title band and a legend band (see
/// <see cref="ImageLayout"/>). The title gets the scale and, when values fall outside it, the share of pixels that
/// do; the legend's end label then says so ("≥ 116").
/// </summary>
public static class HeatmapImage
{
    /// <summary>Integer values below this get a per-value colour table; above it, each pixel is placed on the scale.</summary>
    private const int TableLimit = 1 << 20;

    public static Image<Rgba32> Render(ReadOnlySpan<uint> values, int width, int height, HeatmapScale scale, ImageTitle title)
    {
        if (values.Length != width * height)
            throw new ArgumentException("value image size does not match width × height", nameof(values));
        var clip = ScaleClip.Count(values, scale.Min, scale.Max);
        var (image, layout) = ImageLayout.Create(width, height, title.WithDetails(ScaleFields(scale, clip)), (_, s) => Legend.Height(s));
        Fill(image, layout, values, scale);
        Legend.Draw(image, layout.LegendTop, layout.FontScale, SequentialRamp.Map, LegendTicks(scale, clip, Legend.TickRoom(layout.Width, layout.FontScale)));
        return image;
    }

    /// <summary>Title fields: "linear scale 0 to 116", and the share of pixels below or above it when there are any.</summary>
    public static string[] ScaleFields(HeatmapScale scale, ScaleClip clip)
    {
        string kind = scale.Kind == ScaleKind.Log ? "log" : "linear";
        var fields = new List<string> { $"{kind} scale {TickFormat.Precise(scale.Min)} to {TickFormat.Precise(scale.Max)}" };
        if (clip.Below > 0)
            fields.Add($"{clip.BelowShare} of pixels below {TickFormat.Precise(scale.Min)}");
        if (clip.Above > 0)
            fields.Add($"{clip.AboveShare} of pixels above {TickFormat.Precise(scale.Max)}");
        return [.. fields];
    }

    /// <summary>
    /// The scale's two ends (marked ≤ / ≥ when values beyond them take the end colour) and the round steps between
    /// them, at most <paramref name="maxTicks"/> in all.
    /// </summary>
    public static IReadOnlyList<LegendTick> LegendTicks(HeatmapScale scale, ScaleClip clip, int maxTicks)
    {
        var ticks = new List<LegendTick>
        {
            new(0, (clip.Below > 0 ? Legend.AtMost : "") + TickFormat.Compact(scale.Min)),
            new(1, (clip.Above > 0 ? Legend.AtLeast : "") + TickFormat.Compact(scale.Max)),
        };
        foreach (var (value, position) in scale.Ticks(maxTicks))
        {
            if (position > 0 && position < 1)
                ticks.Add(new LegendTick(position, TickFormat.Compact(value)));
        }
        return ticks;
    }

    private static void Fill(Image<Rgba32> image, ImageLayout layout, ReadOnlySpan<uint> values, HeatmapScale scale)
    {
        // A colour per integer value up to the top of the scale (everything above takes the last one): no logarithm
        // or division per pixel.
        Rgba32 top = SequentialRamp.Map(1);
        Rgba32[]? byValue = null;
        if (scale.Max < TableLimit)
        {
            byValue = new Rgba32[(int)Math.Max(0, Math.Floor(scale.Max)) + 1];
            for (int v = 0; v < byValue.Length; v++)
                byValue[v] = SequentialRamp.Map(scale.Fraction(v));
        }
        for (int y = 0; y < layout.DataHeight; y++)
        {
            Span<Rgba32> row = layout.DataRow(image, y);
            ReadOnlySpan<uint> source = values.Slice(y * layout.DataWidth, layout.DataWidth);
            for (int x = 0; x < row.Length; x++)
            {
                uint v = source[x];
                row[x] = byValue is null ? SequentialRamp.Map(scale.Fraction(v)) : v < (uint)byValue.Length ? byValue[v] : top;
            }
        }
    }
}
