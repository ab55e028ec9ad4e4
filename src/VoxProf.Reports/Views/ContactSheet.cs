using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using SixLabors.ImageSharp.Processing;
using VoxProf.Reports.Images;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;

namespace VoxProf.Reports.Views;

/// <summary>
/// worst-views.png: the heatmaps of the views that cost most, side by side, each shrunk to a thumbnail under a caption
/// naming the view and its value. Each thumbnail keeps its view's own heatmap scale (printed in its legend); trace
/// with --range for one scale across all views.
/// </summary>
public static class ContactSheet
{
    public const string FileName = "worst-views.png";

    /// <summary>Most views shown.</summary>
    public const int MaxViews = 8;

    public const int Columns = 4;

    public const int ThumbWidth = 320;

    private static readonly Rgba32 Background = new(24, 26, 31, 255);

    /// <summary>
    /// The strategy (the views' baseline), the heatmap (the first drawn whose mean is a metric, or else the first) and
    /// the metric the views are ranked by; null when no view drew a heatmap.
    /// </summary>
    public static ContactSheetInfo? Choose(IReadOnlyList<ViewReport> views, IReadOnlyList<MetricDescriptor> metrics, string? baseline)
    {
        if (views.Count == 0 || baseline is null)
            return null;
        string[] maps = views[0].Document.Run.Heatmaps;
        if (maps.Length == 0)
            return null;
        string map = maps.FirstOrDefault(h => metrics.Any(m => m.Name == MetricCatalogue.Name(h, "mean"))) ?? maps[0];
        MetricDescriptor? metric = metrics.FirstOrDefault(m => m.Name == MetricCatalogue.Name(map, "mean"))
            ?? metrics.FirstOrDefault(m => m.Group == map && m.Better != Better.Neutral);
        if (metric is null)
            return null;
        string[] worst = RunSummary.WorstFirst(views, baseline, metric).Take(MaxViews).Select(v => v.View).ToArray();
        return worst.Length == 0 ? null : new ContactSheetInfo(FileName, baseline, map, metric.Name, worst);
    }

    /// <param name="directory">The run's working folder: the views' heatmaps are read from their folders inside it.</param>
    public static Image<Rgba32> Render(ContactSheetInfo info, IReadOnlyList<ViewReport> views, MetricDescriptor metric, string sceneName, string directory)
    {
        var thumbs = new List<(Image<Rgba32> Image, string Caption)>();
        try
        {
            foreach (string name in info.Views)
            {
                ViewReport view = views.First(v => v.View.Name == name);
                string path = Path.Combine(directory, view.View.Folder, OutputNames.Heatmap(info.Strategy, info.Map));
                if (!File.Exists(path))
                    continue;
                var image = Image.Load<Rgba32>(path);
                // Only the picture: the heatmap's own title band and legend would fill a thumbnail with small text.
                var (x0, y0) = Html.InlineImage.PictureOrigin(File.ReadAllBytes(path));
                var run = view.Document.Run;
                if (x0 + run.Width <= image.Width && y0 + run.Height <= image.Height)
                    image.Mutate(x => x.Crop(new Rectangle(x0, y0, run.Width, run.Height)));
                int height = Math.Max(1, (int)Math.Round((double)image.Height * ThumbWidth / image.Width));
                image.Mutate(x => x.Resize(ThumbWidth, height, KnownResamplers.Box));
                double? value = view.Document.Strategies.FirstOrDefault(s => s.Name == info.Strategy)?.Value(metric.Name);
                thumbs.Add((image, value is { } v ? $"{name} {metric.Format(v)}" : name));
            }
            return Compose(info, thumbs, sceneName);
        }
        finally
        {
            foreach (var t in thumbs)
                t.Image.Dispose();
        }
    }

    private static Image<Rgba32> Compose(ContactSheetInfo info, List<(Image<Rgba32> Image, string Caption)> thumbs, string sceneName)
    {
        const int scale = 2, gap = 8;
        int captionHeight = TitleBand.Height(1, scale);
        int columns = Math.Max(1, Math.Min(Columns, thumbs.Count));
        int rows = (thumbs.Count + columns - 1) / columns;
        int cellHeight = thumbs.Count == 0 ? 0 : thumbs.Max(t => t.Image.Height) + captionHeight;
        int width = columns * ThumbWidth + (columns + 1) * gap;
        var title = new ImageTitle([sceneName, $"worst views by {info.Metric}", info.Strategy, info.Map],
            [$"{thumbs.Count} of the run's views, worst first", "each at its own heatmap scale (see its folder)"]);
        var lines = TitleBand.Wrap(title, width, 2);
        int top = TitleBand.Height(lines.Count, 2);
        var sheet = new Image<Rgba32>(width, top + rows * (cellHeight + gap) + gap, Background);
        TitleBand.Draw(sheet, lines, 2);
        for (int i = 0; i < thumbs.Count; i++)
        {
            int x = gap + i % columns * (ThumbWidth + gap);
            int y = top + gap + i / columns * (cellHeight + gap);
            PixelFont.Draw(sheet, x + TitleBand.TextLeft(scale), y + TitleBand.LineTop(0, scale), Fit(thumbs[i].Caption, scale), TitleBand.HeadingInk, scale);
            Image<Rgba32> thumb = thumbs[i].Image;
            sheet.Mutate(c => c.DrawImage(thumb, new Point(x, y + captionHeight), 1f));
        }
        Png.AddText(sheet, "Strategy", info.Strategy);
        Png.AddText(sheet, "Counter", info.Map);
        Png.AddText(sheet, "Views", string.Join(",", info.Views));
        return sheet;
    }

    private static string Fit(string text, int scale)
    {
        int n = PixelFont.CharactersIn(ThumbWidth - 2 * TitleBand.TextLeft(scale), scale);
        return text.Length <= n ? text : text[..Math.Max(0, n)];
    }
}
