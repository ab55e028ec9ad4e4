using System.Text.Json.Serialization;

namespace VoxProf.Reports.Calibration;

// calibration.json, written by `calibrate` and read by `trace --calibration` (docs/calibration.md). Bump
// SchemaVersion on any change a reader must know about.

/// <param name="Device">The GPU and driver the times were measured on, as the user gave it.</param>
/// <param name="Features">The measures priced, in order (the per-pixel cost is always priced too).</param>
/// <param name="Costs">The per-pixel cost, then one per feature.</param>
/// <param name="Collinearity">Strong dependencies among the priced columns; empty when there are none.</param>
public sealed record CalibrationDocument(
    int SchemaVersion,
    string ToolVersion,
    string Device,
    string[] Features,
    CalibrationScope FittedOn,
    IReadOnlyList<CostEntry> Costs,
    FitSummary Fit,
    IReadOnlyList<DependencyEntry> Collinearity,
    IReadOnlyList<CalibrationRowEntry> Rows)
{
    public const int CurrentSchema = 1;

    /// <summary>Reasons the costs may mislead (collinear or undetermined features); empty when there are none.</summary>
    public IReadOnlyList<string> Warnings { get; init; } = [];
}

/// <summary>What the rows were traced with: every branching, image size (WxH) and prepass block among them.</summary>
public sealed record CalibrationScope(int[] Branchings, string[] Sizes, int[] PrepassBlocks, string[] Scenes, int Rows);

/// <param name="Feature">"pixels" for the fixed per-pixel cost, else a measure's name.</param>
/// <param name="Per">What one unit is: "pixel", or the measure's unit ("count").</param>
/// <param name="Nanoseconds">GPU time per unit, in ns.</param>
public sealed record CostEntry(string Feature, string Per, double Nanoseconds)
{
    /// <summary>The share of the fitted time of all rows this cost accounts for (calibration.json only).</summary>
    [JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)]
    public double? Share { get; init; }
}

/// <param name="RSquared">Null when every measured time is the same.</param>
/// <param name="ConditionNumber">Of the column-scaled design matrix; null for an exact dependency (infinite).</param>
/// <param name="Converged">False when the active-set loop hit its iteration limit.</param>
public sealed record FitSummary(double? RSquared, double RmsResidualMs, double? LooRSquared, double LooRmsErrorMs, double LooMeanAbsPercent,
    double? ConditionNumber, bool Converged);

/// <param name="ConditionIndex">Null for an exact dependency.</param>
public sealed record DependencyEntry(double? ConditionIndex, string[] Features);

/// <summary>One CSV record with the fit's view of it.</summary>
/// <param name="Line">Its line in the CSV file.</param>
/// <param name="Report">The report.json it was matched to, as given on the command line.</param>
public sealed record CalibrationRowEntry(int Line, string Scene, string Camera, string Strategy, int PrepassBlock, int Branching, string Size,
    string Report, double MeasuredMs, double FittedMs, double ResidualMs, double LooPredictedMs, double LooErrorMs)
{
    [JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)]
    public string? Note { get; init; }
}
