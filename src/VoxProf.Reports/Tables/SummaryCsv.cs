using System.Globalization;
using CsvHelper;

namespace VoxProf.Reports.Tables;

/// <summary>
/// Renders a <see cref="MetricTable"/> as summary.csv (RFC 4180, via CsvHelper): one record per strategy and group
/// (a counter or a wave size), with the statistics of that group in their columns, empty where they do not apply,
/// and the per-strategy facts repeated on every record of the strategy. "_hf7" marks Hyndman &amp; Fan definition 7.
/// </summary>
public static class SummaryCsv
{
    public static IReadOnlyList<string> Columns(MetricTable table) =>
        ["strategy", "measure", "unit", .. table.Metrics.Select(m => m.Statistic).Distinct()];

    public static void Write(MetricTable table, TextWriter writer)
    {
        IReadOnlyList<string> columns = Columns(table);
        using var csv = CsvWriter.Create(writer, null, leaveOpen: true);
        csv.WriteHeader(columns.ToArray());
        var perStrategy = Enumerable.Range(0, table.Metrics.Count).Where(m => table.Metrics[m].Group == MetricTable.StrategyGroup).ToList();
        for (int r = 0; r < table.Rows.Count; r++)
        {
            foreach (var (group, unit) in table.Groups)
            {
                if (group == MetricTable.StrategyGroup)
                    continue;
                var fields = new string[columns.Count];
                fields[0] = table.Rows[r];
                fields[1] = group;
                fields[2] = unit;
                for (int m = 0; m < table.Metrics.Count; m++)
                {
                    if (table.Metrics[m].Group == group || perStrategy.Contains(m))
                        fields[IndexOf(columns, table.Metrics[m].Statistic)] = Number(table[r, m]);
                }
                csv.WriteRecord(fields);
            }
        }
        csv.Flush();
    }

    /// <summary>Shortest text that parses back to the same double; empty for a missing value.</summary>
    public static string Number(double v) => double.IsNaN(v) ? "" : v.ToString("R", CultureInfo.InvariantCulture);

    private static int IndexOf(IReadOnlyList<string> columns, string name)
    {
        for (int i = 0; i < columns.Count; i++)
        {
            if (columns[i] == name)
                return i;
        }
        throw new InvalidOperationException($"no column {name}");
    }
}
