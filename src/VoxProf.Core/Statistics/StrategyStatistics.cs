using VoxProf.Core.Memory;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Statistics;

/// <summary>
/// Every statistic of one strategy's image: a summary of each measure (every counter and the derived totals), the
/// subgroup model of loop iterations, and the hits.
/// </summary>
public sealed class StrategyStatistics
{
    private StrategyStatistics(StrategyDefinition strategy, long pixels, MeasureSummary[] measures, SubgroupSummary[] subgroups, double hitRate, long? mismatchPixels)
    {
        Strategy = strategy;
        Pixels = pixels;
        Measures = measures;
        Subgroups = subgroups;
        HitRate = hitRate;
        MismatchPixels = mismatchPixels;
    }

    public StrategyDefinition Strategy { get; }

    /// <summary>Pixels in the image (width × height).</summary>
    public long Pixels { get; }

    /// <summary>The strategy's name, which keys it in every report.</summary>
    public string Name => Strategy.Name;

    /// <summary>One per <see cref="Statistics.Measures.For"/> entry of the strategy, in that order.</summary>
    public IReadOnlyList<MeasureSummary> Measures { get; }

    /// <summary>One per <see cref="SubgroupShape.Standard"/> shape, in that order.</summary>
    public IReadOnlyList<SubgroupSummary> Subgroups { get; }

    public double HitRate { get; }

    /// <summary>The memory model's lockstep-group lines and cache replay; null when the trace ran with the model off.</summary>
    public MemoryResult? Memory { get; private init; }

    /// <summary>
    /// Pixels whose hit voxel differs from the reference (0 for the reference itself); null when the reference was
    /// not traced, so nothing was checked.
    /// </summary>
    public long? MismatchPixels { get; }

    public CounterSummary this[Counter c] => this[c.Name()];

    /// <summary>The summary of the measure called <paramref name="name"/>; throws for an unknown name.</summary>
    public CounterSummary this[string name]
    {
        get
        {
            foreach (MeasureSummary m in Measures)
            {
                if (m.Name == name)
                    return m.Summary;
            }
            throw new KeyNotFoundException($"no measure '{name}'");
        }
    }

    /// <summary>Summarises one result. Deterministic: the same image gives the same numbers whatever the thread count.</summary>
    /// <param name="reference">The grid result to check hits against; null when grid was not traced.</param>
    public static StrategyStatistics Compute(StrategyResult result, StrategyResult? reference)
    {
        IReadOnlyList<MeasureDefinition> all = Statistics.Measures.For(result.Strategy);
        var measures = new MeasureSummary[all.Count];
        Parallel.For(0, measures.Length, m => measures[m] = new MeasureSummary(all[m], CounterSummary.Compute(all[m].Values(result))));
        ReadOnlySpan<uint> iterations = result.Get(Counter.Iterations);
        var subgroups = new SubgroupSummary[SubgroupShape.Standard.Count];
        for (int i = 0; i < subgroups.Length; i++)
            subgroups[i] = SubgroupModel.Summarise(iterations, result.Width, result.Height, SubgroupShape.Standard[i]);
        long? mismatch = reference is null ? null
            : ReferenceEquals(reference, result) ? 0
            : HitStatistics.MismatchCount(result.Hits, reference.Hits);
        return new StrategyStatistics(result.Strategy, (long)result.Width * result.Height, measures, subgroups, HitStatistics.HitRate(result.Hits), mismatch)
        {
            Memory = result.Memory,
        };
    }

    public static IReadOnlyList<StrategyStatistics> Compute(TraceRun run) =>
        run.Results.Select(r => Compute(r, run.Reference)).ToList();
}
