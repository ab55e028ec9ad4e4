using System.Buffers;

namespace VoxProf.Core.Statistics;

/// <summary>
/// Summary of one counter over the pixels of an image. Percentiles follow Hyndman &amp; Fan (1996) definition 7
/// (see <see cref="Quantile"/>). An empty image gives all zeros.
/// </summary>
public readonly record struct CounterSummary(long Total, double Mean, double P50, double P90, double P99, uint Max)
{
    /// <summary>Summarises <paramref name="values"/> without changing it; sorts a pooled copy.</summary>
    public static CounterSummary Compute(ReadOnlySpan<uint> values)
    {
        if (values.IsEmpty)
            return default;
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
