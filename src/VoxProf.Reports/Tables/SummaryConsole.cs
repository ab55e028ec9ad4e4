using System.Globalization;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Tables;

/// <summary>
/// The table `voxprof trace` prints: the <see cref="MetricColumns.Console"/> metrics per strategy and the trace time.
/// A metric's name is split over two header lines, group above statistic, so the columns stay narrow and still read
/// as the names summary.csv and gate rules use.
/// </summary>
public static class SummaryConsole
{
    public static void Write(TextWriter output, ReportDocument report)
    {
        var table = MetricTable.FromReport(report);
        var columns = MetricColumns.For(MetricColumns.Console, report.Run.PrepassBlock > 0, report.Run.Memory is not null)
            .Select(c => table.IndexOf(c.Metric)).Where(i => i >= 0).ToList();

        var top = new List<string> { "" };
        var bottom = new List<string> { "strategy" };
        foreach (int m in columns)
        {
            MetricDescriptor d = table.Metrics[m];
            top.Add(d.Group is null ? "" : d.Group + ".");
            bottom.Add(d.Statistic);
        }
        top.Add("trace");
        bottom.Add("seconds");

        var rows = new List<string[]>();
        for (int r = 0; r < table.Rows.Count; r++)
        {
            var cells = new List<string> { table.Rows[r] };
            cells.AddRange(columns.Select(m => table.Text(r, m)));
            double seconds = report.Timings.TraceSeconds.TryGetValue(table.Rows[r], out double t) ? t : 0;
            cells.Add(seconds.ToString("0.000", CultureInfo.InvariantCulture));
            rows.Add(cells.ToArray());
        }

        var lines = new List<string[]> { top.ToArray(), bottom.ToArray() };
        lines.AddRange(rows);
        int[] widths = Enumerable.Range(0, top.Count).Select(i => lines.Max(l => l[i].Length)).ToArray();
        foreach (string[] line in lines)
        {
            // The strategy left-aligned, numbers (and the names above them) right-aligned.
            var cells = line.Select((cell, i) => i == 0 ? cell.PadRight(widths[i]) : cell.PadLeft(widths[i]));
            output.WriteLine(string.Join("  ", cells).TrimEnd());
        }
    }
}
