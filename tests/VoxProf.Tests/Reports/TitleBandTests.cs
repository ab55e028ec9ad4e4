using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Images;

namespace VoxProf.Tests.Reports;

public class TitleBandTests
{
    [Fact]
    public void A_heatmap_title_reads_scene_camera_strategy_counter_unit_size_and_scale_with_its_clipped_share()
    {
        uint[] values = new uint[640 * 30];
        for (int i = 0; i < 192; i++)
            values[i * 100] = 200; // 192 of 19 200 pixels, 1.0%, above the top of the scale
        var title = new ImageTitle(["quarry", "gate", "dda", "iterations"], ["iterations per pixel", "640×30"]);
        using var image = HeatmapImage.Render(values, 640, 30, new HeatmapScale(ScaleKind.Linear, 0, 100), title);

        var png = PngPicture.Encode(image);

        // 640 pixels hold 52 characters a line at twice the font's size: the details wrap between fields.
        ExpectLines(png, 2,
            ("quarry · gate · dda · iterations", true),
            ("iterations per pixel · 640×30", false),
            ("linear scale 0 to 100 · 1.0% of pixels above 100", false));
    }

    [Fact]
    public void A_mismatch_image_says_how_many_pixels_differ_and_from_which_strategy()
    {
        const int w = 300, h = 6;
        var reference = PreviewImageTests.Wall(w * h);
        var hits = (PixelHit[])reference.Clone();
        hits[2 * w + 3].X = 999;
        hits[4 * w + 100].Hit = false;
        var title = new ImageTitle(["quarry", "gate", "dda"], ["300×6"]);

        var png = PngPicture.Encode(PreviewImage.RenderMismatch(hits, reference, w, h, "grid", title));

        // 300 pixels hold 24 characters: the heading's long field breaks between words.
        ExpectLines(png, 2,
            ("quarry · gate · dda", true),
            ("2 pixels hit differently", true),
            ("from grid", true),
            ("300×6", false));
    }

    [Fact]
    public void A_word_longer_than_a_line_is_broken_where_it_must_be()
    {
        var lines = TitleBand.Wrap(new ImageTitle(["abcdefghijklmnopqrstuvwxyz0123"], []), 240, 2);

        lines.Select(l => l.Text).Should().Equal("abcdefghijklmnopqrs", "tuvwxyz0123");
    }

    private static void ExpectLines(PngPicture png, int scale, params (string Text, bool Heading)[] lines)
    {
        png.Y.Should().Be(TitleBand.Height(lines.Length, scale), "the band holds exactly these lines");
        for (int i = 0; i < lines.Length; i++)
        {
            Rgba32 ink = lines[i].Heading ? TitleBand.HeadingInk : TitleBand.DetailInk;
            TextInPixels.Mismatch(png, TitleBand.TextLeft(scale), TitleBand.LineTop(i, scale), lines[i].Text, ink, VoxProf.Reports.Images.ImageLayout.Background, scale)
                .Should().BeNull($"line {i} reads \"{lines[i].Text}\"");
        }
    }
}
