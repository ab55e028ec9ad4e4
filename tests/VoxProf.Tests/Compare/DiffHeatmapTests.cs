using SixLabors.ImageSharp.PixelFormats;
using StbImageSharp;
using VoxProf.Reports.Colour;
using VoxProf.Reports.Compare;
using VoxProf.Reports.Images;

namespace VoxProf.Tests.Compare;

public class DiffHeatmapTests
{
    private static ImageResult Decode(SixLabors.ImageSharp.Image<Rgba32> image)
    {
        using var stream = new MemoryStream();
        Png.Save(image, stream);
        // Independent decoder (StbImageSharp), so the check does not rest on the encoder reading its own output.
        return ImageResult.FromMemory(stream.ToArray(), ColorComponents.RedGreenBlue);
    }

    private static Rgba32 At(ImageResult img, int x, int y)
    {
        var i = (y * img.Width + x) * 3;
        return new Rgba32(img.Data[i], img.Data[i + 1], img.Data[i + 2], 255);
    }

    [Fact]
    public void Pixels_take_the_diverging_ramp_colour_of_their_place_on_the_symmetric_scale()
    {
        long[] diff = [-4, 0, 4, 2, 0, 0];
        bool[] changed = [false, false, false, false, true, true];

        using var image = DiffHeatmap.Render(diff, changed, 3, 2, maxAbs: 4);
        var decoded = Decode(image);

        decoded.Width.Should().Be(3);
        decoded.Height.Should().Be(2 + Legend.Height);
        At(decoded, 0, 0).Should().Be(DivergingRamp.Map(-1));
        At(decoded, 1, 0).Should().Be(DivergingRamp.Map(0));
        At(decoded, 2, 0).Should().Be(DivergingRamp.Map(1));
        At(decoded, 0, 1).Should().Be(DivergingRamp.Map(0.5));
    }

    [Fact]
    public void Pixels_whose_hit_changed_are_a_black_and_white_checker()
    {
        long[] diff = new long[4 * 2];
        bool[] changed = [true, true, true, true, false, true, true, false];

        using var image = DiffHeatmap.Render(diff, changed, 4, 2, maxAbs: 0);
        var decoded = Decode(image);

        At(decoded, 0, 0).Should().Be(DiffHeatmap.MarkDark, "x + y even gives the dark square");
        At(decoded, 1, 0).Should().Be(DiffHeatmap.MarkLight);
        At(decoded, 1, 1).Should().Be(DiffHeatmap.MarkDark);
        At(decoded, 0, 1).Should().Be(DivergingRamp.Map(0), "an unchanged hit with no cost change is the zero colour");
    }
}
