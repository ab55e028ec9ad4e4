using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Reports.Colour;
using VoxProf.Reports.Images;

namespace VoxProf.Reports.Compare;

/// <summary>
/// A per-pixel difference image (candidate minus base) in the <see cref="DivergingRamp"/>, on a symmetric scale
/// -maxAbs..+maxAbs, with the legend band underneath.
/// </summary>
public static class DiffHeatmap
{
    public const int MaxLegendTicks = 5;

    public static readonly Rgba32 MarkDark = new(0, 0, 0, 255);
    public static readonly Rgba32 MarkLight = new(255, 255, 255, 255);

    /// <param name="hitChanged">Pixels whose hit changed, drawn as a one-pixel black and white checker: a pattern the
    /// smooth ramp never produces, so the mark stays visible whatever colour surrounds it.</param>
    /// <param name="maxAbs">Half-width of the scale; 0 (identical images) draws everything as "no change".</param>
    public static Image<Rgba32> Render(ReadOnlySpan<long> diff, ReadOnlySpan<bool> hitChanged, int width, int height, long maxAbs)
    {
        if (diff.Length != width * height || hitChanged.Length != diff.Length)
            throw new ArgumentException($"expected {width}x{height} = {width * height} pixels, got diff {diff.Length}, mask {hitChanged.Length}");
        var image = new Image<Rgba32>(width, height + Legend.Height);
        for (var y = 0; y < height; y++)
        {
            for (var x = 0; x < width; x++)
            {
                var i = y * width + x;
                image[x, y] = hitChanged[i]
                    ? ((x + y) & 1) == 0 ? MarkDark : MarkLight
                    : DivergingRamp.Map(PixelDiff.Normalize(diff[i], maxAbs));
            }
        }
        Legend.Draw(image, height, DivergingRamp.MapBar, LegendTicks(maxAbs));
        return image;
    }

    /// <summary>Round ticks across -maxAbs..+maxAbs, zero among them; bar position 0.5 is zero.</summary>
    public static IReadOnlyList<LegendTick> LegendTicks(long maxAbs)
    {
        var half = Math.Max(maxAbs, 1);
        var scale = new HeatmapScale(ScaleKind.Linear, -half, half);
        return scale.Ticks(MaxLegendTicks).Select(t => new LegendTick(t.Position, TickFormat.Compact(t.Value, signed: true))).ToList();
    }
}
