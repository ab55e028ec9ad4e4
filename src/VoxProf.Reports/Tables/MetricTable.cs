using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Tables;

/// <summary>
/// Strategies × metrics: the single table that summary.csv, summary.md and the trace console render, read from a
/// report's metric list and values, so every rendering names a metric as report.json and gate rules do.
/// </summary>
public sealed class MetricTable
{
    private readonly double?[] _values;

    public MetricTable(IReadOnlyList<string> rows, IReadOnlyList<MetricDescriptor> metrics, double?[] values)
    {
        if (values.Length != rows.Count * metrics.Count)
            throw new ArgumentException("values must hold rows × metrics entries", nameof(values));
        Rows = rows;
        Metrics = metrics;
        _values = values;
    }

    public IReadOnlyList<string> Rows { get; }
    public IReadOnlyList<MetricDescriptor> Metrics { get; }

    /// <summary>Null where a row has no value for the metric (mismatch when nothing was checked).</summary>
    public double? this[int row, int metric] => _values[row * Metrics.Count + metric];

    public int IndexOf(string name)
    {
        for (int i = 0; i < Metrics.Count; i++)
        {
            if (Metrics[i].Name == name)
                return i;
        }
        return -1;
    }

    public int RowOf(string name)
    {
        for (int i = 0; i < Rows.Count; i++)
        {
            if (Rows[i] == name)
                return i;
        }
        return -1;
    }

    public static MetricTable FromReport(ReportDocument report)
    {
        IReadOnlyList<MetricDescriptor> metrics = report.Metrics;
        var values = new double?[report.Strategies.Count * metrics.Count];
        for (int r = 0; r < report.Strategies.Count; r++)
            for (int m = 0; m < metrics.Count; m++)
                values[r * metrics.Count + m] = report.Strategies[r].Value(metrics[m].Name);
        return new MetricTable(report.Strategies.Select(s => s.Name).ToList(), metrics, values);
    }

    /// <summary>
    /// The value as a reader sees it: the metric's number format, "not checked" where nothing was measured, and
    /// "×ratio" to <paramref name="baseRow"/> when <paramref name="ratio"/> is asked and the base is positive.
    /// </summary>
    public string Text(int row, int metric, int baseRow = -1, bool ratio = false)
    {
        MetricDescriptor d = Metrics[metric];
        if (this[row, metric] is not { } v)
            return NotChecked;
        string text = d.Format(v);
        if (!ratio || d.Better == Better.Neutral || baseRow < 0 || this[baseRow, metric] is not { } b || !(b > 0))
            return text;
        return text + " ×" + (v / b).ToString("0.00", System.Globalization.CultureInfo.InvariantCulture);
    }

    /// <summary>How a value that was not measured reads in Markdown and on the console.</summary>
    public const string NotChecked = "not checked";
}
