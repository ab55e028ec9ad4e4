using System.Globalization;
using System.Text;

namespace VoxProf.Reports.Calibration;

/// <summary>calibration.md: the costs, how well they fit and predict, the warnings, and every row.</summary>
public static class CalibrationMarkdown
{
    public static string Render(CalibrationDocument doc)
    {
        var sb = new StringBuilder();
        var scope = doc.FittedOn;
        sb.Append(CultureInfo.InvariantCulture, $"# VoxProf calibration: {Escape(doc.Device)}\n\n");
        sb.Append(CultureInfo.InvariantCulture,
            $"Fitted on {scope.Rows} measured views of {string.Join(", ", scope.Scenes.Select(Escape))}: branching {string.Join(", ", scope.Branchings)}, " +
            $"{string.Join(", ", scope.Sizes)}, prepass {string.Join(", ", scope.PrepassBlocks.Select(p => p == 0 ? "off" : p.ToString(CultureInfo.InvariantCulture)))}. " +
            $"VoxProf {Escape(doc.ToolVersion)}. Non-negative least squares (Lawson & Hanson 1974); see docs/calibration.md.\n\n");
        foreach (string w in doc.Warnings)
            sb.Append(CultureInfo.InvariantCulture, $"> **Warning:** {Escape(w)}\n\n");

        sb.Append("## Costs\n\n| cost | ns | per | share of the fitted time |\n|---|---:|---|---:|\n");
        foreach (CostEntry c in doc.Costs)
        {
            string share = c.Share is { } s ? s.ToString("0.0%", CultureInfo.InvariantCulture) : "";
            sb.Append(CultureInfo.InvariantCulture, $"| `{c.Feature}` | {Number(c.Nanoseconds)} | {c.Per} | {share} |\n");
        }

        var fit = doc.Fit;
        sb.Append("\n## Fit\n\n");
        sb.Append(CultureInfo.InvariantCulture, $"- R² {Ratio(fit.RSquared)}: the share of the spread in measured times the costs reproduce (1 is all of it).\n");
        sb.Append(CultureInfo.InvariantCulture, $"- RMS residual {Number(fit.RmsResidualMs)} ms: how far the fitted times are from the measured ones.\n");
        sb.Append(CultureInfo.InvariantCulture,
            $"- Leave-one-out: RMS prediction error {Number(fit.LooRmsErrorMs)} ms, mean |error| {fit.LooMeanAbsPercent.ToString("0.0", CultureInfo.InvariantCulture)}% " +
            $"of the measured time, predicted R² {Ratio(fit.LooRSquared)}: each row predicted by the costs fitted to the other rows, ");
        sb.Append("the error to expect for a view the calibration has not seen.\n");
        sb.Append(CultureInfo.InvariantCulture,
            $"- Condition number {(fit.ConditionNumber is { } k ? Number(k) : "infinite (exact dependency)")} of the column-scaled counts " +
            $"(Belsley, Kuh & Welsch 1980; a dependency is reported from condition index 30).\n");
        if (!fit.Converged)
            sb.Append("- The fit stopped at its iteration limit.\n");

        sb.Append("\n## Rows\n\nResidual and leave-one-out error are measured minus model.\n\n");
        sb.Append("| line | scene | camera | strategy | prepass | branching | size | measured ms | fitted ms | residual ms | left-out prediction ms | left-out error ms |\n");
        sb.Append("|---:|---|---|---|---:|---:|---|---:|---:|---:|---:|---:|\n");
        foreach (CalibrationRowEntry r in doc.Rows)
        {
            sb.Append(CultureInfo.InvariantCulture,
                $"| {r.Line} | {Escape(r.Scene)} | {Escape(r.Camera)} | {Escape(r.Strategy)} | {(r.PrepassBlock == 0 ? "off" : r.PrepassBlock.ToString(CultureInfo.InvariantCulture))} | " +
                $"{r.Branching} | {r.Size} | {Number(r.MeasuredMs)} | {Number(r.FittedMs)} | {Number(r.ResidualMs)} | {Number(r.LooPredictedMs)} | {Number(r.LooErrorMs)} |\n");
        }
        return sb.ToString();
    }

    /// <summary>Four significant digits: costs span from hundredths of a nanosecond to microseconds.</summary>
    public static string Number(double v) => v.ToString("G4", CultureInfo.InvariantCulture);

    private static string Ratio(double? v) => v is { } x ? x.ToString("0.0000", CultureInfo.InvariantCulture) : "undefined (every measured time is the same)";

    private static string Escape(string text) => text.Replace("|", "\\|", StringComparison.Ordinal);
}
