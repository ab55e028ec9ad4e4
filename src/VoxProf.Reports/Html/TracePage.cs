using System.Globalization;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;
using VoxProf.Reports.Tables;

namespace VoxProf.Reports.Html;

/// <summary>The sections of report.html that come from report.json alone: the run's facts and the strategy table.</summary>
public static class TracePage
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    public static string Heading(ReportDocument d) => $"{d.Scene.Name} / {d.Camera.Name}";

    public static string Subtitle(ReportDocument d)
    {
        var run = d.Run;
        string prepass = run.PrepassBlock == 0 ? "off" : run.PrepassBlock.ToString(Inv);
        return string.Create(Inv, $"{run.Width}×{run.Height} pixels · branching {run.Branching} · prepass {prepass} · {run.Strategies.Length} strategies");
    }

    public static void Warnings(TextWriter w, ReportDocument d)
    {
        foreach (string warning in d.Warnings)
            w.Write($"<p class=\"warning\">{HtmlText.Encode(warning)}</p>\n");
    }

    /// <summary>summary.md's table: the same metrics under the same names, each cost with its ratio to the baseline.</summary>
    public static void StrategyTable(TextWriter w, ReportDocument d)
    {
        var table = MetricTable.FromReport(d);
        string baseline = d.Run.Baseline ?? (table.Rows.Count > 0 ? table.Rows[0] : "");
        int baseRow = table.RowOf(baseline);
        var columns = MetricColumns.For(MetricColumns.Summary, d.Run.PrepassBlock > 0, d.Run.Memory is not null)
            .Select(c => (Column: c, Index: table.IndexOf(c.Metric))).Where(c => c.Index >= 0).ToList();

        w.Write("<section id=\"strategies\">\n<h2>Strategies</h2>\n");
        w.Write($"<p>The grey <code>×</code> figure is the ratio to <strong>{HtmlText.Encode(baseline)}</strong>, the baseline: below 1 is less work " +
            "(for SIMD efficiency, above 1 is better). Total work includes each pixel's share of the prepass's. Click a column's name to sort by it.</p>\n");
        w.Write("<div class=\"table-wrap\"><table class=\"sortable\" id=\"strategy-table\">\n<thead><tr>");
        w.Write(HtmlPage.SortHeader("strategy", text: true));
        foreach (var (c, m) in columns)
            w.Write(HtmlPage.SortHeader(c.Metric, table.Metrics[m].Title));
        w.Write("</tr></thead>\n<tbody>\n");
        for (int r = 0; r < table.Rows.Count; r++)
        {
            w.Write($"<tr{(r == baseRow ? " class=\"baseline\"" : "")} data-strategy=\"{HtmlText.Encode(table.Rows[r])}\">");
            w.Write($"<td>{HtmlText.Encode(table.Rows[r])}</td>");
            foreach (var (c, m) in columns)
            {
                string value = table.Text(r, m);
                string ratio = table.Text(r, m, baseRow, c.Ratio);
                string shown = ratio.Length > value.Length
                    ? $"{HtmlText.Encode(value)}<span class=\"ratio\">{HtmlText.Encode(ratio[value.Length..].Trim())}</span>"
                    : HtmlText.Encode(value);
                w.Write(HtmlPage.NumberCell(shown, table[r, m]));
            }
            w.Write("</tr>\n");
        }
        w.Write("</tbody></table></div>\n<ul class=\"defs\">\n");
        foreach (var (_, m) in columns)
        {
            MetricDescriptor md = table.Metrics[m];
            w.Write($"<li><code>{HtmlText.Encode(md.Name)}</code>: {HtmlText.Encode(md.Title)} ({HtmlText.Encode(md.Unit)}).</li>\n");
        }
        w.Write("<li>Percentiles: Hyndman &amp; Fan (1996) definition 7. SIMD efficiency: Aila &amp; Laine (2009). Every other metric is in summary.csv.</li>\n");
        w.Write("</ul>\n</section>\n");
    }

    /// <summary>Everything a reader needs to trust or rerun the trace.</summary>
    public static void Facts(TextWriter w, ReportDocument d)
    {
        var run = d.Run;
        var cam = d.Camera;
        var facts = new List<(string, string)>
        {
            ("scene", d.Scene.File is null ? d.Scene.Name : $"{d.Scene.Name} ({d.Scene.File})"),
            ("scene sha256", d.Scene.Sha256 ?? "none"),
            ("extent", string.Join("×", d.Scene.Extent) + " voxels"),
            ("camera", cam.Name),
            ("eye", Vector(cam.Eye)),
            ("target", Vector(cam.Target)),
            ("up", Vector(cam.Up)),
            ("field of view", cam.FovDegrees.ToString("0.###", Inv) + "°"),
            ("size", string.Create(Inv, $"{run.Width}×{run.Height} pixels")),
            ("branching", run.Branching.ToString(Inv)),
            ("tree", string.Create(Inv, $"depth {d.Tree.Depth}, {d.Tree.Nodes} nodes, {d.Tree.Bytes} bytes, {d.Tree.SolidVoxels} solid voxels")),
            ("prepass", run.PrepassBlock == 0 ? "off" : string.Create(Inv, $"blocks of {run.PrepassBlock}×{run.PrepassBlock} pixels")),
            ("strategies", string.Join(", ", run.Strategies)),
            ("baseline", run.Baseline ?? "none"),
            ("heatmap scale", run.RangeMin is { } min && run.RangeMax is { } max
                ? string.Create(Inv, $"{run.Scale}, fixed {min}..{max}") : $"{run.Scale}, from the data"),
            ("VoxProf", $"{d.ToolVersion} (commit {d.ToolCommit})"),
            ("runtime", d.Environment.Runtime),
            ("operating system", d.Environment.Os),
            ("build", d.Environment.Configuration),
            ("processors", d.Environment.ProcessorCount.ToString(Inv)),
            ("threads", d.Timings.Threads.ToString(Inv)),
            ("tree build", d.Timings.TreeBuildSeconds.ToString("0.000", Inv) + " s"),
        };
        foreach (var (strategy, seconds) in d.Timings.TraceSeconds)
        {
            facts.Add(($"trace {strategy}", seconds.ToString("0.000", Inv) + " s"));
            if (d.Timings.MemorySeconds?.TryGetValue(strategy, out double model) == true)
                facts.Add(($"memory model {strategy}", model.ToString("0.000", Inv) + " s"));
        }
        if (d.CommandLine.Count > 0)
            facts.Add(("command", "voxprof " + string.Join(" ", d.CommandLine.Select(Quote))));

        w.Write("<section id=\"run\">\n<h2>Run</h2>\n<dl class=\"facts\">\n");
        foreach (var (label, value) in facts)
            w.Write($"<div><dt>{HtmlText.Encode(label)}</dt><dd>{HtmlText.Encode(value)}</dd></div>\n");
        w.Write("</dl>\n<p class=\"note\">Counts are deterministic: the same scene, camera and options give the same numbers on any machine. Timings are not.</p>\n</section>\n");
    }

    private static string Vector(float[] v) => string.Join(", ", v.Select(x => x.ToString("R", Inv)));

    /// <summary>An argument as a POSIX shell would need it to read back the same.</summary>
    private static string Quote(string arg) =>
        arg.Length > 0 && arg.All(ch => char.IsAsciiLetterOrDigit(ch) || "-_./:,=+%@".Contains(ch)) ? arg : "'" + arg.Replace("'", "'\\''", StringComparison.Ordinal) + "'";
}
