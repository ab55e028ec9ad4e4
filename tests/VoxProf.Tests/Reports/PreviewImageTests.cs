using VoxProf.Core.Traversal;
using VoxProf.Reports.Colour;
using VoxProf.Reports.Images;

namespace VoxProf.Tests.Reports;

public class PreviewImageTests
{
    private static readonly ImageTitle Title = new(["quarry", "gate", "preview (grid)"], []);

    [Fact]
    public void Preview_shows_sky_for_misses_the_palette_for_hits_and_shades_faces_apart()
    {
        PixelHit[] hits =
        [
            new() { Hit = true, X = 1, Material = 3, Face = HitFace.PosY },
            new(),
            new() { Hit = true, X = 2, Material = 3, Face = HitFace.NegX },
        ];

        var png = PngPicture.Encode(PreviewImage.Render(hits, 3, 1, Title));

        png.Pixel(1, 0).Should().Be(PreviewImage.Sky);
        png.Pixel(0, 0).Should().Be(MaterialPalette.Material(3));
        png.Pixel(2, 0).Should().Be(MaterialPalette.Shade(3, HitFace.NegX));
        Oklab.FromSrgb(png.Pixel(2, 0)).L.Should().BeLessThan(Oklab.FromSrgb(png.Pixel(0, 0)).L, "-x is lit less than +y");
    }

    [Fact]
    public void Preview_legend_has_a_swatch_for_each_material_in_view_and_for_the_sky()
    {
        PixelHit[] hits = [new() { Hit = true, Material = 7 }, new() { Hit = true, Material = 2 }, new()];

        PreviewImage.MaterialSwatches(hits).Should().Equal(
            new Swatch(null, "material"),
            new Swatch(MaterialPalette.Material(2), "2"),
            new Swatch(MaterialPalette.Material(7), "7"),
            new Swatch(PreviewImage.Sky, "sky: no hit"));
    }

    [Fact]
    public void Mismatch_image_marks_differing_pixels_rings_them_and_shows_the_rest_in_dim_grey()
    {
        const int w = 12, h = 6;
        var reference = Wall(w * h);
        var hits = (PixelHit[])reference.Clone();
        hits[2 * w + 3].X = 999;

        var mismatch = PngPicture.Encode(PreviewImage.RenderMismatch(hits, reference, w, h, "grid", Title));

        mismatch.Pixel(3, 2).Should().Be(PreviewImage.Marker);
        mismatch.Pixel(5, 4).Should().Be(PreviewImage.Halo, "two pixels away is inside the ring");
        var far = mismatch.Pixel(11, 5);
        far.Should().NotBe(PreviewImage.Halo);
        (far.R == far.G && far.G == far.B).Should().BeTrue("away from the marks the preview is grey, so the marks are the only colour");
        Oklab.FromSrgb(far).L.Should().BeLessThan(Oklab.FromSrgb(MaterialPalette.Material(2)).L, "and dimmed");
    }

    [Fact]
    public void A_few_differing_pixels_also_get_a_locator_ring_that_stays_inside_the_picture()
    {
        const int w = 80, h = 40;
        var reference = new PixelHit[w * h];
        var hits = (PixelHit[])reference.Clone();
        hits[20 * w + 40] = new PixelHit { Hit = true, Material = 1 };

        var png = PngPicture.Encode(PreviewImage.RenderMismatch(hits, reference, w, h, "grid", Title));

        int radius = PreviewImage.LocatorRadius * ImageLayout.FontScaleFor(png.Image.Width);
        png.Pixel(40 + radius - 1, 20).Should().Be(PreviewImage.Marker, "the ring passes one radius from the pixel");
        png.Pixel(40 + radius / 2, 20).Should().NotBe(PreviewImage.Marker, "inside the ring the preview shows");
    }

    /// <summary>Every pixel hits its own voxel of material 2 through the top face.</summary>
    internal static PixelHit[] Wall(int pixels) =>
        Enumerable.Range(0, pixels).Select(i => new PixelHit { Hit = true, X = i, Material = 2, Face = HitFace.PosY }).ToArray();
}
