using MathNet.Numerics.Statistics;
using VoxProf.Core.Statistics;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;

namespace VoxProf.Tests.Statistics;

public class StrategyStatisticsTests
{
    private static StrategyResult Result(StrategyDefinition strategy, int width, int height, Func<Counter, int, uint> value, PixelHit[]? hits = null)
    {
        var counters = new uint[CounterNames.Count][];
        foreach (Counter c in CounterNames.All)
            counters[(int)c] = Enumerable.Range(0, width * height).Select(i => value(c, i)).ToArray();
        return new StrategyResult(strategy, width, height, counters, hits ?? new PixelHit[width * height], TimeSpan.Zero);
    }

    [Fact]
    public void Total_work_is_summed_per_pixel_before_any_statistic()
    {
        // Own iterations 0 or 10 and prepass iterations 10 or 0 in alternate pixels: every pixel's total is 10, so
        // every percentile of the total is 10, while the sum of the two p90s is 20.
        var r = Result(BuiltInStrategies.Dda, 10, 1, (c, i) => c switch
        {
            Counter.Iterations => i % 2 == 0 ? 0u : 10u,
            Counter.PrepassIterations => i % 2 == 0 ? 10u : 0u,
            _ => 0,
        });

        var s = StrategyStatistics.Compute(r, null);

        CounterSummary total = s["total-iterations"];
        total.Should().Be(new CounterSummary(100, 10, 10, 10, 10, 10));
        (s[Counter.Iterations].P90 + s[Counter.PrepassIterations].P90).Should().Be(20);
    }

    [Fact]
    public void Derived_totals_match_an_outside_summary_of_the_per_pixel_sums()
    {
        var rng = new Random(77);
        var values = CounterNames.All.ToDictionary(c => c, _ => Enumerable.Range(0, 24 * 16).Select(_ => (uint)rng.Next(0, 300)).ToArray());
        var r = Result(BuiltInStrategies.Hdda, 24, 16, (c, i) => values[c][i]);

        var s = StrategyStatistics.Compute(r, null);

        foreach (var (name, a, b) in new[]
        {
            ("total-iterations", Counter.Iterations, Counter.PrepassIterations),
            ("total-node-fetches", Counter.NodeFetches, Counter.PrepassNodeFetches),
        })
        {
            double[] sums = values[a].Zip(values[b], (x, y) => (double)x + y).ToArray();
            CounterSummary t = s[name];
            // Outside reference: MathNet.Numerics 5.0.0 quantiles, R7 = Hyndman & Fan definition 7.
            t.P90.Should().BeApproximately(sums.QuantileCustom(0.9, QuantileDefinition.R7), 1e-9, name);
            t.P99.Should().BeApproximately(sums.QuantileCustom(0.99, QuantileDefinition.R7), 1e-9, name);
            t.Mean.Should().BeApproximately(sums.Mean(), 1e-9, name);
            t.Total.Should().Be((long)sums.Sum());
            t.Max.Should().Be((uint)sums.Max());
        }
        s.Measures.Select(m => m.Name).Should().Equal([.. CounterNames.All.Select(c => c.Name()), "total-iterations", "total-node-fetches"]);
    }

    [Fact]
    public void Mismatch_is_null_without_a_reference_zero_for_the_reference_itself_and_counted_otherwise()
    {
        var hit = new PixelHit { Hit = true, X = 1, Y = 2, Z = 3 };
        var grid = Result(BuiltInStrategies.Grid, 2, 1, (_, _) => 1, [hit, hit]);
        var dda = Result(BuiltInStrategies.Dda, 2, 1, (_, _) => 1, [hit, hit with { Z = 4 }]);

        StrategyStatistics.Compute(dda, null).MismatchPixels.Should().BeNull("nothing was checked");
        StrategyStatistics.Compute(grid, grid).MismatchPixels.Should().Be(0);
        StrategyStatistics.Compute(dda, grid).MismatchPixels.Should().Be(1);
    }
}
