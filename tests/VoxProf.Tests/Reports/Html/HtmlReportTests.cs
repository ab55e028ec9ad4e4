using System.Text.Json;
using System.Text.RegularExpressions;
using VoxProf.Core.Scenes;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Export;
using VoxProf.Reports.Html;
using VoxProf.Reports.Images;
using VoxProf.Reports.Metrics;
using VoxProf.Reports.Model;
using VoxProf.Tests.Compare;

namespace VoxProf.Tests.Reports.Html;

/// <summary>report.html read as text: self-contained, complete, and carrying exactly the trace's per-pixel data.</summary>
public sealed partial class HtmlReportTests : IDisposable
{
    private readonly TempDir _tmp = new();

    public void Dispose() => _tmp.Dispose();

    private string Write(TraceRun run, ReportOptions? options = null)
    {
        ReportResult result = ReportWriter.WriteAll(run, options ?? TestRuns.Options, _tmp.Path);
        result.Failures.Should().BeEmpty();
        return File.ReadAllText(Path.Combine(_tmp.Path, OutputNames.ReportHtml));
    }

    [Fact]
    public void The_page_loads_nothing_every_image_is_a_data_uri_and_a_policy_forbids_fetching()
    {
        string html = Write(TestRuns.Small());

        html.Should().Contain($"<meta http-equiv=\"Content-Security-Policy\" content=\"{HtmlPage.ContentSecurityPolicy}\">");
        SourceAttributes().Matches(html).Select(m => m.Groups[1].Value).Should().OnlyContain(v => v.StartsWith("data:image/png;base64,"));
        html.Should().NotContain("<link").And.NotContain("@import").And.NotContain("url(").And.NotContain("<iframe");
        // The only address in the file is the SVG namespace, which names and never fetches.
        Addresses().Matches(html).Select(m => m.Value).Distinct().Should().Equal("http://www.w3.org/2000/svg");
    }

    [Fact]
    public void Every_heatmap_written_is_inlined_byte_for_byte_behind_its_strategy_and_map()
    {
        string html = Write(TestRuns.Small());

        foreach (string file in Directory.GetFiles(_tmp.Path, "heatmap-*.png"))
        {
            string name = Path.GetFileNameWithoutExtension(file); // heatmap-STRATEGY-MAP
            string uri = "data:image/png;base64," + Convert.ToBase64String(File.ReadAllBytes(file));
            var image = ImageTags().Matches(html).Single(m => m.Value.Contains(uri, StringComparison.Ordinal)).Value;
            string strategy = Attribute(image, "data-strategy"), map = Attribute(image, "data-map");
            name.Should().Be($"heatmap-{strategy}-{map}");
        }
        ImageTags().Matches(html).Count.Should().Be(2 * 3 + 2, "six heatmaps, dda's mismatch image and the preview");
    }

    [Fact]
    public void The_embedded_pixel_data_decodes_to_the_traced_counters_and_hits()
    {
        TraceRun run = TestRuns.Small();
        string html = Write(run);

        using JsonDocument data = JsonDocument.Parse(Block(html, "vp-data", "application/json"));
        var root = data.RootElement;
        root.GetProperty("counters").EnumerateArray().Select(c => c.GetString()).Should().Equal(CounterNames.All.Select(c => c.Name()));
        var strategies = root.GetProperty("strategies").EnumerateArray().ToList();
        strategies.Should().HaveCount(run.Results.Count);
        for (int s = 0; s < run.Results.Count; s++)
        {
            StrategyResult r = run.Results[s];
            JsonElement entry = strategies[s];
            entry.GetProperty("name").GetString().Should().Be(r.Strategy.Name);
            string blob = entry.GetProperty("blob").GetString()!;
            bool ownHits = entry.GetProperty("hits").GetString() == blob;
            int count = CounterNames.Count + (ownHits ? PixelPack.HitPlanes.Count : 0);
            int[][] planes = PixelPack.Decode(Convert.FromBase64String(Block(html, blob, "application/octet-stream")), count, r.Width * r.Height);
            for (int c = 0; c < CounterNames.Count; c++)
                planes[c].Select(v => unchecked((uint)v)).Should().Equal(r.Counters[c], $"{r.Strategy.Name} {CounterNames.All[c].Name()}");
            if (!ownHits)
                continue;
            List<int[]> expected = PixelPack.HitPlaneValues(r.Hits);
            List<int[]> first = PixelPack.HitPlaneValues(run.Results[0].Hits);
            bool relative = entry.GetProperty("hitsRelativeTo").ValueKind == JsonValueKind.String;
            for (int p = 0; p < expected.Count; p++)
            {
                int[] stored = planes[CounterNames.Count + p];
                int[] value = relative ? stored.Select((d, i) => unchecked(d + first[p][i])).ToArray() : stored;
                value.Should().Equal(expected[p], $"{r.Strategy.Name} {PixelPack.HitPlanes[p]}");
            }
        }
    }

    [Fact]
    public void The_strategy_table_has_summary_md_s_metrics_under_their_names_and_marks_the_baseline()
    {
        // Calibrated, so that predicted-ms is among summary.md's columns too.
        string html = Write(TestRuns.Small(), TestRuns.Options with { Calibration = TestRuns.Calibration });

        string table = html[html.IndexOf("<table class=\"sortable\" id=\"strategy-table\">", StringComparison.Ordinal)..];
        table = table[..table.IndexOf("</table>", StringComparison.Ordinal)];
        var headers = Regex.Matches(table, "<button type=\"button\">([^<]*)</button>").Select(m => m.Groups[1].Value);
        headers.Should().Equal(["strategy", .. MetricColumns.For(MetricColumns.Summary, prepass: false, memory: true).Select(c => c.Metric)]);
        table.Should().Contain("<tr class=\"baseline\" data-strategy=\"dda\">", "the first tree strategy is the default baseline");
    }

    [Fact]
    public void Names_from_a_scene_file_cannot_break_out_of_the_page()
    {
        TraceRun small = TestRuns.Small();
        var scene = new Scene(64, 32, 64, [], small.Scene.Cameras, "</script><b>yard", "/scenes/yard.json", "ab12cd");
        var run = new TraceRun(scene, small.Camera with { Name = "gate\"><img src=x>" }, small.Settings, small.Tree, small.Results);

        string html = Write(run);

        html.Should().NotContain("</script><b>").And.NotContain("<img src=x>");
        html.Should().Contain("&lt;/script&gt;&lt;b&gt;yard");
    }

    [Fact]
    public void No_html_writes_no_page_and_summary_md_then_does_not_link_one()
    {
        ReportWriter.WriteAll(TestRuns.Small(), TestRuns.Options with { Html = false }, _tmp.Path);

        File.Exists(Path.Combine(_tmp.Path, OutputNames.ReportHtml)).Should().BeFalse();
        File.ReadAllText(Path.Combine(_tmp.Path, OutputNames.SummaryMarkdown)).Should().NotContain("report.html");
    }

    [Fact]
    public void The_readout_finds_the_picture_below_the_title_band_from_the_png_s_own_text_chunk()
    {
        var (image, layout) = ImageLayout.Create(300, 40, new ImageTitle(["yard / gate"], ["dda", "iterations"]), (_, scale) => 10 * scale);
        using var stream = new MemoryStream();
        using (image)
            Png.Save(image, stream);
        layout.DataTop.Should().BeGreaterThan(0, "the title band sits above the picture");

        InlineImage.PictureOrigin(stream.ToArray()).Should().Be((0, layout.DataTop));

        using var plain = new SixLabors.ImageSharp.Image<SixLabors.ImageSharp.PixelFormats.Rgba32>(8, 8);
        using var plainStream = new MemoryStream();
        Png.Save(plain, plainStream);
        InlineImage.PictureOrigin(plainStream.ToArray()).Should().Be((0, 0), "an image without the chunk is all picture");
    }

    [Fact]
    public void Every_inlined_trace_image_carries_the_picture_origin_its_png_states()
    {
        string html = Write(TestRuns.Small());

        foreach (string file in Directory.GetFiles(_tmp.Path, "*.png"))
        {
            var (x, y) = InlineImage.PictureOrigin(File.ReadAllBytes(file));
            string uri = "data:image/png;base64," + Convert.ToBase64String(File.ReadAllBytes(file));
            string tag = ImageTags().Matches(html).Single(m => m.Value.Contains(uri, StringComparison.Ordinal)).Value;
            (Attribute(tag, "data-x0"), Attribute(tag, "data-y0")).Should().Be((x.ToString(), y.ToString()), Path.GetFileName(file));
        }
    }

    private static string Block(string html, string id, string type)
    {
        string open = $"<script type=\"{type}\" id=\"{id}\">";
        int start = html.IndexOf(open, StringComparison.Ordinal);
        start.Should().BeGreaterThan(0, $"block {id} exists");
        start += open.Length;
        return html[start..html.IndexOf("</script>", start, StringComparison.Ordinal)];
    }

    private static string Attribute(string tag, string name) => Regex.Match(tag, $"{name}=\"([^\"]*)\"").Groups[1].Value;

    [GeneratedRegex("\\ssrc=\"([^\"]*)\"")]
    private static partial Regex SourceAttributes();

    [GeneratedRegex("https?://[^\"'\\s<>)]+")]
    private static partial Regex Addresses();

    [GeneratedRegex("<img [^>]*>")]
    private static partial Regex ImageTags();
}
