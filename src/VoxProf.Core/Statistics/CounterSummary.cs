using System.Buffers;
using System.Numerics;
using System.Runtime.CompilerServices;

namespace VoxProf.Core.Statistics;

/// <summary>
/// Summary of one counter over the pixels of an image. Percentiles follow Hyndman &amp; Fan (1996) definition 7
/// (see <see cref="Quantile"/>). An empty image gives all zeros.
/// </summary>
public readonly record struct CounterSummary(long Total, double Mean, double P50, double P90, double P99, uint Max)
{
    /// <summary>Values at or below this use a histogram instead of a sort: O(n + max) and no copy of the image.</summary>
    private const uint HistogramLimit = 1 << 16;

    /// <summary>Summarises <paramref name="values"/> without changing it.</summary>
    public static CounterSummary Compute(ReadOnlySpan<uint> values)
    {
        if (values.IsEmpty)
            return default;
        (long total, uint max) = TotalAndMax(values);
        if (max <= HistogramLimit)
            return FromHistogram(values, total, max);
        uint[] rented = ArrayPool<uint>.Shared.Rent(values.Length);
        try
        {
            return Compute(values, rented.AsSpan(0, values.Length));
        }
        finally
        {
            ArrayPool<uint>.Shared.Return(rented);
        }
    }

    /// <summary>
    /// The sum and the largest value, a vector at a time (every counter of every strategy is summarised, several
    /// million pixels each at 2560×1440). Integer sums are exact in any order; 64 bits hold 2³¹ pixels of 2³² − 1.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static (long Total, uint Max) TotalAndMax(ReadOnlySpan<uint> values)
    {
        ulong total = 0;
        uint max = 0;
        int i = 0;
        if (Vector.IsHardwareAccelerated && values.Length >= Vector<uint>.Count)
        {
            var sums = Vector<ulong>.Zero;
            var maxima = Vector<uint>.Zero;
            for (; i <= values.Length - Vector<uint>.Count; i += Vector<uint>.Count)
            {
                var v = new Vector<uint>(values[i..]);
                maxima = Vector.Max(maxima, v);
                Vector.Widen(v, out Vector<ulong> low, out Vector<ulong> high);
                sums += low + high;
            }
            total = Vector.Sum(sums);
            for (int k = 0; k < Vector<uint>.Count; k++)
                max = Math.Max(max, maxima[k]);
        }
        for (; i < values.Length; i++)
        {
            total += values[i];
            max = Math.Max(max, values[i]);
        }
        return ((long)total, max);
    }

    // Counter values are small (a ray rarely takes more than a few thousand steps), so counting beats sorting a
    // million-pixel copy; the order statistics then come from the cumulative counts.
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static CounterSummary FromHistogram(ReadOnlySpan<uint> values, long total, uint max)
    {
        int bins = (int)max + 1;
        int[] rented = ArrayPool<int>.Shared.Rent(bins);
        try
        {
            Span<int> histogram = rented.AsSpan(0, bins);
            histogram.Clear();
            foreach (uint v in values)
                histogram[(int)v]++;
            int n = values.Length;
            return new CounterSummary(
                total,
                (double)total / n,
                QuantileFromHistogram(histogram, n, 0.50),
                QuantileFromHistogram(histogram, n, 0.90),
                QuantileFromHistogram(histogram, n, 0.99),
                max);
        }
        finally
        {
            ArrayPool<int>.Shared.Return(rented);
        }
    }

    private static double QuantileFromHistogram(ReadOnlySpan<int> histogram, int n, double p)
    {
        double h = (n - 1) * p;
        long i = (long)Math.Floor(h);
        double frac = h - i;
        uint lower = OrderStatistic(histogram, i);
        if (frac == 0 || i + 1 >= n)
            return lower;
        uint upper = OrderStatistic(histogram, i + 1);
        return lower + frac * ((double)upper - lower);
    }

    /// <summary>The value at 0-based position <paramref name="rank"/> of the sorted sample.</summary>
    private static uint OrderStatistic(ReadOnlySpan<int> histogram, long rank)
    {
        long seen = 0;
        for (int v = 0; v < histogram.Length; v++)
        {
            seen += histogram[v];
            if (seen > rank)
                return (uint)v;
        }
        return (uint)(histogram.Length - 1);
    }

    /// <summary>Summarises <paramref name="values"/> using <paramref name="scratch"/> (same length) for the sort.</summary>
    public static CounterSummary Compute(ReadOnlySpan<uint> values, Span<uint> scratch)
    {
        if (values.IsEmpty)
            return default;
        if (scratch.Length != values.Length)
            throw new ArgumentException("scratch must be as long as values", nameof(scratch));
        long total = 0;
        foreach (uint v in values)
            total += v;
        values.CopyTo(scratch);
        scratch.Sort();
        ReadOnlySpan<uint> sorted = scratch;
        return new CounterSummary(
            total,
            (double)total / values.Length,
            Quantile.SortedType7(sorted, 0.50),
            Quantile.SortedType7(sorted, 0.90),
            Quantile.SortedType7(sorted, 0.99),
            sorted[^1]);
    }
}
