using System.Globalization;
using System.Text;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Tables;

/// <summary>
/// Renders summary.md: strategies as rows, the <see cref="MetricColumns.Summary"/> metrics of the
/// <see cref="MetricTable"/> as columns named as in summary.csv and gate rules, each cost with its ratio to the
/// baseline strategy, links to every strategy's images (relative, or under --link-base), and what each column means.
/// </summary>
public static class SummaryMarkdown
{
    public static string Render(ReportDocument report, MetricTable table, Uri? linkBase = null)
    {
        var sb = new StringBuilder();
        var run = report.Run;
        string baseline = run.Baseline ?? (table.Rows.Count > 0 ? table.Rows[0] : "");
        int baseRow = table.RowOf(baseline);

        sb.Append(CultureInfo.InvariantCulture, $"# VoxProf trace: {Escape(report.Scene.Name)} / {Escape(report.Camera.Name)}\n\n");
        sb.Append(CultureInfo.InvariantCulture,
            $"{run.Width}×{run.Height} pixels, branching {run.Branching}, prepass {(run.PrepassBlock == 0 ? "off" : run.PrepassBlock.ToString(CultureInfo.InvariantCulture))}, VoxProf {Escape(report.ToolVersion)} (commit {Escape(ShortCommit(report.ToolCommit))}, {Escape(report.Environment.Configuration)} build).\n\n");
        foreach (string w in report.Warnings)
            sb.Append(CultureInfo.InvariantCulture, $"> **Warning:** {Escape(w)}\n\n");
        sb.Append(CultureInfo.InvariantCulture,
            $"`×` is the ratio to **{Escape(baseline)}** (below 1 is less work; for SIMD efficiency, above 1 is better). ");
        sb.Append("Total work includes each pixel's share of the prepass's. ");
        sb.Append("Column names are the metric names of summary.csv, report.json and `voxprof compare` rules; summary.csv has every metric.\n\n");

        var columns = MetricColumns.For(MetricColumns.Summary, run.PrepassBlock > 0, run.Memory is not null)
            .Select(c => (Column: c, Index: table.IndexOf(c.Metric))).Where(c => c.Index >= 0).ToList();
        sb.Append("| strategy |");
        foreach (var (c, _) in columns)
            sb.Append(" `").Append(c.Metric).Append("` |");
        sb.Append(" images |\n|---|");
        foreach (var _ in columns)
            sb.Append("---:|");
        sb.Append("---|\n");

        for (int r = 0; r < table.Rows.Count; r++)
        {
            string name = table.Rows[r];
            sb.Append("| ").Append(Escape(name)).Append(r == baseRow ? " (baseline)" : "").Append(" |");
            foreach (var (c, m) in columns)
                sb.Append(' ').Append(table.Text(r, m, baseRow, c.Ratio)).Append(" |");
            var strategy = report.Strategies.FirstOrDefault(s => s.Name == name);
            sb.Append(' ').Append(strategy is null ? "" : Links(strategy, linkBase)).Append(" |\n");
        }

        sb.Append('\n');
        foreach (var (c, m) in columns)
        {
            MetricDescriptor d = table.Metrics[m];
            sb.Append(CultureInfo.InvariantCulture, $"- `{d.Name}`: {Escape(d.Title)} ({Escape(d.Unit)}).\n");
        }
        sb.Append("- Percentiles: Hyndman & Fan (1996) definition 7. SIMD efficiency: Aila & Laine (2009).\n");
        if (report.Files.Contains(OutputNames.ReportHtml))
            sb.Append(CultureInfo.InvariantCulture, $"\nEvery heatmap, with a per-pixel readout: [{OutputNames.ReportHtml}]({ReportLinks.Href(linkBase, OutputNames.ReportHtml)}).\n");
        return sb.ToString();
    }

    /// <summary>The first 12 hex digits: enough to find the commit, short enough for a line of text.</summary>
    public static string ShortCommit(string commit) => commit.Length > 12 && commit.All(char.IsAsciiHexDigit) ? commit[..12] : commit;

    private static string Links(StrategyReport s, Uri? linkBase)
    {
        string prefix = $"heatmap-{s.Name}-";
        var links = new List<string>();
        foreach (string f in s.Files)
        {
            if (f.StartsWith(prefix, StringComparison.Ordinal) && f.EndsWith(".png", StringComparison.Ordinal))
                links.Add($"[{Escape(f[prefix.Length..^4])}]({ReportLinks.Href(linkBase, f)})");
            else if (f.StartsWith("mismatch-", StringComparison.Ordinal))
                links.Add($"[mismatch]({ReportLinks.Href(linkBase, f)})");
        }
        return string.Join(" · ", links);
    }

    private static string Escape(string text) => text.Replace("|", "\\|", StringComparison.Ordinal);
}
