using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace VoxProf.Reports.Compare;

/// <summary>
/// Colours a per-pixel difference image. The ramp is passed in: it maps [-1, 1] (candidate cheaper .. dearer, 0 =
/// no change) to a colour, and comes from the report writers' diverging ramp so every image of VoxProf shares it.
/// </summary>
public static class DiffHeatmap
{
    private static readonly Rgba32 MarkDark = new(0, 0, 0, 255);
    private static readonly Rgba32 MarkLight = new(255, 255, 255, 255);

    /// <param name="hitChanged">Pixels whose hit changed, drawn as a one-pixel black and white checker: a pattern no
    /// smooth ramp produces, so the mark stays visible whatever colour surrounds it.</param>
    public static Image<Rgba32> Render(ReadOnlySpan<long> diff, ReadOnlySpan<bool> hitChanged, int width, int height,
        long maxAbs, Func<double, Rgba32> ramp)
    {
        if (diff.Length != width * height || hitChanged.Length != diff.Length)
            throw new ArgumentException($"expected {width}x{height} = {width * height} pixels, got diff {diff.Length}, mask {hitChanged.Length}");
        var image = new Image<Rgba32>(width, height);
        for (var y = 0; y < height; y++)
        {
            for (var x = 0; x < width; x++)
            {
                var i = y * width + x;
                image[x, y] = hitChanged[i]
                    ? ((x + y) & 1) == 0 ? MarkDark : MarkLight
                    : ramp(PixelDiff.Normalize(diff[i], maxAbs));
            }
        }
        return image;
    }
}
