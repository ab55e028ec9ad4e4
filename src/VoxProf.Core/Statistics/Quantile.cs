namespace VoxProf.Core.Statistics;

/// <summary>
/// Sample quantiles by Hyndman &amp; Fan (1996) definition 7: for n sorted values x[0..n-1] and probability p,
/// h = (n - 1) p, and Q(p) = x[⌊h⌋] + (h - ⌊h⌋)(x[⌊h⌋ + 1] - x[⌊h⌋]).
/// </summary>
public static class Quantile
{
    /// <summary>Definition-7 quantile of values already sorted ascending. Throws on an empty span.</summary>
    public static double SortedType7(ReadOnlySpan<double> sorted, double p)
    {
        int i = Index(sorted.Length, p, out double frac);
        return i + 1 < sorted.Length ? sorted[i] + frac * (sorted[i + 1] - sorted[i]) : sorted[i];
    }

    /// <inheritdoc cref="SortedType7(ReadOnlySpan{double}, double)"/>
    public static double SortedType7(ReadOnlySpan<uint> sorted, double p)
    {
        int i = Index(sorted.Length, p, out double frac);
        // Widen before subtracting: neighbours are ascending, but the difference of two uints near 2^32 stays exact in double.
        return i + 1 < sorted.Length ? sorted[i] + frac * ((double)sorted[i + 1] - sorted[i]) : sorted[i];
    }

    private static int Index(int n, double p, out double frac)
    {
        if (n == 0)
            throw new ArgumentException("no values", nameof(n));
        if (!(p >= 0 && p <= 1))
            throw new ArgumentOutOfRangeException(nameof(p), "p must lie in [0, 1]");
        double h = (n - 1) * p;
        int i = (int)Math.Floor(h);
        frac = h - i;
        return i;
    }
}
