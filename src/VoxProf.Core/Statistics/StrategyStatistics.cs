using VoxProf.Core.Traversal;

namespace VoxProf.Core.Statistics;

/// <summary>Every statistic of one strategy's image: per-counter summaries, the wave model of loop iterations, hits.</summary>
public sealed class StrategyStatistics
{
    private StrategyStatistics(Strategy strategy, CounterSummary[] counters, WaveSummary[] waves, double hitRate, long mismatchPixels)
    {
        Strategy = strategy;
        Counters = counters;
        Waves = waves;
        HitRate = hitRate;
        MismatchPixels = mismatchPixels;
    }

    public Strategy Strategy { get; }

    /// <summary>Indexed by <see cref="Counter"/>.</summary>
    public IReadOnlyList<CounterSummary> Counters { get; }

    /// <summary>One per <see cref="WaveShape.Standard"/> shape, in that order.</summary>
    public IReadOnlyList<WaveSummary> Waves { get; }

    public double HitRate { get; }

    /// <summary>Pixels whose hit voxel differs from the reference; 0 when there is no reference.</summary>
    public long MismatchPixels { get; }

    public CounterSummary this[Counter c] => Counters[(int)c];

    /// <summary>Summarises one result. Deterministic: the same image gives the same numbers whatever the thread count.</summary>
    public static StrategyStatistics Compute(StrategyResult result, StrategyResult? reference)
    {
        var counters = new CounterSummary[CounterNames.Count];
        Parallel.For(0, counters.Length, c => counters[c] = CounterSummary.Compute(result.Counters[c]));
        ReadOnlySpan<uint> iterations = result.Get(Counter.Iterations);
        var waves = new WaveSummary[WaveShape.Standard.Count];
        for (int i = 0; i < waves.Length; i++)
            waves[i] = WaveModel.Summarise(iterations, result.Width, result.Height, WaveShape.Standard[i]);
        long mismatch = reference is null || ReferenceEquals(reference, result) ? 0 : HitStatistics.MismatchCount(result.Hits, reference.Hits);
        return new StrategyStatistics(result.Strategy, counters, waves, HitStatistics.HitRate(result.Hits), mismatch);
    }

    public static IReadOnlyList<StrategyStatistics> Compute(TraceRun run) =>
        run.Results.Select(r => Compute(r, run.Reference)).ToList();
}
