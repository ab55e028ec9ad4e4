using System.Globalization;
using System.Text;
using VoxProf.Reports.Compare;

namespace VoxProf.Reports.Html;

/// <summary>
/// compare.html: compare.md's content as one self-contained page: the gate's verdict and rules, every metric in a
/// sortable table with its work mark, and the difference heatmaps (inlined) behind a strategy and map switch.
/// </summary>
public sealed class CompareHtmlExporter : ICompareExporter
{
    public string FileName => CompareMarkdownExporter.CompareHtmlName;

    public void Write(CompareResult result, Stream output)
    {
        using var w = new StreamWriter(output, new UTF8Encoding(false), 1 << 16, leaveOpen: true) { NewLine = "\n" };
        var cmp = result.Comparison;
        var b = cmp.Base.Document;
        string subtitle = string.Create(CultureInfo.InvariantCulture,
            $"scene {b.Scene.Name} · camera {b.Camera.Name} · {b.Run.Width}×{b.Run.Height} pixels · {cmp.Strategies.Count} strategies in both");
        HtmlPage.Begin(w, "VoxProf comparison", "VoxProf comparison", "Traversal cost of the candidate against the base", subtitle);
        Gate(w, result.Verdict);
        Reports(w, cmp);
        Differences(w, result);
        Changes(w, cmp);
        HtmlPage.End(w, "Written by VoxProf. This file is complete in itself: it loads nothing from anywhere.");
    }

    private static void Gate(TextWriter w, GateVerdict verdict)
    {
        w.Write($"<section id=\"gate\" class=\"gate {(verdict.Passed ? "holds" : "fails")}\">\n<h2>Gate</h2>\n");
        w.Write($"<p class=\"verdict\">{Strong(HtmlText.Encode(CompareText.GateSentence(verdict)))}</p>\n");
        w.Write("<table id=\"rule-table\"><thead><tr><th class=\"text\">rule</th><th class=\"text\">holds</th><th>metrics checked</th><th>outside the limit</th></tr></thead>\n<tbody>\n");
        foreach (var o in verdict.Outcomes)
        {
            w.Write($"<tr><td><code>{HtmlText.Encode(o.Rule.Text)}</code></td><td class=\"text{(o.Holds ? "" : " broken")}\">{(o.Holds ? "yes" : "no")}</td>" +
                $"<td>{o.Checks.Count}</td><td>{o.Broken.Count()}</td></tr>\n");
        }
        w.Write("</tbody></table>\n");
        if (verdict.BrokenRules.Any())
        {
            w.Write("<ul>\n");
            foreach (var o in verdict.BrokenRules)
            {
                foreach (var c in o.Broken)
                    w.Write($"<li><code>{HtmlText.Encode(o.Rule.Text)}</code>: {HtmlText.Encode(CompareText.Broken(o.Rule, c.Change))}</li>\n");
            }
            w.Write("</ul>\n");
        }
        w.Write("</section>\n");
    }

    private static void Reports(TextWriter w, ReportComparison cmp)
    {
        w.Write("<section id=\"reports\">\n<h2>Reports</h2>\n<dl class=\"facts wide\">\n");
        foreach (var (label, report) in new[] { ("base", cmp.Base), ("candidate", cmp.Candidate) })
        {
            var d = report.Document;
            w.Write($"<div><dt>{label}</dt><dd><code>{HtmlText.Encode(report.File)}</code> (scene {HtmlText.Encode(d.Scene.Name)}, VoxProf {HtmlText.Encode(d.ToolVersion)}, commit {HtmlText.Encode(d.ToolCommit)})</dd></div>\n");
        }
        w.Write($"<div><dt>camera</dt><dd>{HtmlText.Encode(ReportComparison.Describe(cmp.Base.Document.Camera))}</dd></div>\n</dl>\n");
        if (cmp.Notes.Count > 0)
        {
            w.Write("<ul class=\"notes\">\n");
            foreach (string note in cmp.Notes)
                w.Write($"<li>{HtmlText.Encode(note)}</li>\n");
            w.Write("</ul>\n");
        }
        w.Write("</section>\n");
    }

    private static void Changes(TextWriter w, ReportComparison cmp)
    {
        var changed = cmp.Changes.Where(c => c.Change != 0).ToList();
        var unchanged = cmp.Changes.Where(c => c.Change == 0).ToList();
        w.Write("<section id=\"changes\">\n<h2>Changed metrics, most added work first</h2>\n");
        w.Write($"<p>{CompareText.WorkLegend(name => $"<code>{name}</code>")} Click a column's name to sort by it.</p>\n");
        if (changed.Count == 0)
            w.Write($"<p>No metric changed ({cmp.Changes.Count} compared).</p>\n");
        else
            ChangeTable(w, "change-table", changed);
        if (unchanged.Count > 0)
        {
            w.Write($"<details><summary>{unchanged.Count} unchanged metrics</summary>\n");
            ChangeTable(w, "unchanged-table", unchanged);
            w.Write("</details>\n");
        }
        w.Write("</section>\n");
    }

    private static void ChangeTable(TextWriter w, string id, IEnumerable<MetricChange> changes)
    {
        w.Write($"<div class=\"table-wrap\"><table class=\"sortable\" id=\"{id}\">\n<thead><tr>");
        foreach (string h in new[] { "strategy", "metric", "unit" })
            w.Write(HtmlPage.SortHeader(h, text: true));
        foreach (string h in new[] { "base", "candidate", "change", "relative" })
            w.Write(HtmlPage.SortHeader(h));
        w.Write(HtmlPage.SortHeader("work", $"{CompareText.MoreWork} more work, {CompareText.LessWork} less work", text: true));
        w.Write("</tr></thead>\n<tbody>\n");
        foreach (MetricChange c in changes)
        {
            w.Write($"<tr><td>{HtmlText.Encode(c.Strategy)}</td><td class=\"text\"><code>{HtmlText.Encode(c.Metric.Name)}</code></td><td class=\"text\">{HtmlText.Encode(c.Metric.Unit)}</td>");
            w.Write(HtmlPage.NumberCell(c.Metric.Format(c.Base), c.Base));
            w.Write(HtmlPage.NumberCell(c.Metric.Format(c.Candidate), c.Candidate));
            w.Write(HtmlPage.NumberCell(c.Metric.FormatChange(c.Change), c.Change));
            // A cost appearing from 0 has no finite relative change: it sorts past every finite one.
            w.Write(HtmlPage.NumberCell(HtmlText.Encode(CompareText.Relative(c)), c.RelativeChange ?? (c.Change > 0 ? double.MaxValue : double.MinValue)));
            string cls = c.IsRegression ? "more" : c.IsImprovement ? "less" : "text";
            w.Write($"<td class=\"{cls}\">{CompareText.WorkMark(c)}</td></tr>\n");
        }
        w.Write("</tbody></table></div>\n");
    }

    private static void Differences(TextWriter w, CompareResult result)
    {
        var cmp = result.Comparison;
        w.Write("<section id=\"differences\">\n<h2>Difference heatmaps (candidate minus base)</h2>\n");
        foreach (string note in result.DiffNotes)
            w.Write($"<p class=\"note\">{HtmlText.Encode(note)}</p>\n");
        var images = new List<(InlineImage Image, string Strategy, string Map)>();
        if (result.Directory is { } dir)
        {
            foreach (string strategy in cmp.Strategies)
            {
                foreach (string map in CompareDiffImages.Maps(cmp))
                {
                    string file = CompareDiffImages.FileName(strategy, map);
                    if (result.DiffImages.Contains(file) && InlineImage.Load(dir, file) is { } image)
                        images.Add((image, strategy, map));
                }
            }
        }
        if (images.Count == 0)
        {
            w.Write("<p>No difference heatmaps were written.</p>\n</section>\n");
            return;
        }
        w.Write("<p>Orange: the candidate costs more; blue: less; near-white: no change. All strategies of one map share one symmetric scale. " +
            "A black and white checker marks pixels whose hit changed.</p>\n<div class=\"switches\">\n");
        HtmlPage.Switch(w, "strategy", "strategy", images.Select(i => i.Strategy).Distinct().Select(s => (s, s)));
        HtmlPage.Switch(w, "map", "map", images.Select(i => i.Map).Distinct().Select(m => (m, m)));
        w.Write("</div>\n<figure class=\"viewer\">\n");
        foreach (var (image, strategy, map) in images)
        {
            string caption = $"{strategy} · {map} · candidate minus base";
            HtmlPage.ViewerImage(w, image, new Dictionary<string, string> { ["strategy"] = strategy, ["map"] = map }, caption, caption);
        }
        w.Write("<div class=\"viewer-empty\" hidden>No difference heatmap for this strategy and map.</div>\n<figcaption></figcaption>\n</figure>\n</section>\n");
    }

    /// <summary>Turns compare.md's **emphasis** (already HTML-encoded) into &lt;strong&gt;.</summary>
    private static string Strong(string encoded)
    {
        int open = encoded.IndexOf("**", StringComparison.Ordinal);
        int close = open < 0 ? -1 : encoded.IndexOf("**", open + 2, StringComparison.Ordinal);
        return close < 0 ? encoded : encoded[..open] + "<strong>" + encoded[(open + 2)..close] + "</strong>" + encoded[(close + 2)..];
    }
}
