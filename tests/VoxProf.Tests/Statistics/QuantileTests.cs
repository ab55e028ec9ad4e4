using MathNet.Numerics.Statistics;
using VoxProf.Core.Statistics;

namespace VoxProf.Tests.Statistics;

public class QuantileTests
{
    // Worked values by hand from Hyndman & Fan (1996) definition 7: h = (n - 1) p, linear between neighbours.
    [Theory]
    [InlineData(0.10, 1.9)]
    [InlineData(0.25, 3.25)]
    [InlineData(0.90, 9.1)]
    [InlineData(0.00, 1.0)]
    [InlineData(1.00, 10.0)]
    public void Definition_7_on_one_to_ten_matches_the_hand_computed_value(double p, double expected)
    {
        double[] xs = Enumerable.Range(1, 10).Select(i => (double)i).ToArray();
        Quantile.SortedType7(xs, p).Should().BeApproximately(expected, 1e-12);
    }

    // Hyndman & Fan (1996) definition 7 by hand: h = 4 × 0.4 = 1.6, so 20 + 0.6 × (35 − 20) = 29.
    [Fact]
    public void Definition_7_of_five_values_at_p_0_4_is_29()
    {
        uint[] xs = [15, 20, 35, 40, 50];
        Quantile.SortedType7(xs, 0.4).Should().BeApproximately(29, 1e-12);
    }

    // Outside reference: MathNet.Numerics 5.0.0 QuantileDefinition.R7 is Hyndman & Fan definition 7.
    [Fact]
    public void Definition_7_equals_MathNet_R7_on_seeded_random_data()
    {
        var rng = new Random(1234);
        for (int trial = 0; trial < 50; trial++)
        {
            int n = rng.Next(1, 400);
            uint[] values = new uint[n];
            for (int i = 0; i < n; i++)
                values[i] = (uint)rng.Next(0, trial % 2 == 0 ? 20 : 100000);
            Array.Sort(values);
            double[] asDouble = values.Select(v => (double)v).ToArray();
            foreach (double p in new[] { 0.0, 0.01, 0.3, 0.5, 0.9, 0.99, 1.0, rng.NextDouble() })
            {
                double expected = SortedArrayStatistics.QuantileCustom(asDouble, p, QuantileDefinition.R7);
                Quantile.SortedType7(values, p).Should().BeApproximately(expected, 1e-9);
                Quantile.SortedType7(asDouble, p).Should().BeApproximately(expected, 1e-9);
            }
        }
    }

    [Fact]
    public void A_probability_outside_zero_to_one_is_refused()
    {
        double[] xs = [1, 2];
        FluentActions.Invoking(() => Quantile.SortedType7(xs, 1.5)).Should().Throw<ArgumentOutOfRangeException>();
    }
}
