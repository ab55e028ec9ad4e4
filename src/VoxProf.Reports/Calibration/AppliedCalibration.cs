using VoxProf.Core.Calibration;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Calibration;

/// <summary>A calibration read for a trace: the file it came from and the model it defines.</summary>
public sealed record AppliedCalibration(string File, CostModel Model)
{
    /// <summary>What report.json records of it.</summary>
    public CalibrationInfo Info => new(Path.GetFileName(File), Model.Device,
        Model.Terms.Where(t => !t.IsPixel).Select(t => t.Name).ToArray(),
        Model.Terms.Select(t => new CostEntry(t.Name, t.Per, t.Nanoseconds)).ToArray(),
        Model.FittedOn.Branchings.ToArray(), Model.FittedOn.Sizes.Select(s => s.ToString()).ToArray());
}

/// <summary>report.json's record of the calibration a trace applied.</summary>
/// <param name="File">The calibration file's name.</param>
/// <param name="Branchings">The branching factors it was fitted on.</param>
/// <param name="Sizes">The image sizes (WxH) it was fitted on.</param>
public sealed record CalibrationInfo(string File, string Device, string[] Features, IReadOnlyList<CostEntry> Costs, int[] Branchings, string[] Sizes);

/// <summary>What compare says about the calibrations behind two reports' predicted-ms.</summary>
public static class CalibrationNotes
{
    /// <summary>A note when both reports were calibrated, but not alike: their predicted-ms then come from different models.</summary>
    public static IEnumerable<string> Compare(ReportDocument @base, ReportDocument candidate)
    {
        if (@base.Calibration is not { } b || candidate.Calibration is not { } c)
            yield break;
        bool same = b.Device == c.Device && b.Costs.Count == c.Costs.Count
            && b.Costs.Zip(c.Costs).All(p => p.First.Feature == p.Second.Feature && p.First.Nanoseconds == p.Second.Nanoseconds);
        if (!same)
        {
            yield return $"calibration differs: base {b.File} ({b.Device}), candidate {c.File} ({c.Device}); " +
                "predicted-ms changes with the costs as well as with the work";
        }
    }
}
