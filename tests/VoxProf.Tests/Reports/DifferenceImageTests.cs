using VoxProf.Reports.Colour;
using VoxProf.Reports.Images;

namespace VoxProf.Tests.Reports;

public class DifferenceImageTests
{
    private static readonly ImageTitle Title = new(["quarry", "gate", "dda", "iterations", "candidate minus base"], []);

    [Fact]
    public void Difference_image_is_near_white_at_zero_and_takes_the_ramp_ends_at_the_range()
    {
        long[] diffs = [0, -10, 10, 25, -5, 5];
        var png = PngPicture.Encode(DifferenceImage.Render(diffs, 3, 2, maxAbs: 10, "", Title));

        png.Pixel(0, 0).Should().Be(DivergingRamp.Map(0));
        png.Pixel(1, 0).Should().Be(DivergingRamp.Map(-1));
        png.Pixel(2, 0).Should().Be(DivergingRamp.Map(1));
        png.Pixel(0, 1).Should().Be(DivergingRamp.Map(1), "beyond the range takes the end colour");
        Oklab.FromSrgb(png.Pixel(1, 1)).L.Should().BeApproximately(Oklab.FromSrgb(png.Pixel(2, 1)).L, 0.006);
    }

    [Fact]
    public void Both_end_labels_are_drawn_whole_inside_the_image_and_marked_when_differences_go_beyond()
    {
        long[] diffs = new long[300 * 2];
        diffs[0] = -40;
        diffs[1] = 17;
        diffs[2] = 90;
        var png = PngPicture.Encode(DifferenceImage.Render(diffs, 300, 2, maxAbs: 17, "", Title));

        int scale = ImageLayout.FontScaleFor(300);
        var (left, right) = Legend.BarSpan(300, scale);
        int y = png.Y + png.Height + Legend.LabelTop * scale;
        TextInPixels.Mismatch(png, left, y, "≤-17", Legend.Ink, ImageLayout.Background, scale).Should().BeNull();
        TextInPixels.Mismatch(png, right + 1 - PixelFont.MeasureWidth("≥+17", scale), y, "≥+17", Legend.Ink, ImageLayout.Background, scale)
            .Should().BeNull();
    }

    [Fact]
    public void Difference_legend_ticks_are_the_ends_zero_and_round_steps()
    {
        DifferenceImage.LegendTicks(10, new ScaleClip(0, 0, 1), 6).Select(t => t.Label).Should().Equal("-10", "+10", "-5", "0", "+5");
    }
}
