using System.Globalization;
using VoxProf.Core;
using VoxProf.Core.Calibration;
using VoxProf.Core.Statistics;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Calibration;

/// <summary>A CSV record with the report and strategy it measured, and the frame totals the fit reads.</summary>
public sealed record MeasuredView(TimeRow Row, LoadedReport Report, StrategyReport Strategy, CalibrationSample Sample)
{
    public ReportDocument Document => Report.Document;

    public ImageSize Size => new(Document.Run.Width, Document.Run.Height);
}

/// <summary>
/// Pairs each record of the times CSV with the report of the view it measured: the reports whose scene, camera and
/// (where the record gives them) prepass, branching and size match, and of those the one strategy named. A record
/// that matches no report or several is an error naming the CSV line.
/// </summary>
public static class MeasuredViews
{
    /// <summary>The report metric a feature's frame total is read from: the measure's sum over pixels.</summary>
    public static string TotalMetric(MeasureDefinition feature) => $"{feature.Name}.total";

    public static IReadOnlyList<MeasuredView> Match(string csvPath, IReadOnlyList<TimeRow> rows, IReadOnlyList<LoadedReport> reports,
        IReadOnlyList<MeasureDefinition> features)
    {
        var views = new List<MeasuredView>();
        foreach (TimeRow row in rows)
        {
            string at = $"{csvPath}: line {row.Line.ToString(CultureInfo.InvariantCulture)}";
            LoadedReport[] matches = reports.Where(r => Matches(row, r.Document)).ToArray();
            if (matches.Length == 0)
                throw new InputException($"{at}: no report given is of {Describe(row)}; the reports are of: {Views(reports)}");
            if (matches.Length > 1)
            {
                throw new InputException($"{at}: {Describe(row)} matches {matches.Length} reports ({string.Join("; ", matches.Select(m => $"{m.File}: {Settings(m.Document)}"))}); " +
                    "add a prepass, branching or size column to tell them apart");
            }
            LoadedReport report = matches[0];
            StrategyReport strategy = report.Document.Strategies.FirstOrDefault(s => string.Equals(s.Name, row.Strategy, StringComparison.OrdinalIgnoreCase))
                ?? throw new InputException($"{at}: {report.File} has no strategy '{row.Strategy}'; it traced {string.Join(", ", report.Document.Strategies.Select(s => s.Name))}");
            var totals = new double[features.Count];
            for (int k = 0; k < features.Count; k++)
            {
                string metric = TotalMetric(features[k]);
                totals[k] = strategy.Value(metric) ?? throw new InputException(
                    $"{report.File}: strategy '{strategy.Name}' has no value for {metric} (used by {at}); trace the view again with this voxprof");
            }
            var run = report.Document.Run;
            views.Add(new MeasuredView(row, report, strategy, new CalibrationSample(row.GpuMs, (long)run.Width * run.Height, totals)));
        }
        return views;
    }

    private static bool Matches(TimeRow row, ReportDocument doc) =>
        (Same(row.Scene, doc.Scene.Name) || Same(row.Scene, doc.Scene.File))
        && Same(row.Camera, doc.Camera.Name)
        && (row.Prepass is not { } p || p == doc.Run.PrepassBlock)
        && (row.Branching is not { } b || b == doc.Tree.Branching)
        && (row.Size is not { } s || (s.Width == doc.Run.Width && s.Height == doc.Run.Height));

    private static bool Same(string a, string? b) => string.Equals(a, b, StringComparison.OrdinalIgnoreCase);

    private static string Describe(TimeRow row)
    {
        var parts = new List<string> { $"scene '{row.Scene}'", $"camera '{row.Camera}'" };
        if (row.Prepass is { } p)
            parts.Add($"prepass {PrepassText(p)}");
        if (row.Branching is { } b)
            parts.Add($"branching {b.ToString(CultureInfo.InvariantCulture)}");
        if (row.Size is { } s)
            parts.Add($"size {s}");
        return string.Join(", ", parts);
    }

    /// <summary>"branching 4, prepass off, 1280x720".</summary>
    public static string Settings(ReportDocument doc) =>
        $"branching {doc.Tree.Branching.ToString(CultureInfo.InvariantCulture)}, prepass {PrepassText(doc.Run.PrepassBlock)}, " +
        new ImageSize(doc.Run.Width, doc.Run.Height);

    public static string PrepassText(int block) => block == 0 ? "off" : block.ToString(CultureInfo.InvariantCulture);

    private static string Views(IReadOnlyList<LoadedReport> reports)
    {
        const int Shown = 8;
        var views = reports.Select(r => $"{r.Document.Scene.Name}/{r.Document.Camera.Name} ({Settings(r.Document)})").Distinct().ToArray();
        string list = string.Join("; ", views.Take(Shown));
        return views.Length > Shown ? $"{list}; and {views.Length - Shown} more" : list;
    }
}
