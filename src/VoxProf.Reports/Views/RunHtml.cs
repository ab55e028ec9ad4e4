using System.Globalization;
using VoxProf.Reports.Html;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Views;

/// <summary>
/// report.html of a run of several views: the headline metrics over the views, the worst views' heatmaps, and a
/// sortable table of every view linking to its own report.html. Complete in itself like every VoxProf page.
/// </summary>
public static class RunHtml
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <param name="directory">The run's working folder (the contact sheet is inlined from it).</param>
    public static void Write(RunDocument run, IReadOnlyList<ViewReport> views, string directory, TextWriter w)
    {
        string heading = $"{run.Scene.Name} / {run.Views.Count} views";
        string sub = run.Shard is { } shard
            ? $"shard {shard.Index} of {shard.Count} · {shard.Views.Count} views held"
            : $"{views.Count} views · {run.Strategies.Count} strategies";
        HtmlPage.Begin(w, $"VoxProf run: {heading}", "VoxProf run", heading, sub);
        IReadOnlyList<MetricDescriptor> headline = RunMarkdown.Headline(run);

        w.Write("<section id=\"over-views\">\n<h2>Over the views</h2>\n");
        w.Write("<p>Each metric is taken per view, then summarised over the views: mean, median (p50), 90th percentile (p90, Hyndman &amp; Fan definition 7) and maximum.</p>\n");
        foreach (MetricDescriptor m in headline)
        {
            w.Write($"<h3><code>{HtmlText.Encode(m.Name)}</code></h3>\n<div class=\"table-wrap\"><table class=\"sortable\">\n<thead><tr>");
            w.Write(HtmlPage.SortHeader("strategy", text: true));
            foreach (string stat in RunWriter.Statistics.Select(s => s.Name))
                w.Write(HtmlPage.SortHeader(stat));
            w.Write(HtmlPage.SortHeader("worst view", text: true));
            w.Write("</tr></thead>\n<tbody>\n");
            foreach (RunStrategy s in run.Strategies)
            {
                if (!s.Distribution.TryGetValue(m.Name, out ViewDistribution? d))
                    continue;
                w.Write($"<tr{(s.Name == run.Baseline ? " class=\"baseline\"" : "")}><td>{HtmlText.Encode(s.Name)}</td>");
                foreach (var (_, pick) in RunWriter.Statistics)
                    w.Write(HtmlPage.NumberCell(HtmlText.Encode(m.Format(pick(d))), pick(d)));
                string worst = run.Worst.FirstOrDefault(x => x.Metric == m.Name && x.Strategy == s.Name)?.Views.FirstOrDefault()?.View ?? "";
                w.Write($"<td>{ViewLink(run, worst)}</td></tr>\n");
            }
            w.Write("</tbody></table></div>\n");
        }
        w.Write("</section>\n");

        if (run.ContactSheet is { } sheet && InlineImage.Load(directory, sheet.File) is { } image)
        {
            w.Write("<section id=\"worst-views\">\n<h2>Worst views</h2>\n");
            w.Write($"<p>{HtmlText.Encode(sheet.Strategy)}'s <code>{HtmlText.Encode(sheet.Map)}</code> heatmaps of the views with the highest <code>{HtmlText.Encode(sheet.Metric)}</code>, worst first, each at its own scale.</p>\n");
            w.Write($"<img class=\"sheet\" width=\"{image.Width}\" height=\"{image.Height}\" style=\"max-width: 100%; height: auto\" alt=\"worst views\" src=\"{image.DataUri}\">\n</section>\n");
        }

        w.Write("<section id=\"views\">\n<h2>Views</h2>\n");
        w.Write($"<p>{HtmlText.Encode(run.Baseline ?? "")} in each view; click a column's name to sort by it, a view's name to open its own report.</p>\n");
        w.Write("<div class=\"table-wrap\"><table class=\"sortable\" id=\"view-table\">\n<thead><tr>");
        w.Write(HtmlPage.SortHeader("view", text: true));
        foreach (MetricDescriptor m in headline)
            w.Write(HtmlPage.SortHeader(m.Name, m.Title));
        w.Write("</tr></thead>\n<tbody>\n");
        foreach (ViewReport v in views)
        {
            StrategyReport? s = v.Document.Strategies.FirstOrDefault(x => x.Name == run.Baseline);
            w.Write($"<tr><td>{ViewLink(run, v.View.Name)}</td>");
            foreach (MetricDescriptor m in headline)
            {
                double? value = s?.Value(m.Name);
                w.Write(HtmlPage.NumberCell(value is { } x ? HtmlText.Encode(m.Format(x)) : "", value));
            }
            w.Write("</tr>\n");
        }
        w.Write("</tbody></table></div>\n</section>\n");
        HtmlPage.End(w, string.Create(Inv, $"Written by VoxProf {run.ToolVersion} (commit {run.ToolCommit}). This file is complete in itself: it loads nothing from anywhere."));
    }

    private static string ViewLink(RunDocument run, string view)
    {
        RunView? v = run.Views.FirstOrDefault(x => x.Name == view);
        return v is null ? HtmlText.Encode(view) : $"<a href=\"{HtmlText.Encode(v.Folder + "/" + OutputNames.ReportHtml)}\">{HtmlText.Encode(view)}</a>";
    }
}
