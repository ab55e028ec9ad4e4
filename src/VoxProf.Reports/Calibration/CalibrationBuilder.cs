using System.Globalization;
using VoxProf.Core.Calibration;
using VoxProf.Core.Statistics;

namespace VoxProf.Reports.Calibration;

/// <summary>Turns a fit and the views it was fitted to into calibration.json's document.</summary>
public static class CalibrationBuilder
{
    public static CalibrationDocument Build(string device, IReadOnlyList<MeasuredView> views, CostFit fit, string toolVersion)
    {
        double fittedTotal = fit.Samples.Sum(s => s.FittedMs);
        // Term 0 is the per-pixel cost; term k prices feature k - 1, whose totals are the samples' in that order.
        double Amount(MeasuredView v, int term) => term == 0 ? v.Sample.Pixels : v.Sample.Totals[term - 1];
        var costs = fit.Terms.Select((t, k) => new CostEntry(t.Name, t.Per, t.Nanoseconds)
        {
            Share = fittedTotal > 0 ? views.Sum(v => t.Nanoseconds * Amount(v, k)) / 1e6 / fittedTotal : null,
        }).ToArray();
        var scope = new CalibrationScope(
            views.Select(v => v.Document.Tree.Branching).Distinct().Order().ToArray(),
            views.Select(v => v.Size).Distinct().OrderBy(s => s.Pixels).ThenBy(s => s.Width).Select(s => s.ToString()).ToArray(),
            views.Select(v => v.Document.Run.PrepassBlock).Distinct().Order().ToArray(),
            views.Select(v => v.Document.Scene.Name).Distinct(StringComparer.Ordinal).ToArray(),
            views.Count);
        var rows = views.Select((v, i) =>
        {
            SampleFit s = fit.Samples[i];
            return new CalibrationRowEntry(v.Row.Line, v.Document.Scene.Name, v.Document.Camera.Name, v.Strategy.Name, v.Document.Run.PrepassBlock,
                v.Document.Tree.Branching, v.Size.ToString(), v.Report.File, s.MeasuredMs, s.FittedMs, s.ResidualMs, s.LooPredictedMs, s.LooErrorMs)
            { Note = v.Row.Note };
        }).ToArray();
        var dependencies = fit.Collinearity.Dependencies
            .Select(d => new DependencyEntry(Finite(d.ConditionIndex), d.Columns.Select(c => fit.Terms[c].Name).ToArray())).ToArray();
        var summary = new FitSummary(fit.RSquared, fit.RmsResidualMs, fit.LooRSquared, fit.LooRmsErrorMs, fit.LooMeanAbsPercent,
            Finite(fit.Collinearity.ConditionNumber), fit.Converged);
        return new CalibrationDocument(CalibrationDocument.CurrentSchema, toolVersion, device,
            fit.Terms.Where(t => !t.IsPixel).Select(t => t.Name).ToArray(), scope, costs, summary, dependencies, rows)
        {
            Warnings = Warnings(fit, dependencies),
        };
    }

    private static double? Finite(double v) => double.IsFinite(v) ? v : null;

    /// <summary>One line per reason the costs may mislead, for stderr and the documents.</summary>
    public static IReadOnlyList<string> Warnings(CostFit fit, IReadOnlyList<DependencyEntry> dependencies)
    {
        var warnings = new List<string>();
        foreach (MeasureDefinition m in fit.Undetermined)
            warnings.Add($"{m.Name} is 0 in every row: its cost is not determined and is set to 0");
        foreach (DependencyEntry d in dependencies)
        {
            string how = d.ConditionIndex is { } index
                ? $"are strongly collinear (condition index {index.ToString("0", CultureInfo.InvariantCulture)})"
                : "are exactly collinear (one is a combination of the others)";
            warnings.Add($"{string.Join(", ", d.Features)} {how}: how the time is split between their costs is not determined " +
                "by these rows; predictions for similar views still hold. Add views where they differ, or drop one with --features");
        }
        if (!fit.Converged)
            warnings.Add("the fit stopped at its iteration limit: the costs may not be the least-squares optimum");
        return warnings;
    }
}
