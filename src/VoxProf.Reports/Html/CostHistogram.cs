namespace VoxProf.Reports.Html;

/// <summary>
/// How many pixels cost how much: equal bins of a whole-number width from 0 up to <see cref="Top"/>, plus the pixels
/// at or above it. Costs are whole counts, so a bin always spans the same number of possible values (a width of 2.5
/// would hold two values and three in turn, drawing a comb that is not in the data).
/// </summary>
/// <param name="BinWidth">Values per bin: 1, 2 or 5 times a power of ten.</param>
/// <param name="Counts">Pixels in bin i, which holds values i·BinWidth … (i+1)·BinWidth − 1.</param>
/// <param name="Above">Pixels at or above <see cref="Top"/>.</param>
public sealed record CostHistogram(long BinWidth, long[] Counts, long Above, double Mean, double P90)
{
    public const int DefaultMaxBins = 40;

    /// <summary>The first value past the last bin.</summary>
    public long Top => BinWidth * Counts.Length;

    public long Pixels => Counts.Sum() + Above;

    /// <summary>Bins covering 0 … <paramref name="range"/> (rounded up to whole bins), at most <paramref name="maxBins"/>.</summary>
    public static CostHistogram Build(ReadOnlySpan<uint> values, double range, double mean, double p90, int maxBins = DefaultMaxBins)
    {
        if (maxBins < 1)
            throw new ArgumentOutOfRangeException(nameof(maxBins), "at least one bin");
        // The range includes its top value (a p99 of 115 must get a bin), so bins cover 0 … range + 1.
        double span = Math.Max(1, Math.Floor(range) + 1);
        long width = WholeStep(span / maxBins);
        int bins = (int)Math.Min(maxBins, Math.Ceiling(span / width));
        var counts = new long[bins];
        long above = 0, top = width * bins;
        foreach (uint v in values)
        {
            if (v >= top)
                above++;
            else
                counts[v / width]++;
        }
        return new CostHistogram(width, counts, above, mean, p90);
    }

    /// <summary>The smallest of 1, 2, 5, 10, 20, 50, … that is at least <paramref name="raw"/>.</summary>
    public static long WholeStep(double raw)
    {
        long p = 1;
        while (true)
        {
            foreach (long m in new long[] { 1, 2, 5 })
            {
                if (m * p >= raw)
                    return m * p;
            }
            p *= 10;
        }
    }
}
