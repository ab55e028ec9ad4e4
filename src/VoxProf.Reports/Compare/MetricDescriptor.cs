using System.Globalization;

namespace VoxProf.Reports.Compare;

/// <summary>
/// What one compared number means. <see cref="LowerIsBetter"/> is the only place the direction of a regression is
/// decided, so no column of a comparison needs a special case.
/// </summary>
/// <param name="Group">A counter name (<c>iterations</c>) or a wave group (<c>wave32</c>).</param>
/// <param name="Statistic">A counter statistic (<c>mean</c>) or a wave statistic (<c>tile-max</c>).</param>
/// <param name="NumberFormat">.NET format string for values in this metric's unit.</param>
public sealed record MetricDescriptor(string Group, string Statistic, string Unit, bool LowerIsBetter, string NumberFormat)
{
    public string Key => $"{Group}.{Statistic}";

    public string Format(double value) => value.ToString(NumberFormat, CultureInfo.InvariantCulture);

    /// <summary>A signed change: "+1.5", "-3", "0".</summary>
    public string FormatChange(double change) =>
        change > 0 ? "+" + Format(change) : change < 0 ? "-" + Format(-change) : Format(0);
}
