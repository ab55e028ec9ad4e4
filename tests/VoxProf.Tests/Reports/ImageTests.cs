using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Reports.Colour;
using VoxProf.Reports.Images;

namespace VoxProf.Tests.Reports;

public class ImageTests
{
    private static readonly ImageTitle Title = new(["quarry", "gate", "dda", "iterations"], ["iterations per pixel", "20x10"]);

    [Fact]
    public void Heatmap_picture_takes_the_ramp_colour_of_each_cost_and_clamps_above_the_range()
    {
        uint[] values = new uint[20 * 10];
        values[5] = 50;
        values[19] = 100;
        values[9 * 20 + 3] = 500;
        using var image = HeatmapImage.Render(values, 20, 10, new HeatmapScale(ScaleKind.Linear, 0, 100), Title);

        var png = PngPicture.Encode(image);

        (png.Width, png.Height).Should().Be((20, 10));
        png.Pixel(0, 0).Should().Be(SequentialRamp.Map(0));
        png.Pixel(5, 0).Should().Be(SequentialRamp.Map(0.5));
        png.Pixel(19, 0).Should().Be(SequentialRamp.Map(1));
        png.Pixel(3, 9).Should().Be(SequentialRamp.Map(1), "500 is beyond the range and takes the top colour");
    }

    [Fact]
    public void An_image_is_a_title_band_the_picture_and_a_legend_band_and_its_picture_chunk_says_where()
    {
        using var image = HeatmapImage.Render(new uint[640 * 30], 640, 30, new HeatmapScale(ScaleKind.Linear, 0, 100), Title);

        var png = PngPicture.Encode(image);

        int scale = ImageLayout.FontScaleFor(640);
        scale.Should().Be(2);
        // Two lines at 640 pixels: the heading, then unit, size and scale on one line of at most 52 characters.
        int title = TitleBand.Height(2, scale);
        (png.X, png.Y, png.Width, png.Height).Should().Be((0, title, 640, 30));
        png.Image.Height.Should().Be(title + 30 + Legend.Height(scale));
        png.At(0, 0).Should().Be(ImageLayout.Background);
        png.At(0, title + 30).Should().Be(ImageLayout.Background, "the legend band starts under the picture");
    }

    [Fact]
    public void A_narrow_picture_gets_an_image_wide_enough_for_its_title_and_legend()
    {
        using var image = HeatmapImage.Render(new uint[16 * 8], 16, 8, new HeatmapScale(ScaleKind.Linear, 0, 10), Title);

        var png = PngPicture.Encode(image);

        png.Image.Width.Should().Be(ImageLayout.MinWidth);
        png.Width.Should().Be(16);
        png.At(16, png.Y).Should().Be(ImageLayout.Background, "the picture is left-aligned; the rest of its rows is background");
    }

    [Fact]
    public void Legend_bar_runs_from_the_lowest_to_the_highest_ramp_colour()
    {
        using var image = HeatmapImage.Render(new uint[400 * 4], 400, 4, new HeatmapScale(ScaleKind.Linear, 0, 1000), Title);

        var png = PngPicture.Encode(image);

        int scale = ImageLayout.FontScaleFor(400);
        int barY = png.Y + png.Height + (Legend.BarTop + Legend.BarHeight / 2) * scale;
        var (left, right) = Legend.BarSpan(400, scale);
        png.At(left, barY).Should().Be(SequentialRamp.Map(0));
        png.At(right, barY).Should().Be(SequentialRamp.Map(1));
        png.At(0, barY).Should().Be(ImageLayout.Background);
    }

    [Fact]
    public void The_top_label_is_the_top_of_the_scale_marked_at_least_when_values_clip()
    {
        uint[] values = new uint[400 * 4];
        values[7] = 116;
        using var clipped = HeatmapImage.Render(values, 400, 4, new HeatmapScale(ScaleKind.Linear, 0, 115), Title);
        values[7] = 115;
        using var within = HeatmapImage.Render(values, 400, 4, new HeatmapScale(ScaleKind.Linear, 0, 115), Title);

        TopLabel(PngPicture.Encode(clipped), "≥115").Should().BeNull();
        TopLabel(PngPicture.Encode(within), "115").Should().BeNull();
        HeatmapImage.LegendTicks(new HeatmapScale(ScaleKind.Linear, 0, 115), new ScaleClip(0, 1, 1600), 6).Select(t => t.Label)
            .Should().Equal("0", "≥115", "20", "40", "60", "80", "100");
    }

    // The right end label ends flush with the bar's right end, on the label row of the legend band.
    private static string? TopLabel(PngPicture png, string text)
    {
        int scale = ImageLayout.FontScaleFor(png.Image.Width);
        var (_, right) = Legend.BarSpan(png.Image.Width, scale);
        int x = right + 1 - PixelFont.MeasureWidth(text, scale);
        int y = png.Y + png.Height + Legend.LabelTop * scale;
        return TextInPixels.Mismatch(png, x, y, text, Legend.Ink, ImageLayout.Background, scale);
    }

    [Fact]
    public void Log_scale_puts_powers_of_ten_at_even_spacing()
    {
        var scale = new HeatmapScale(ScaleKind.Log, 0, 999);
        var ticks = scale.Ticks(6);
        ticks.Select(t => t.Value).Should().Equal(0, 1, 10, 100);
        scale.Fraction(999).Should().Be(1);
        scale.Fraction(0).Should().Be(0);
        (scale.Fraction(99) - scale.Fraction(9)).Should().BeApproximately(scale.Fraction(9) - scale.Fraction(0), 1e-12);
    }

    [Fact]
    public void Wide_images_draw_the_font_larger()
    {
        ImageLayout.FontScaleFor(320).Should().Be(2);
        ImageLayout.FontScaleFor(1280).Should().Be(2);
        ImageLayout.FontScaleFor(1920).Should().Be(3);
        ImageLayout.FontScaleFor(3840).Should().Be(6);
        using var image = HeatmapImage.Render(new uint[1920 * 2], 1920, 2, new HeatmapScale(ScaleKind.Linear, 0, 10), Title);
        var png = PngPicture.Encode(image);
        TextInPixels.Mismatch(png, TitleBand.TextLeft(3), TitleBand.LineTop(0, 3), "quarry · gate", TitleBand.HeadingInk, ImageLayout.Background, 3)
            .Should().BeNull();
    }

    [Fact]
    public void Every_font_pixel_of_the_bands_survives_a_half_size_view()
    {
        // Drawn at twice its size on even coordinates, each font pixel is a whole 2×2 block: halving the image (as a
        // code review shows it inline) averages each block into one pixel of the same colour, so no stroke blurs away.
        using var image = HeatmapImage.Render(new uint[640 * 30], 640, 30, new HeatmapScale(ScaleKind.Linear, 0, 100), Title);
        var png = PngPicture.Encode(image);

        for (int y = 0; y + 1 < png.Y; y += 2)
        {
            for (int x = 0; x + 1 < png.Image.Width; x += 2)
            {
                Rgba32 c = png.At(x, y);
                (png.At(x + 1, y) == c && png.At(x, y + 1) == c && png.At(x + 1, y + 1) == c).Should().BeTrue($"block at ({x}, {y}) is one colour");
            }
        }
    }

    [Theory]
    [InlineData(0, "0")]
    [InlineData(7, "7")]
    [InlineData(12.5, "12.5")]
    [InlineData(1250, "1.25k")]
    [InlineData(1500, "1.5k")]
    [InlineData(2_000_000, "2M")]
    [InlineData(3e9, "3e9")]
    [InlineData(-250, "-250")]
    public void Tick_labels_are_short_and_culture_independent(double value, string expected)
    {
        using var _ = new CultureScope("de-DE");
        TickFormat.Compact(value).Should().Be(expected);
        foreach (char c in expected)
            PixelFont.Supports(c).Should().BeTrue();
    }

    [Theory]
    [InlineData(115.39, "115.4")]
    [InlineData(2314, "2314")]
    [InlineData(0.5, "0.5")]
    [InlineData(-17, "-17")]
    public void Title_values_keep_four_significant_digits(double value, string expected)
    {
        using var _ = new CultureScope("de-DE");
        TickFormat.Precise(value).Should().Be(expected);
    }

    [Fact]
    public void Png_text_metadata_carries_strategy_and_counter()
    {
        using var image = HeatmapImage.Render(new uint[4], 2, 2, HeatmapScale.Auto(ScaleKind.Linear, 1), Title);
        Png.AddText(image, "Strategy", "dda-mask");
        Png.AddText(image, "Counter", "iterations");

        var png = PngPicture.Encode(image);

        png.Text["Strategy"].Should().Be("dda-mask");
        png.Text["Counter"].Should().Be("iterations");
    }
}

public class HeatmapScaleTests
{
    [Theory]
    [InlineData(2637, new[] { 0.0, 500, 1000, 1500, 2000, 2500 })]
    [InlineData(1000, new[] { 0.0, 200, 400, 600, 800, 1000 })]
    [InlineData(12, new[] { 0.0, 2.5, 5, 7.5, 10 })]
    public void Linear_ticks_are_round_steps_within_the_range(double max, double[] expected)
    {
        new HeatmapScale(ScaleKind.Linear, 0, max).Ticks(6).Select(t => t.Value).Should().Equal(expected);
    }
}

public class TickFormatTests
{
    [Theory]
    [InlineData(0.25, true, "+25%")]
    [InlineData(-0.05, true, "-5%")]
    [InlineData(0.0, true, "0%")]
    [InlineData(0.125, false, "13%")] // halves round away from zero
    [InlineData(0.015, false, "1.5%")]
    public void Percent_labels_carry_a_sign_only_when_asked(double fraction, bool signed, string expected)
    {
        using var _ = new CultureScope("de-DE");
        TickFormat.Percent(fraction, signed).Should().Be(expected);
    }
}
