using VoxProf.Core.Statistics;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Views;

/// <summary>A view of a run with the report its folder holds.</summary>
public sealed record ViewReport(RunView View, ReportDocument Document);

/// <summary>
/// The run level computed from the views' reports alone, so a run traced whole and one merged from shards give the
/// same numbers: strategies and metrics come from the reports, never from a list in the code.
/// </summary>
public static class RunSummary
{
    /// <summary>How many worst views report.json lists per strategy and metric.</summary>
    public const int WorstCount = 3;

    /// <summary>Strategies in the order of the first view's report, then any a later view adds.</summary>
    public static IReadOnlyList<string> Strategies(IReadOnlyList<ViewReport> views) =>
        views.SelectMany(v => v.Document.Strategies.Select(s => s.Name)).Distinct(StringComparer.Ordinal).ToArray();

    /// <summary>Metrics in the order of the first view's report, then any a later view adds.</summary>
    public static IReadOnlyList<MetricDescriptor> Metrics(IReadOnlyList<ViewReport> views)
    {
        var seen = new HashSet<string>(StringComparer.Ordinal);
        return views.SelectMany(v => v.Document.Metrics).Where(m => seen.Add(m.Name)).ToArray();
    }

    public static IReadOnlyList<RunStrategy> Distributions(IReadOnlyList<ViewReport> views, IReadOnlyList<MetricDescriptor> metrics)
    {
        var result = new List<RunStrategy>();
        foreach (string strategy in Strategies(views))
        {
            var distribution = new Dictionary<string, ViewDistribution>(StringComparer.Ordinal);
            var perView = new Dictionary<string, double?[]>(StringComparer.Ordinal);
            foreach (MetricDescriptor m in metrics)
            {
                double?[] values = views.Select(v => Value(v, strategy, m.Name)).ToArray();
                if (Of(values, views) is { } d)
                    distribution[m.Name] = d;
                if (m.Statistic == "mean")
                    perView[m.Name] = values;
            }
            result.Add(new RunStrategy(strategy, distribution, perView));
        }
        return result;
    }

    /// <summary>Mean, p50, p90 and max of the values present; null when no view has one.</summary>
    public static ViewDistribution? Of(IReadOnlyList<double?> values, IReadOnlyList<ViewReport> views)
    {
        var present = new List<(double Value, int View)>();
        for (int i = 0; i < values.Count; i++)
        {
            if (values[i] is { } v)
                present.Add((v, i));
        }
        if (present.Count == 0)
            return null;
        double[] sorted = present.Select(p => p.Value).Order().ToArray();
        double sum = 0;
        foreach (var p in present)
            sum += p.Value;
        // The first view holding the maximum, so ties name the earliest frame.
        int maxView = present.First(p => p.Value == sorted[^1]).View;
        return new ViewDistribution(present.Count, sum / present.Count, Quantile.SortedType7(sorted, 0.5),
            Quantile.SortedType7(sorted, 0.9), sorted[^1], views[maxView].View.Name);
    }

    /// <summary>For every strategy and every metric with a direction, the <see cref="WorstCount"/> worst views.</summary>
    public static IReadOnlyList<WorstViews> Worst(IReadOnlyList<ViewReport> views, IReadOnlyList<MetricDescriptor> metrics)
    {
        var result = new List<WorstViews>();
        foreach (MetricDescriptor m in metrics.Where(m => m.Better != Better.Neutral))
        {
            foreach (string strategy in Strategies(views))
            {
                var ranked = WorstFirst(views, strategy, m).Take(WorstCount).ToArray();
                if (ranked.Length > 0)
                    result.Add(new WorstViews(m.Name, strategy, ranked));
            }
        }
        return result;
    }

    /// <summary>Views with a value, worst first; ties keep view order.</summary>
    public static IEnumerable<ViewValue> WorstFirst(IReadOnlyList<ViewReport> views, string strategy, MetricDescriptor metric)
    {
        var present = views.Select(v => (v.View.Name, Value: Value(v, strategy, metric.Name)))
            .Where(x => x.Value is not null).Select(x => new ViewValue(x.Name, x.Value!.Value));
        return metric.Better == Better.Higher ? present.OrderBy(x => x.Value) : present.OrderByDescending(x => x.Value);
    }

    private static double? Value(ViewReport view, string strategy, string metric) =>
        view.Document.Strategies.FirstOrDefault(s => s.Name == strategy)?.Value(metric);
}
