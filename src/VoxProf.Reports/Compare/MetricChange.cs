using VoxProf.Reports.Metrics;

namespace VoxProf.Reports.Compare;

/// <summary>One metric of one strategy in both reports.</summary>
public sealed record MetricChange(string Strategy, MetricDescriptor Metric, double Base, double Candidate)
{
    public double Change => Candidate - Base;

    /// <summary>Change over |base|; 0 when both are 0; null when there is no finite ratio (the base is 0, or so
    /// near it that the ratio overflows).</summary>
    public double? RelativeChange => Change == 0 ? 0 : Base != 0 && Change / Math.Abs(Base) is var r && double.IsFinite(r) ? r : null;

    /// <summary>
    /// The change in the metric's "worse" direction: positive is worse whatever the metric. A neutral metric (hit
    /// rate) has no worse direction, so any change counts against a rule's limit: its size, either way.
    /// </summary>
    public double AbsoluteWorsening => Metric.Better switch
    {
        Better.Lower => Change,
        Better.Higher => -Change,
        _ => Math.Abs(Change),
    };

    /// <summary>
    /// <see cref="AbsoluteWorsening"/> over |base|; ±infinity when the base is 0 and the candidate is not, so a cost
    /// appearing from nothing sorts first and breaks any relative limit.
    /// </summary>
    public double RelativeWorsening => Base != 0
        ? AbsoluteWorsening / Math.Abs(Base)
        : AbsoluteWorsening == 0 ? 0 : AbsoluteWorsening > 0 ? double.PositiveInfinity : double.NegativeInfinity;

    /// <summary>Worse in the metric's direction; never for a neutral metric.</summary>
    public bool IsRegression => Metric.Better != Better.Neutral && AbsoluteWorsening > 0;

    /// <summary>Better in the metric's direction; never for a neutral metric.</summary>
    public bool IsImprovement => Metric.Better != Better.Neutral && AbsoluteWorsening < 0;
}

/// <summary>Largest regressions first: by relative worsening, ties in the reports' own order.</summary>
public static class RegressionOrder
{
    public static IReadOnlyList<MetricChange> Sort(IEnumerable<MetricChange> changes) =>
        changes
            .Select((c, i) => (c, i))
            .OrderByDescending(x => SortKey(x.c))
            .ThenBy(x => x.i)
            .Select(x => x.c)
            .ToArray();

    // Rounded so that equal changes computed through different divisions (a 7% rise of 12 and of 40) tie, and
    // keep the reports' strategy and metric order instead of an order set by the last bits of a division.
    // Absolute changes are no tie-break: they are in different units. Neutral changes are neither regressions nor
    // improvements, so they sit with the unchanged metrics.
    private static double SortKey(MetricChange c) =>
        c.Metric.Better == Better.Neutral ? 0
        : double.IsInfinity(c.RelativeWorsening) ? c.RelativeWorsening
        : Math.Round(c.RelativeWorsening, 9);
}
