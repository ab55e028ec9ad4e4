using System.Globalization;
using System.Text;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Tables;

/// <summary>
/// Renders summary.md: strategies as rows, key metrics of the <see cref="MetricTable"/> as columns, each cost shown
/// with its ratio to the baseline strategy, and relative links to every strategy's images.
/// </summary>
public static class SummaryMarkdown
{
    /// <summary>Columns shown, by metric id; ids missing from the table are skipped.</summary>
    public static IReadOnlyList<string> KeyMetrics { get; } =
    [
        "iterations.mean", "iterations.p90_hf7",
        "wave32.mean_tile_max", "wave32.simd_efficiency",
        "wave64.mean_tile_max", "wave64.simd_efficiency",
        "node-fetches.mean", "slab-tests.mean", "cell-steps.mean",
        "strategy.hit_rate", "strategy.mismatch_pixels",
    ];

    public static string Render(ReportDocument report, MetricTable table)
    {
        var sb = new StringBuilder();
        var run = report.Run;
        string baseline = run.Baseline ?? (table.Rows.Count > 0 ? table.Rows[0] : "");
        int baseRow = table.RowOf(baseline);

        sb.Append(CultureInfo.InvariantCulture, $"# VoxProf trace: {Escape(report.Scene.Name)} / {Escape(report.Camera.Name)}\n\n");
        sb.Append(CultureInfo.InvariantCulture,
            $"{run.Width}×{run.Height} pixels, branching {run.Branching}, prepass {(run.PrepassBlock == 0 ? "off" : run.PrepassBlock.ToString(CultureInfo.InvariantCulture))}, VoxProf {Escape(report.ToolVersion)} ({Escape(report.Environment.Configuration)} build).\n\n");
        foreach (string w in report.Warnings)
            sb.Append(CultureInfo.InvariantCulture, $"> **Warning:** {Escape(w)}\n\n");
        sb.Append(CultureInfo.InvariantCulture,
            $"Figures are per pixel; `×` is the ratio to **{Escape(baseline)}** (below 1 is less work; for SIMD efficiency, above 1 is better). ");
        sb.Append("Percentiles: Hyndman & Fan (1996) definition 7. wave32 = 8×4 pixel tiles, wave64 = 8×8.\n\n");

        var columns = KeyMetrics.Select(table.IndexOf).Where(i => i >= 0).ToList();
        sb.Append("| strategy |");
        foreach (int m in columns)
            sb.Append(' ').Append(Escape(table.Metrics[m].Title)).Append(" |");
        sb.Append(" images |\n|---|");
        foreach (int _ in columns)
            sb.Append("---:|");
        sb.Append("---|\n");

        for (int r = 0; r < table.Rows.Count; r++)
        {
            string name = table.Rows[r];
            sb.Append("| ").Append(Escape(name)).Append(r == baseRow ? " (baseline)" : "").Append(" |");
            foreach (int m in columns)
                sb.Append(' ').Append(Cell(table, r, m, baseRow)).Append(" |");
            var strategy = report.Strategies.FirstOrDefault(s => s.Name == name);
            sb.Append(' ').Append(strategy is null ? "" : Links(strategy)).Append(" |\n");
        }
        return sb.ToString();
    }

    private static string Cell(MetricTable table, int row, int metric, int baseRow)
    {
        MetricDescriptor d = table.Metrics[metric];
        double v = table[row, metric];
        if (double.IsNaN(v))
            return "";
        string text = v.ToString(d.Format, CultureInfo.InvariantCulture);
        if (d.LowerIsBetter is null || baseRow < 0)
            return text;
        double b = table[baseRow, metric];
        if (!(b > 0))
            return text;
        return text + " ×" + (v / b).ToString("0.00", CultureInfo.InvariantCulture);
    }

    private static string Links(StrategyReport s)
    {
        string prefix = $"heatmap-{s.Name}-";
        var links = new List<string>();
        foreach (string f in s.Files)
        {
            if (f.StartsWith(prefix, StringComparison.Ordinal) && f.EndsWith(".png", StringComparison.Ordinal))
                links.Add($"[{Escape(f[prefix.Length..^4])}]({f})");
            else if (f.StartsWith("mismatch-", StringComparison.Ordinal))
                links.Add($"[mismatch]({f})");
        }
        return string.Join(" · ", links);
    }

    private static string Escape(string text) => text.Replace("|", "\\|", StringComparison.Ordinal);
}
