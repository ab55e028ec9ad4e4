using SixLabors.ImageSharp;
using SixLabors.ImageSharp.Formats.Png;
using SixLabors.ImageSharp.PixelFormats;
using StbImageSharp;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Colour;
using VoxProf.Reports.Images;

namespace VoxProf.Tests.Reports;

public class ImageTests
{
    private static ImageResult Decode(Image<Rgba32> image)
    {
        using var ms = new MemoryStream();
        Png.Save(image, ms);
        // StbImageSharp is an independent PNG decoder, so this checks the encoded file, not ImageSharp's own view of it.
        return ImageResult.FromMemory(ms.ToArray(), ColorComponents.RedGreenBlueAlpha);
    }

    private static Rgba32 At(ImageResult img, int x, int y)
    {
        int i = (y * img.Width + x) * 4;
        return new Rgba32(img.Data[i], img.Data[i + 1], img.Data[i + 2], img.Data[i + 3]);
    }

    [Fact]
    public void Heatmap_decodes_to_image_size_plus_legend_with_ramp_colours_at_known_costs()
    {
        uint[] values = new uint[20 * 10];
        values[0] = 0;
        values[5] = 50;
        values[19] = 100;
        values[9 * 20 + 3] = 500; // beyond the range: clamped to the top colour
        var scale = new HeatmapScale(ScaleKind.Linear, 0, 100);
        using var image = HeatmapImage.Render(values, 20, 10, scale);

        ImageResult png = Decode(image);

        png.Width.Should().Be(20);
        png.Height.Should().Be(10 + Legend.Height);
        At(png, 0, 0).Should().Be(SequentialRamp.Map(0));
        At(png, 5, 0).Should().Be(SequentialRamp.Map(0.5));
        At(png, 19, 0).Should().Be(SequentialRamp.Map(1));
        At(png, 3, 9).Should().Be(SequentialRamp.Map(1));
    }

    [Fact]
    public void Legend_bar_runs_from_the_lowest_to_the_highest_ramp_colour_with_labels_below()
    {
        uint[] values = new uint[200 * 4];
        using var image = HeatmapImage.Render(values, 200, 4, new HeatmapScale(ScaleKind.Linear, 0, 1000));

        ImageResult png = Decode(image);

        int barY = 4 + Legend.BarTop + Legend.BarHeight / 2;
        var (left, right) = Legend.BarSpan(200);
        At(png, left, barY).Should().Be(SequentialRamp.Map(0));
        At(png, right, barY).Should().Be(SequentialRamp.Map(1));
        At(png, 0, barY).Should().Be(Legend.Background);
        // The "0" label's top row sits centred under the first tick; its top-left pixel is set.
        int labelY = 4 + Legend.LabelTop;
        int zeroLeft = left - PixelFont.MeasureWidth("0", Legend.FontScale) / 2;
        At(png, zeroLeft, labelY).Should().Be(Legend.Ink);
        // Somewhere on the label row a "1k" label for the top tick has been drawn.
        Enumerable.Range(150, 50).Count(x => At(png, x, labelY + 1) == Legend.Ink).Should().BeGreaterThan(0);
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

    [Theory]
    [InlineData(0, "0")]
    [InlineData(7, "7")]
    [InlineData(12.5, "12.5")]
    [InlineData(1500, "1.5k")]
    [InlineData(2_000_000, "2M")]
    [InlineData(3e9, "3e9")]
    [InlineData(-250, "-250")]
    public void Tick_labels_are_short_and_culture_independent(double value, string expected)
    {
        TickFormat.Compact(value).Should().Be(expected);
        foreach (char c in expected)
            PixelFont.Supports(c).Should().BeTrue();
    }

    [Fact]
    public void Pixel_font_draws_the_digit_one_as_its_glyph()
    {
        using var image = new Image<Rgba32>(3, 5);
        PixelFont.Draw(image, 0, 0, "1", Legend.Ink, 1);
        string[] rows = [".#.", "##.", ".#.", ".#.", "###"];
        for (int y = 0; y < 5; y++)
            for (int x = 0; x < 3; x++)
                (image[x, y] == Legend.Ink).Should().Be(rows[y][x] == '#', $"pixel ({x},{y})");
    }

    [Fact]
    public void Png_text_metadata_carries_strategy_and_counter()
    {
        using var image = HeatmapImage.Render(new uint[4], 2, 2, HeatmapScale.Auto(ScaleKind.Linear, 1));
        Png.AddText(image, "Strategy", "dda-mask");
        Png.AddText(image, "Counter", "iterations");
        using var ms = new MemoryStream();
        Png.Save(image, ms);

        ms.Position = 0;
        using var back = Image.Load(ms);
        var text = back.Metadata.GetPngMetadata().TextData.ToDictionary(t => t.Keyword, t => t.Value);
        text["Strategy"].Should().Be("dda-mask");
        text["Counter"].Should().Be("iterations");
        // Independent check: the tEXt chunk is in the file as Latin-1 keyword NUL value.
        System.Text.Encoding.Latin1.GetString(ms.ToArray()).Should().Contain("tEXtStrategy\0dda-mask");
    }

    [Fact]
    public void Preview_shows_sky_for_misses_and_shades_faces_apart()
    {
        PixelHit[] hits = [new() { Hit = true, X = 1, Material = 3, Face = HitFace.PosY }, new(), new() { Hit = true, X = 2, Material = 3, Face = HitFace.NegX }];

        ImageResult preview = Decode(PreviewImage.Render(hits, 3, 1));

        At(preview, 1, 0).Should().Be(PreviewImage.Sky);
        At(preview, 0, 0).Should().NotBe(At(preview, 2, 0), "faces are shaded differently");
    }

    [Fact]
    public void Mismatch_image_marks_differing_pixels_rings_them_and_dims_the_rest()
    {
        const int w = 12, h = 6;
        var reference = new PixelHit[w * h];
        for (int i = 0; i < reference.Length; i++)
            reference[i] = new PixelHit { Hit = true, X = i, Material = 2, Face = HitFace.PosY };
        var hits = (PixelHit[])reference.Clone();
        hits[2 * w + 3].X = 999;

        ImageResult mismatch = Decode(PreviewImage.RenderMismatch(hits, reference, w, h));
        ImageResult preview = Decode(PreviewImage.Render(reference, w, h));

        At(mismatch, 3, 2).Should().Be(PreviewImage.Marker);
        At(mismatch, 5, 4).Should().Be(PreviewImage.Halo, "two pixels away is inside the ring");
        At(mismatch, 6, 2).Should().NotBe(PreviewImage.Halo);
        At(mismatch, 6, 2).Should().NotBe(PreviewImage.Marker);
        Oklab.FromSrgb(At(mismatch, 10, 5)).L.Should().BeLessThan(Oklab.FromSrgb(At(preview, 10, 5)).L, "the preview is dimmed");
    }
}

public class DifferenceImageTests
{
    [Fact]
    public void Difference_image_is_near_white_at_zero_and_takes_the_ramp_ends_at_the_range()
    {
        double[] diffs = [0, -10, 10, 25, -5, 5];
        using var image = DifferenceImage.Render(diffs, 3, 2, maxAbs: 10);

        using var ms = new MemoryStream();
        Png.Save(image, ms);
        // StbImageSharp: an independent PNG decoder.
        var png = ImageResult.FromMemory(ms.ToArray(), ColorComponents.RedGreenBlueAlpha);
        Rgba32 At(int x, int y)
        {
            int i = (y * png.Width + x) * 4;
            return new Rgba32(png.Data[i], png.Data[i + 1], png.Data[i + 2], png.Data[i + 3]);
        }

        png.Height.Should().Be(2 + Legend.Height);
        At(0, 0).Should().Be(DivergingRamp.Map(0));
        At(1, 0).Should().Be(DivergingRamp.Map(-1));
        At(2, 0).Should().Be(DivergingRamp.Map(1));
        At(0, 1).Should().Be(DivergingRamp.Map(1), "beyond the range takes the end colour");
        Oklab.FromSrgb(At(1, 1)).L.Should().BeApproximately(Oklab.FromSrgb(At(2, 1)).L, 0.006);
        DifferenceImage.LegendTicks(10, v => TickFormat.Compact(v, signed: true)).Select(t => t.Label)
            .Should().Equal("-10", "-5", "0", "+5", "+10");
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
