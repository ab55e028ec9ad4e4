using System.Globalization;
using VoxProf.Core.Statistics;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Export;
using VoxProf.Reports.Model;
using VoxProf.Reports.Pixels;

namespace VoxProf.Reports.Html;

/// <summary>
/// report.html: one self-contained page with the run's facts, the strategy table, every heatmap the image exporters
/// wrote (inlined as data URIs) behind a strategy and map switch, a per-pixel readout from an embedded copy of the
/// counters (<see cref="PixelPack"/>), and a cost histogram per strategy. Runs after the image exporters; an image
/// they could not write is left out of the page, not an error of its own.
/// </summary>
public sealed class HtmlReportExporter : IReportExporter
{
    public string Name => OutputNames.ReportHtml;

    // The page's per-pixel copy, with the context it was built for: most of the page's time (0.6 of 0.8 s at
    // 2560×1440), and it reads no file.
    private (ReportContext Context, PixelBlock Pixels)? _prepared;

    public bool ReadsOtherOutputs => true;

    public void Prepare(ReportContext context)
    {
        if (context.Options.Html)
            _prepared = (context, PixelBlock.Build(context.Run));
    }

    public void Export(ReportContext context, OutputDirectory output)
    {
        if (!context.Options.Html)
            return;
        PixelBlock pixels = _prepared is { } p && ReferenceEquals(p.Context, context) ? p.Pixels : PixelBlock.Build(context.Run);
        _prepared = null;
        output.WriteText(OutputNames.ReportHtml, w => Write(context, output.WorkingPath, w, pixels));
    }

    /// <param name="directory">Where the PNGs to inline were written.</param>
    /// <param name="pixels">The run's <see cref="PixelBlock"/>.</param>
    public static void Write(ReportContext context, string directory, TextWriter w, PixelBlock pixels)
    {
        ReportDocument d = context.Document;
        HtmlPage.Begin(w, $"VoxProf trace: {TracePage.Heading(d)}", "VoxProf trace", TracePage.Heading(d), TracePage.Subtitle(d));
        TracePage.Warnings(w, d);
        TracePage.StrategyTable(w, d);
        Maps(w, context, directory);
        Histograms(w, context);
        TracePage.Facts(w, d);
        HtmlPage.End(w, $"Written by VoxProf {d.ToolVersion} (commit {d.ToolCommit}). This file is complete in itself: it loads nothing from anywhere.",
            page => pixels.Write(page));
    }

    private static void Maps(TextWriter w, ReportContext context, string directory)
    {
        ReportDocument d = context.Document;
        var images = new List<(InlineImage Image, Dictionary<string, string> Keys, string Caption)>();
        foreach (StrategyReport s in d.Strategies)
        {
            foreach (string map in d.Run.Heatmaps)
            {
                if (InlineImage.Load(directory, OutputNames.Heatmap(s.Name, map)) is not { } image)
                    continue;
                HeatmapRange? range = d.Run.HeatmapRanges.FirstOrDefault(r => r.Strategy == s.Name && r.Map == map);
                string scale = range is null ? "" : string.Create(CultureInfo.InvariantCulture, $" · {range.Scale} scale {range.Min:0.##} to {range.Max:0.##}");
                images.Add((image, new() { ["strategy"] = s.Name, ["map"] = map }, $"{s.Name} · {map}{scale}"));
            }
            if (s.Files.Contains(OutputNames.Mismatch(s.Name)) && InlineImage.Load(directory, OutputNames.Mismatch(s.Name)) is { } mismatch)
                images.Add((mismatch, new() { ["strategy"] = s.Name, ["map"] = "mismatch" }, $"{s.Name} · pixels whose hit differs from grid's"));
        }
        if (InlineImage.Load(directory, OutputNames.Preview) is { } preview)
            images.Add((preview, new() { ["strategy"] = "*", ["map"] = "preview" }, "the scene as the camera sees it (the same for every strategy)"));

        var maps = d.Run.Heatmaps.Where(m => images.Any(i => i.Keys["map"] == m)).ToList();
        if (images.Any(i => i.Keys["map"] == "mismatch"))
            maps.Add("mismatch");
        if (images.Any(i => i.Keys["map"] == "preview"))
            maps.Add("preview");

        w.Write("<section id=\"maps\">\n<h2>Heatmaps</h2>\n");
        w.Write("<p>Pick a strategy and a map; hover over the image for the pixel's hit and every counter of the selected strategy; click to hold a pixel.</p>\n");
        w.Write("<div class=\"switches\">\n");
        HtmlPage.Switch(w, "strategy", "strategy", d.Strategies.Select(s => (s.Name, s.Name)), d.Run.Baseline);
        HtmlPage.Switch(w, "map", "map", maps.Select(m => (m, m)));
        // Fitted to the window, a large image has less than a screen pixel per image pixel: some cannot be pointed at.
        w.Write("<label class=\"toggle\"><input type=\"checkbox\" id=\"actual-size\"> one screen pixel per image pixel</label>\n");
        w.Write("</div>\n<div class=\"view\">\n<figure class=\"viewer\">\n");
        foreach (var (image, keys, caption) in images)
            HtmlPage.ViewerImage(w, image, keys, caption, caption);
        w.Write("<div class=\"viewer-empty\" hidden>No image for this strategy and map: a mismatch image exists only for a strategy whose hits differ from grid's.</div>\n");
        w.Write("<figcaption></figcaption>\n</figure>\n");
        Readout(w, context);
        w.Write("</div>\n</section>\n");
    }

    private static void Readout(TextWriter w, ReportContext context)
    {
        w.Write("<aside class=\"readout\" id=\"readout\" aria-live=\"polite\">\n<h3>Pixel <span id=\"ro-pixel\">–</span></h3>\n<dl>\n");
        foreach (var (id, label) in new[] { ("ro-strategy", "strategy"), ("ro-voxel", "hit voxel"), ("ro-face", "entry face"), ("ro-t", "t (voxels)"), ("ro-material", "material") })
            w.Write($"<dt>{label}</dt><dd id=\"{id}\">–</dd>\n");
        w.Write("</dl>\n<h4>Counters</h4>\n<dl id=\"ro-counters\">\n");
        // Every counter of the run: the built-in ones, then those strategies declare for themselves.
        foreach (string name in context.Document.Run.Counters)
        {
            string description = context.Statistics.SelectMany(s => s.Measures).FirstOrDefault(m => m.Name == name).Measure?.Description ?? name;
            w.Write($"<dt title=\"{HtmlText.Encode(description)}\">{HtmlText.Encode(name)}</dt><dd data-counter=\"{HtmlText.Encode(name)}\">–</dd>\n");
        }
        w.Write("</dl>\n</aside>\n");
    }

    /// <summary>Total work per pixel, per strategy; the tree strategies share bins (as their heatmaps share a scale), grid has its own.</summary>
    private static void Histograms(TextWriter w, ReportContext context)
    {
        MeasureDefinition measure = Measures.TotalIterations;
        w.Write("<section id=\"histograms\">\n<h2>Cost per pixel</h2>\n");
        w.Write($"<p>How many pixels take how many <code>{measure.Name}</code> ({HtmlText.Encode(measure.Description)}). " +
            "The tree strategies share one range, so their shapes compare; the grid reference has its own. " +
            "The last bar, set apart, holds the pixels past the range; dashed: the mean; dotted: the 90th percentile.</p>\n<div class=\"hists\">\n");
        var results = context.Run.Results;
        foreach (StrategyStatistics s in context.Statistics)
        {
            StrategyResult r = results.First(x => x.Strategy == s.Strategy);
            bool ownRange = s.Strategy == BuiltInStrategies.Grid && results.Count > 1;
            double range = context.Statistics
                .Where(o => ownRange ? o.Strategy == BuiltInStrategies.Grid : o.Strategy != BuiltInStrategies.Grid || results.Count == 1)
                .Max(o => o[measure.Name].P99);
            CounterSummary summary = s[measure.Name];
            var histogram = CostHistogram.Build(measure.Values(r), range, summary.Mean, summary.P90);
            w.Write($"<figure data-strategy=\"{s.Name}\"><figcaption>{s.Name}</figcaption>\n");
            w.Write(HistogramSvg.Render(histogram, $"{s.Name}: pixels by {measure.Name}", "iterations"));
            w.Write("\n</figure>\n");
        }
        w.Write("</div>\n</section>\n");
    }
}
