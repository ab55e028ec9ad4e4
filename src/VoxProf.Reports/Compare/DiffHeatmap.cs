using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Reports.Images;

namespace VoxProf.Reports.Compare;

/// <summary>
/// compare's per-pixel map: the report writers' <see cref="DifferenceImage"/> (diverging ramp, symmetric scale,
/// legend) with the pixels whose hit changed marked on top.
/// </summary>
public static class DiffHeatmap
{
    public static readonly Rgba32 MarkDark = new(0, 0, 0, 255);
    public static readonly Rgba32 MarkLight = new(255, 255, 255, 255);

    /// <param name="hitChanged">Pixels whose hit changed, drawn as a one-pixel black and white checker: a pattern the
    /// smooth ramp never produces, so the mark stays visible whatever colour surrounds it.</param>
    /// <param name="maxAbs">Half-width of the scale; 0 (identical images) draws everything as "no change".</param>
    public static Image<Rgba32> Render(ReadOnlySpan<long> diff, ReadOnlySpan<bool> hitChanged, int width, int height, long maxAbs)
    {
        if (diff.Length != width * height || hitChanged.Length != diff.Length)
            throw new ArgumentException($"expected {width}x{height} = {width * height} pixels, got diff {diff.Length}, mask {hitChanged.Length}");
        // Differences of counts stay exact in a double up to 2^53, far beyond the 33 bits a uint difference needs.
        var values = new double[diff.Length];
        for (var i = 0; i < diff.Length; i++)
            values[i] = diff[i];
        var image = DifferenceImage.Render(values, width, height, maxAbs);
        for (var y = 0; y < height; y++)
        {
            for (var x = 0; x < width; x++)
            {
                if (hitChanged[y * width + x])
                    image[x, y] = ((x + y) & 1) == 0 ? MarkDark : MarkLight;
            }
        }
        return image;
    }
}
