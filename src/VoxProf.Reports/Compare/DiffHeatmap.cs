using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Core.Statistics;
using VoxProf.Reports.Images;

namespace VoxProf.Reports.Compare;

/// <summary>
/// compare's per-pixel map: a <see cref="DifferenceImage"/> (diverging ramp, symmetric robust scale, title and
/// legend) with the pixels whose hit changed drawn as a black and white checker.
/// </summary>
public static class DiffHeatmap
{
    public static readonly Rgba32 MarkDark = DifferenceImage.MarkDark;
    public static readonly Rgba32 MarkLight = DifferenceImage.MarkLight;

    /// <param name="maxAbs">Half-width of the scale (see <see cref="RobustRange"/>); 0 draws everything as "no change".</param>
    /// <param name="rangeNote">Where <paramref name="maxAbs"/> comes from, for the title.</param>
    public static Image<Rgba32> Render(ReadOnlySpan<long> diff, ReadOnlySpan<bool> hitChanged, int width, int height, double maxAbs, string rangeNote, ImageTitle title)
    {
        if (diff.Length != width * height || hitChanged.Length != diff.Length)
            throw new ArgumentException($"expected {width}x{height} = {width * height} pixels, got diff {diff.Length}, mask {hitChanged.Length}");
        return DifferenceImage.Render(diff, width, height, maxAbs, rangeNote, title, hitChanged);
    }

    /// <summary>
    /// The scale's half-width for one difference image: the 99th percentile of |difference| over all pixels
    /// (Hyndman &amp; Fan definition 7, as every percentile in VoxProf), rounded up to a whole count since the
    /// differences are whole; the largest |difference| when that percentile is 0 (fewer than 1% of pixels changed).
    /// One pixel that changed by a lot then no longer washes out the change everywhere else.
    /// </summary>
    public static double RobustRange(ReadOnlySpan<long> diff)
    {
        if (diff.IsEmpty)
            return 0;
        var magnitudes = new uint[diff.Length];
        for (int i = 0; i < diff.Length; i++)
            magnitudes[i] = (uint)Math.Min(Math.Abs(diff[i]), uint.MaxValue);
        var s = CounterSummary.Compute(magnitudes);
        return s.P99 > 0 ? Math.Ceiling(s.P99) : s.Max;
    }
}
