using MathNet.Numerics.Statistics;
using VoxProf.Core.Statistics;
using VoxProf.Core.Traversal;

namespace VoxProf.Tests.Statistics;

public class CounterSummaryTests
{
    [Theory]
    [InlineData(500)]
    [InlineData(50)]
    [InlineData(100_000_000)] // beyond the histogram limit: the sorting path
    public void Summary_of_unsorted_values_leaves_the_input_unchanged_and_matches_MathNet(int range)
    {
        var rng = new Random(range);
        uint[] values = Enumerable.Range(0, 1001).Select(_ => (uint)rng.Next(0, range)).ToArray();
        uint[] copy = (uint[])values.Clone();

        CounterSummary s = CounterSummary.Compute(values);

        values.Should().Equal(copy);
        double[] d = values.Select(v => (double)v).ToArray();
        // Outside reference: MathNet.Numerics 5.0.0 Statistics.QuantileCustom with R7 (Hyndman & Fan definition 7).
        s.P50.Should().BeApproximately(d.QuantileCustom(0.5, QuantileDefinition.R7), 1e-9);
        s.P90.Should().BeApproximately(d.QuantileCustom(0.9, QuantileDefinition.R7), 1e-9);
        s.P99.Should().BeApproximately(d.QuantileCustom(0.99, QuantileDefinition.R7), 1e-9);
        s.Mean.Should().BeApproximately(d.Mean(), 1e-12 * Math.Max(1, d.Mean()));
        s.Total.Should().Be(values.Sum(v => (long)v));
        s.Max.Should().Be(values.Max());
    }

    [Fact]
    public void Totals_beyond_32_bits_do_not_wrap()
    {
        uint[] values = [uint.MaxValue, uint.MaxValue, 2];
        CounterSummary.Compute(values).Total.Should().Be(2L * uint.MaxValue + 2);
        // Long enough for the vector sums, with a tail after them.
        uint[] many = [.. Enumerable.Repeat(uint.MaxValue, 37), 5];
        CounterSummary s = CounterSummary.Compute(many);
        s.Total.Should().Be(37L * uint.MaxValue + 5);
        s.Max.Should().Be(uint.MaxValue);
    }

    [Fact]
    public void An_empty_image_summarises_to_zeros()
    {
        CounterSummary.Compute(ReadOnlySpan<uint>.Empty).Should().Be(default(CounterSummary));
    }

    [Fact]
    public void Hit_rate_and_mismatch_count_follow_the_hit_records()
    {
        PixelHit[] a = [new() { Hit = true, X = 1 }, new() { Hit = false }, new() { Hit = true, X = 2 }, new() { Hit = false }];
        PixelHit[] b = [new() { Hit = true, X = 1 }, new() { Hit = true }, new() { Hit = true, X = 3 }, new() { Hit = false }];
        HitStatistics.HitRate(a).Should().Be(0.5);
        HitStatistics.MismatchCount(a, b).Should().Be(2);
    }
}
