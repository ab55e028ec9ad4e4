using System.Globalization;
using CsvHelper;

namespace VoxProf.Reports.Compare;

/// <summary>compare.csv (RFC 4180): one row per strategy and metric, in compare.md's order.</summary>
public sealed class CompareCsvExporter : ICompareExporter
{
    public static readonly string[] Header =
        ["strategy", "metric", "unit", "better", "base", "candidate", "change", "relative_change", "regression"];

    public string FileName => "compare.csv";

    public void Write(CompareResult result, Stream output)
    {
        using var csv = CsvWriter.Create(output, null, leaveOpen: true);
        csv.WriteHeader(Header);
        foreach (var c in result.Comparison.Changes)
        {
            // Full round-trip precision: scripts re-derive their own numbers from these.
            csv.WriteRecord([
                c.Strategy, c.Metric.Name, c.Metric.Unit, CompareText.BetterText(c.Metric.Better),
                R(c.Base), R(c.Candidate), R(c.Change),
                c.RelativeChange is { } r ? R(r) : "",
                c.IsRegression ? "true" : "false",
            ]);
        }
        csv.Flush();
    }

    private static string R(double v) => v.ToString("R", CultureInfo.InvariantCulture);
}
