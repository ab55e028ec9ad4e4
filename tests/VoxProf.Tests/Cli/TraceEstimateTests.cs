using VoxProf.Cli;

namespace VoxProf.Tests.Cli;

public class TraceEstimateTests
{
    private const int Height = 720;

    /// <summary>
    /// A made-up trace like the demo's: grid first at ten times a tree strategy's cost, and rows that differ in cost
    /// (the top 40% is cheap sky, the rest ground costing 8 times as much; a strategy's rows are finished top first).
    /// Returns (rows done over all strategies, seconds) every 0.2 s, as the tracer's reports would be sampled.
    /// </summary>
    private static List<(int Rows, double Seconds)> Timeline(double[] secondsPerStrategy)
    {
        double[] rowCost = Enumerable.Range(0, Height).Select(r => r < Height * 0.4 ? 1.0 : 8.0).ToArray();
        double total = rowCost.Sum();
        var samples = new List<(int, double)>();
        double start = 0;
        for (int s = 0; s < secondsPerStrategy.Length; s++)
        {
            double t = start, next = start + 0.2;
            for (int r = 0; r < Height; r++)
            {
                t += secondsPerStrategy[s] * rowCost[r] / total;
                while (t >= next)
                {
                    samples.Add((s * Height + r, next));
                    next += 0.2;
                }
            }
            samples.Add(((s + 1) * Height, t));
            start = t;
        }
        return samples;
    }

    [Fact]
    public void Nothing_is_estimated_before_one_strategy_has_finished()
    {
        var estimate = new TraceEstimate(Height, [true, false, false]);
        foreach (var (rows, seconds) in Timeline([20, 2, 2]).Where(s => s.Rows < Height))
        {
            estimate.Observe(rows, seconds);
            estimate.SecondsLeft(seconds).Should().BeNull($"at {rows} rows only grid has run");
        }
    }

    [Theory]
    [InlineData(new[] { 20.0, 2, 2, 1.5, 2 }, new[] { true, false, false, false, false })]
    [InlineData(new[] { 2.0, 1.5, 20, 2 }, new[] { false, false, true, false })]
    [InlineData(new[] { 3.0, 2, 2.5 }, new[] { false, false, false })]
    public void Once_shown_the_finish_time_stays_within_a_factor_of_two_of_the_truth_and_swings_less_than_three(double[] seconds, bool[] grid)
    {
        var timeline = Timeline(seconds);
        double end = timeline[^1].Seconds;
        var estimate = new TraceEstimate(Height, grid);
        var finishes = new List<double>();
        foreach (var (rows, now) in timeline)
        {
            estimate.Observe(rows, now);
            if (estimate.SecondsLeft(now) is not { } left)
                continue;
            double finish = now + left;
            finishes.Add(finish);
            finish.Should().BeInRange(end / 2, end * 2, $"estimate at {rows} rows, {now:0.0} s: finishes at {finish:0.0} s, truly at {end:0.0} s");
        }
        (finishes.Max() / finishes.Min()).Should().BeLessThan(3);
        int afterFirst = timeline.Count(s => s.Rows > Height);
        finishes.Count.Should().BeGreaterThan(afterFirst * 9 / 10, "an estimate appears soon after the first strategy is done");
    }

    [Fact]
    public void A_plain_rows_per_second_estimate_would_swing_by_more_than_three_on_the_same_timeline()
    {
        // The reason for the design: with grid first and cheap rows on top, rows per second over the whole trace
        // first guesses too short, then several times too long.
        var timeline = Timeline([20, 2, 2, 1.5, 2]);
        var naive = timeline.Where(s => s.Rows >= Height / 20).Select(s => s.Seconds / (s.Rows / (5.0 * Height))).ToList();
        (naive.Max() / naive.Min()).Should().BeGreaterThan(3);
    }

    [Fact]
    public void The_progress_line_names_the_strategy_its_rows_and_the_estimate()
    {
        TraceProgress.Line("dda-mask", 3, 5, 360, 720, 4.26, 12.6).Should().Be("tracing dda-mask (4/5): 360/720 rows, 4.3 s, about 13 s left");
        TraceProgress.Line("grid", 0, 5, 10, 720, 0.4, null).Should().Be("tracing grid (1/5): 10/720 rows, 0.4 s, estimating time left");
    }
}
