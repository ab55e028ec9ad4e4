using System.Globalization;
using CsvHelper;

namespace VoxProf.Reports.Tables;

/// <summary>
/// Renders a <see cref="MetricTable"/> as summary.csv (RFC 4180, via CsvHelper): one record per strategy, one column
/// per metric named exactly as in report.json and gate rules, empty where nothing was measured.
/// </summary>
public static class SummaryCsv
{
    public const string StrategyColumn = "strategy";

    public static IReadOnlyList<string> Columns(MetricTable table) => [StrategyColumn, .. table.Metrics.Select(m => m.Name)];

    public static void Write(MetricTable table, TextWriter writer)
    {
        using var csv = CsvWriter.Create(writer, null, leaveOpen: true);
        csv.WriteHeader(Columns(table).ToArray());
        for (int r = 0; r < table.Rows.Count; r++)
        {
            var fields = new string[table.Metrics.Count + 1];
            fields[0] = table.Rows[r];
            for (int m = 0; m < table.Metrics.Count; m++)
                fields[m + 1] = Number(table[r, m]);
            csv.WriteRecord(fields);
        }
        csv.Flush();
    }

    /// <summary>Shortest text that parses back to the same double; empty for a value that was not measured.</summary>
    public static string Number(double? v) => v is { } x ? x.ToString("R", CultureInfo.InvariantCulture) : "";
}
