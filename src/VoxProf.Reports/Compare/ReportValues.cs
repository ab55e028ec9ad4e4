using System.Globalization;
using VoxProf.Core;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;
using VoxProf.Reports.Pixels;

namespace VoxProf.Reports.Compare;

/// <summary>
/// Refuses a report whose numbers no trace can produce (docs/ci.md, "Damaged reports"): a value that is not a
/// finite number, a negative count, a fraction above 1, a percentile below a lower one, a mean above the maximum or
/// one that disagrees with the total. Such a report was edited or corrupted; comparing it would gate on nonsense,
/// and a value beyond any real total could overflow the arithmetic of the comparison.
/// </summary>
internal static class ReportValues
{
    /// <summary>Largest value accepted: a sum over 16384² pixels of 32-bit counts stays below it (2^60 ≈ 1.2e18).</summary>
    public const double MaxValue = 1L << 60;

    // Statistics of one measure, in the order they must rise.
    private static readonly string[] Ascending = ["p50", "p90", "p99", "max"];

    /// <summary>
    /// Refuses a null inside a list (the serializer checks fields, not the items of their lists): the rest of the
    /// comparison may then read every item.
    /// </summary>
    public static void RequireItems(string file, ReportDocument doc)
    {
        static void Items<T>(string file, string path, IEnumerable<T?>? items, string what)
        {
            int i = 0;
            foreach (var item in items ?? [])
            {
                if (item is null)
                    throw new InputException($"{file}: {path}[{i}]: expected {what}, found null");
                i++;
            }
        }
        Items(file, "$.metrics", doc.Metrics, "a metric");
        Items(file, "$.strategies", doc.Strategies, "a strategy");
        for (var i = 0; i < doc.Strategies.Count; i++)
            Items(file, $"$.strategies[{i}].files", doc.Strategies[i].Files, "a file name");
        Items(file, "$.run.strategies", doc.Run.Strategies, "a strategy name");
        Items(file, "$.run.counters", doc.Run.Counters, "a counter name");
        Items(file, "$.run.heatmaps", doc.Run.Heatmaps, "a heatmap name");
        Items(file, "$.run.subgroups", doc.Run.Subgroups, "a subgroup");
        Items(file, "$.warnings", doc.Warnings, "a warning");
    }

    public static void Validate(string file, ReportDocument doc)
    {
        if (doc.Run.Width > PixelDataFile.MaxSide || doc.Run.Height > PixelDataFile.MaxSide)
            throw Damaged(file, "$.run", $"image size {doc.Run.Width}x{doc.Run.Height} exceeds {PixelDataFile.MaxSide} per side");
        double pixels = (double)doc.Run.Width * doc.Run.Height;
        var units = doc.Metrics.ToDictionary(m => m.Name, m => m.Unit, StringComparer.Ordinal);
        for (var i = 0; i < doc.Strategies.Count; i++)
        {
            var s = doc.Strategies[i];
            string at = $"$.strategies[{i}].values";
            foreach (var (name, value) in s.Values)
            {
                if (value is not { } v)
                    continue;
                if (!double.IsFinite(v) || v < 0 || v > MaxValue)
                    throw Damaged(file, $"{at}.{name}", $"{Show(v)} is not a count, size or fraction a trace can produce (expected a finite number from 0 to {MaxValue:0.#e0})");
                if (units.TryGetValue(name, out var unit) && unit is "ratio" or "fraction" && v > 1 + 1e-9)
                    throw Damaged(file, $"{at}.{name}", $"{Show(v)} is a {unit} above 1");
            }
            foreach (var group in s.Values.Keys.Where(k => k.Contains('.', StringComparison.Ordinal)).Select(k => k[..k.IndexOf('.')]).Distinct())
                CheckGroup(file, at, group, s, pixels);
        }
    }

    private static void CheckGroup(string file, string at, string group, StrategyReport s, double pixels)
    {
        double? Get(string statistic) => s.Value($"{group}.{statistic}");
        string? lowerName = null;
        double lower = 0;
        foreach (var statistic in Ascending)
        {
            if (Get(statistic) is not { } v)
                continue;
            if (lowerName is not null && v < lower * (1 - 1e-9))
                throw Damaged(file, $"{at}.{group}.{statistic}", $"{Show(v)} is below {group}.{lowerName} ({Show(lower)}); expected p50 ≤ p90 ≤ p99 ≤ max");
            (lowerName, lower) = (statistic, v);
        }
        if (Get("max") is { } max)
        {
            if (Get("mean") is { } mean && mean > max * (1 + 1e-9))
                throw Damaged(file, $"{at}.{group}.mean", $"{Show(mean)} is above {group}.max ({Show(max)})");
            if (Get("total") is { } total && total > max * pixels * (1 + 1e-9))
                throw Damaged(file, $"{at}.{group}.total", $"{Show(total)} is more than {group}.max ({Show(max)}) for each of the {Show(pixels)} pixels");
        }
        if (Get("total") is { } sum && Get("mean") is { } average && Math.Abs(sum - average * pixels) > 1e-6 * Math.Max(1, sum))
            throw Damaged(file, $"{at}.{group}.total", $"{Show(sum)} disagrees with {group}.mean ({Show(average)}) × {Show(pixels)} pixels");
        if (Get(MetricCatalogue.TileMaxMean) is { } tileMean && Get(MetricCatalogue.TileMaxMax) is { } tileMax && tileMean > tileMax * (1 + 1e-9))
            throw Damaged(file, $"{at}.{group}.{MetricCatalogue.TileMaxMean}", $"{Show(tileMean)} is above {group}.{MetricCatalogue.TileMaxMax} ({Show(tileMax)})");
    }

    private static InputException Damaged(string file, string where, string problem) =>
        new($"{file}: {where}: damaged report: {problem}; trace again");

    private static string Show(double v) => v.ToString("G6", CultureInfo.InvariantCulture);
}
