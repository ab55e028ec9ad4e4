using MathNet.Numerics.Statistics;
using VoxProf.Reports.Colour;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Images;
using VoxProf.Tests.Reports;

namespace VoxProf.Tests.Compare;

public class DiffHeatmapTests
{
    private static readonly ImageTitle Title = new(["quarry", "gate", "dda", "iterations", "candidate minus base"], []);

    [Fact]
    public void Pixels_take_the_diverging_ramp_colour_of_their_place_on_the_symmetric_scale()
    {
        long[] diff = [-4, 0, 4, 2, 0, 0];
        bool[] changed = [false, false, false, false, true, true];

        var png = PngPicture.Encode(DiffHeatmap.Render(diff, changed, 3, 2, maxAbs: 4, "", Title));

        (png.Width, png.Height).Should().Be((3, 2));
        png.Pixel(0, 0).Should().Be(DivergingRamp.Map(-1));
        png.Pixel(1, 0).Should().Be(DivergingRamp.Map(0));
        png.Pixel(2, 0).Should().Be(DivergingRamp.Map(1));
        png.Pixel(0, 1).Should().Be(DivergingRamp.Map(0.5));
    }

    [Fact]
    public void Pixels_whose_hit_changed_are_a_black_and_white_checker()
    {
        long[] diff = new long[4 * 2];
        bool[] changed = [true, true, true, true, false, true, true, false];

        var png = PngPicture.Encode(DiffHeatmap.Render(diff, changed, 4, 2, maxAbs: 0, "", Title));

        png.Pixel(0, 0).Should().Be(DiffHeatmap.MarkDark, "x + y even gives the dark square");
        png.Pixel(1, 0).Should().Be(DiffHeatmap.MarkLight);
        png.Pixel(1, 1).Should().Be(DiffHeatmap.MarkDark);
        png.Pixel(0, 1).Should().Be(DivergingRamp.Map(0), "an unchanged hit with no cost change is the zero colour");
    }

    [Fact]
    public void The_range_is_the_99th_percentile_of_the_size_of_the_differences_rounded_up()
    {
        // A broad rise of 0 to 12 per pixel and one pixel that rose by 88: the range follows the broad rise.
        var diff = new long[2000];
        for (int i = 0; i < diff.Length; i++)
            diff[i] = (i * 7 % 13) * (i % 5 == 0 ? -1 : 1);
        diff[1234] = 88;

        double range = DiffHeatmap.RobustRange(diff);

        // MathNet.Numerics' R7 quantile is Hyndman & Fan definition 7, the definition VoxProf uses throughout.
        double p99 = diff.Select(d => (double)Math.Abs(d)).QuantileCustom(0.99, QuantileDefinition.R7);
        range.Should().Be(Math.Ceiling(p99));
        range.Should().BeLessThan(88);
    }

    [Fact]
    public void With_fewer_than_one_percent_of_pixels_changed_the_range_is_the_largest_change()
    {
        var diff = new long[1000];
        diff[3] = -6;
        diff[4] = 2;

        DiffHeatmap.RobustRange(diff).Should().Be(6);
        DiffHeatmap.RobustRange(new long[10]).Should().Be(0);
    }

    [Fact]
    public void A_broad_thirty_percent_rise_with_one_outlier_shows_clearly_instead_of_near_white()
    {
        // Mean cost 10 rising by 3 everywhere (+30%), one pixel by 88: on the largest-pixel scale the broad rise would
        // sit at 3/88 of the way from white; on the robust scale it is the end colour.
        var diff = Enumerable.Repeat(3L, 400).ToArray();
        diff[17] = 88;

        var png = PngPicture.Encode(DiffHeatmap.Render(diff, new bool[400], 20, 20, DiffHeatmap.RobustRange(diff), "", Title));

        png.Pixel(0, 0).Should().Be(DivergingRamp.Map(1));
        Oklab.FromSrgb(png.Pixel(0, 0)).L.Should().BeLessThan(Oklab.FromSrgb(DivergingRamp.Map(3.0 / 88)).L - 0.4);
    }
}
