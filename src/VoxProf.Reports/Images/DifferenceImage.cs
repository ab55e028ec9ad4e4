using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Reports.Colour;

namespace VoxProf.Reports.Images;

/// <summary>
/// A signed per-pixel difference coloured with <see cref="DivergingRamp"/> (0 near-white, negative blue, positive
/// orange) on a symmetric range ±<c>maxAbs</c>, with the legend band underneath. For compare's per-pixel maps.
/// </summary>
public static class DifferenceImage
{
    /// <param name="differences">Signed differences, row-major, row 0 at the top.</param>
    /// <param name="maxAbs">The ends of the scale; larger differences take the end colours.</param>
    /// <param name="label">Tick label of a value on the scale; defaults to <see cref="TickFormat.Compact"/> with a sign.</param>
    public static Image<Rgba32> Render(ReadOnlySpan<double> differences, int width, int height, double maxAbs, Func<double, string>? label = null)
    {
        if (differences.Length != width * height)
            throw new ArgumentException("difference image size does not match width × height", nameof(differences));
        double scale = maxAbs > 0 ? maxAbs : 1;
        var image = new Image<Rgba32>(width, height + Legend.Height);
        for (int y = 0; y < height; y++)
            for (int x = 0; x < width; x++)
                image[x, y] = DivergingRamp.Map(differences[y * width + x] / scale);
        label ??= v => TickFormat.Compact(v, signed: true);
        Legend.Draw(image, height, DivergingRamp.MapBar, LegendTicks(scale, label));
        return image;
    }

    /// <summary>Five ticks: −max, −max/2, 0, +max/2, +max.</summary>
    public static IReadOnlyList<LegendTick> LegendTicks(double maxAbs, Func<double, string> label) =>
        new[] { -1.0, -0.5, 0, 0.5, 1 }.Select(f => new LegendTick((f + 1) / 2, label(f * maxAbs))).ToList();
}
