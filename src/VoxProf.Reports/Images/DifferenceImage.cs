using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Reports.Colour;

namespace VoxProf.Reports.Images;

/// <summary>
/// A signed per-pixel difference coloured with <see cref="DivergingRamp"/> (neutral near-white at 0) on the
/// symmetric range ±<c>maxAbs</c>, between a title band and a legend band. Differences beyond the range take the end
/// colours; the legend's end labels then say so ("≥+12"), and the title gives the share of such pixels.
/// </summary>
public static class DifferenceImage
{
    public static readonly Rgba32 MarkDark = new(0, 0, 0, 255);
    public static readonly Rgba32 MarkLight = new(255, 255, 255, 255);

    /// <param name="differences">Signed differences, row-major, row 0 at the top.</param>
    /// <param name="maxAbs">The ends of the scale; 0 (no differences) draws everything as "no change".</param>
    /// <param name="checkered">Pixels drawn as a one-pixel checker of <see cref="MarkDark"/> and <see cref="MarkLight"/>
    /// instead (empty for none): a pattern the smooth ramp never produces, so the mark shows whatever surrounds it.</param>
    /// <param name="rangeNote">Where the range comes from, said after it in the title ("99th percentile of |difference|"); empty for nothing.</param>
    public static Image<Rgba32> Render(ReadOnlySpan<long> differences, int width, int height, double maxAbs, string rangeNote, ImageTitle title, ReadOnlySpan<bool> checkered = default)
    {
        if (differences.Length != width * height || (!checkered.IsEmpty && checkered.Length != differences.Length))
            throw new ArgumentException($"expected {width}x{height} = {width * height} pixels, got {differences.Length} differences and {checkered.Length} marks");
        double range = maxAbs > 0 ? maxAbs : 1;
        var clip = Count(differences, range);
        var (image, layout) = ImageLayout.Create(width, height, title.WithDetails(ScaleFields(range, rangeNote, clip)), (_, s) => Legend.Height(s));
        double toFraction = 1 / range;
        for (int y = 0; y < height; y++)
        {
            Span<Rgba32> row = layout.DataRow(image, y);
            ReadOnlySpan<long> source = differences.Slice(y * width, width);
            for (int x = 0; x < row.Length; x++)
                row[x] = DivergingRamp.Map(source[x] * toFraction);
            if (checkered.IsEmpty)
                continue;
            ReadOnlySpan<bool> marks = checkered.Slice(y * width, width);
            for (int x = 0; x < row.Length; x++)
            {
                if (marks[x])
                    row[x] = ((x + y) & 1) == 0 ? MarkDark : MarkLight;
            }
        }
        Legend.Draw(image, layout.LegendTop, layout.FontScale, DivergingRamp.MapBar, LegendTicks(range, clip, Legend.TickRoom(layout.Width, layout.FontScale)));
        return image;
    }

    /// <summary>Title fields: "scale -17 to +17 (how it was chosen)", and the share of pixels beyond it when there are any.</summary>
    public static string[] ScaleFields(double maxAbs, string rangeNote, ScaleClip clip)
    {
        string scale = $"scale {TickFormat.Precise(-maxAbs)} to +{TickFormat.Precise(maxAbs)}";
        if (rangeNote.Length > 0)
            scale += $" ({rangeNote})";
        return clip.Below + clip.Above > 0 ? [scale, $"{clip.BeyondShare} of pixels beyond it"] : [scale];
    }

    /// <summary>The two ends (marked ≤ / ≥ when differences go beyond them), 0, and round steps between.</summary>
    public static IReadOnlyList<LegendTick> LegendTicks(double maxAbs, ScaleClip clip, int maxTicks)
    {
        var ticks = new List<LegendTick>
        {
            new(0, (clip.Below > 0 ? Legend.AtMost : "") + TickFormat.Compact(-maxAbs, signed: true)),
            new(1, (clip.Above > 0 ? Legend.AtLeast : "") + TickFormat.Compact(maxAbs, signed: true)),
        };
        foreach (var (value, position) in new HeatmapScale(ScaleKind.Linear, -maxAbs, maxAbs).Ticks(maxTicks))
        {
            if (position > 0 && position < 1)
                ticks.Add(new LegendTick(position, TickFormat.Compact(value, signed: true)));
        }
        return ticks;
    }

    private static ScaleClip Count(ReadOnlySpan<long> differences, double maxAbs)
    {
        long below = 0, above = 0;
        foreach (long d in differences)
        {
            if (d < -maxAbs)
                below++;
            else if (d > maxAbs)
                above++;
        }
        return new ScaleClip(below, above, differences.Length);
    }
}
