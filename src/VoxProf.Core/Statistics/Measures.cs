using System.Runtime.CompilerServices;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;

namespace VoxProf.Core.Statistics;

/// <summary>
/// A per-pixel quantity that reports summarise: one counter, or the per-pixel sum of several (a derived measure).
/// </summary>
/// <param name="Name">Lower-case, hyphenated; the group name of its metrics (<c>iterations</c>, <c>total-iterations</c>).</param>
/// <param name="Unit">What one unit of the value is (<c>count</c>, <c>voxels</c>).</param>
/// <param name="LowerIsBetter">Whether a fall is a gain; false for distance the prepass saved.</param>
/// <param name="Parts">The counters summed per pixel; one for a plain counter.</param>
/// <param name="Description">What is measured, per pixel.</param>
public sealed record MeasureDefinition(string Name, string Unit, bool LowerIsBetter, IReadOnlyList<Counter> Parts, string Description)
{
    /// <summary>
    /// The measure's per-pixel values: the counter's own buffer for a plain counter, or for a sum whose other parts are
    /// zero on every pixel (a total without the prepass), else a new array holding the per-pixel sum (saturating at
    /// <see cref="uint.MaxValue"/>, which no real ray reaches).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public uint[] Values(StrategyResult result)
    {
        if (Parts.Count == 1)
            return result.Counters[(int)Parts[0]];
        // A run without the prepass has its parts of the totals at zero: adding them would only cost a fresh
        // image-sized array per total, twice per strategy (statistics, then the page's histogram).
        uint[][] parts = [.. Parts.Select(p => result.Counters[(int)p]).Where(v => v.AsSpan().ContainsAnyExcept(0u))];
        if (parts.Length == 0)
            return result.Counters[(int)Parts[0]];
        if (parts.Length == 1)
            return parts[0];
        var sum = new uint[result.Width * result.Height];
        foreach (uint[] values in parts)
        {
            for (int i = 0; i < sum.Length; i++)
                sum[i] = (uint)Math.Min(uint.MaxValue, (ulong)sum[i] + values[i]);
        }
        return sum;
    }
}

/// <summary>Every measure reports summarise: each counter, then the derived totals.</summary>
public static class Measures
{
    /// <summary>The work of the pixel's own ray plus its share of the coarse prepass ray's (docs/counters.md).</summary>
    public static MeasureDefinition TotalIterations { get; } = new("total-iterations", "count", true,
        [Counter.Iterations, Counter.PrepassIterations], "main-loop iterations of the pixel's ray plus its share of the prepass ray's");

    /// <summary>Node records read by the pixel's own ray plus its share of the coarse prepass ray's.</summary>
    public static MeasureDefinition TotalNodeFetches { get; } = new("total-node-fetches", "count", true,
        [Counter.NodeFetches, Counter.PrepassNodeFetches], "node records read by the pixel's ray plus its share of the prepass ray's grid look-ups");

    /// <summary>Sums of counters, each computed per pixel before any statistic: a percentile of a sum is not a sum of percentiles.</summary>
    public static IReadOnlyList<MeasureDefinition> Derived { get; } = [TotalIterations, TotalNodeFetches];

    /// <summary>Every counter in <see cref="CounterNames.All"/> order, then <see cref="Derived"/>.</summary>
    public static IReadOnlyList<MeasureDefinition> All { get; } =
    [
        .. CounterNames.All.Select(c => new MeasureDefinition(c.Name(), c.Unit(), c.LowerIsBetter(), [c], c.Description())),
        .. Derived,
    ];

    /// <summary>
    /// The measures of one strategy: <see cref="All"/>, then one per counter of its own. An own counter's part is
    /// its buffer index past the built-in counters, which <see cref="MeasureDefinition.Values"/> reads like any other.
    /// </summary>
    public static IReadOnlyList<MeasureDefinition> For(StrategyDefinition strategy) =>
        strategy.ExtraCounters.Count == 0 ? All :
        [
            .. All,
            .. strategy.ExtraCounters.Select((c, i) => new MeasureDefinition(c.Name, "count", true, [(Counter)(CounterNames.Count + i)], c.Description)),
        ];

    /// <summary>The measure called <paramref name="name"/> (case-insensitive), if any.</summary>
    public static MeasureDefinition? Find(string name) =>
        All.FirstOrDefault(m => string.Equals(m.Name, name, StringComparison.OrdinalIgnoreCase));
}

/// <summary>One measure summarised over one strategy's image.</summary>
public readonly record struct MeasureSummary(MeasureDefinition Measure, CounterSummary Summary)
{
    public string Name => Measure.Name;
}
