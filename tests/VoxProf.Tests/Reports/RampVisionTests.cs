using SixLabors.ImageSharp.PixelFormats;
using VoxProf.Core.Traversal;
using VoxProf.Reports.Colour;

namespace VoxProf.Tests.Reports;

/// <summary>
/// The ramps read in order in grey and for readers with a colour-vision deficiency, checked numerically.
/// </summary>
public class RampVisionTests
{
    // Machado, Oliveira & Fernandes (2009), "A physiologically-based model for simulation of color vision
    // deficiency", IEEE TVCG 15(6): the severity 1.0 matrices of protanopia, deuteranopia and tritanopia, applied to
    // linear RGB, as published with the paper and reproduced in the colorspacious library (cvd.py).
    public static readonly TheoryData<string> Deficiencies = new() { "protanopia", "deuteranopia", "tritanopia" };

    private static readonly Dictionary<string, double[,]> Machado = new()
    {
        ["protanopia"] = new[,] { { 0.152286, 1.052583, -0.204868 }, { 0.114503, 0.786281, 0.099216 }, { -0.003882, -0.048116, 1.051998 } },
        ["deuteranopia"] = new[,] { { 0.367322, 0.860646, -0.227968 }, { 0.280085, 0.672501, 0.047413 }, { -0.011820, 0.042940, 0.968881 } },
        ["tritanopia"] = new[,] { { 1.255528, -0.076749, -0.178779 }, { -0.078411, 0.930809, 0.147602 }, { 0.004733, 0.691367, 0.303900 } },
    };

    /// <summary>
    /// Smallest Oklab distance two neighbouring legend steps must keep. From memory: an Oklab ΔE of about 0.02 is
    /// near a just-noticeable difference between neighbouring patches; 0.025 leaves some room.
    /// </summary>
    private const double Distinguishable = 0.025;

    /// <summary>Legend-level steps: at most 11 labelled ticks, so 16 steps are finer than any legend reads.</summary>
    private const int Steps = 16;

    [Fact]
    public void Sequential_ramp_keeps_its_order_in_both_usual_greyscale_conversions()
    {
        ReadOnlySpan<Rgba32> colours = SequentialRamp.Colours;
        for (int i = 1; i < colours.Length; i++)
        {
            Greyscale.Luminance(colours[i]).Should().BeGreaterThan(Greyscale.Luminance(colours[i - 1]), $"relative luminance, entry {i}");
            Greyscale.Luma(colours[i]).Should().BeGreaterThan(Greyscale.Luma(colours[i - 1]), $"Rec. 709 luma, entry {i}");
        }
    }

    [Theory]
    [MemberData(nameof(Deficiencies))]
    public void Sequential_ramp_keeps_its_lightness_order_and_distinct_steps_for_a_colour_vision_deficiency(string deficiency)
    {
        Oklab[] seen = SequentialRamp.Colours.ToArray().Select(c => Simulate(deficiency, c)).ToArray();

        for (int i = 1; i < seen.Length; i++)
            seen[i].L.Should().BeGreaterThan(seen[i - 1].L, $"entry {i} stays lighter than entry {i - 1}");
        MinimumStep(seen).Should().BeGreaterThanOrEqualTo(Distinguishable);
    }

    [Fact]
    public void Diverging_ramp_darkens_from_zero_towards_both_ends_in_lightness_and_in_grey()
    {
        foreach (Rgba32[] side in DivergingSides())
        {
            for (int k = 1; k < side.Length; k++)
            {
                Oklab.FromSrgb(side[k]).L.Should().BeLessThan(Oklab.FromSrgb(side[k - 1]).L, $"step {k} from zero");
                Greyscale.Luminance(side[k]).Should().BeLessThan(Greyscale.Luminance(side[k - 1]), $"relative luminance, step {k}");
                Greyscale.Luma(side[k]).Should().BeLessThan(Greyscale.Luma(side[k - 1]), $"Rec. 709 luma, step {k}");
            }
        }
    }

    [Theory]
    [MemberData(nameof(Deficiencies))]
    public void Diverging_ramp_keeps_its_order_steps_and_two_signs_apart_for_a_colour_vision_deficiency(string deficiency)
    {
        Rgba32[][] sides = DivergingSides();
        foreach (Rgba32[] side in sides)
        {
            // Every eighth entry (32 steps a side): finer than that, 8-bit rounding after the simulation is noise.
            Oklab[] seen = side.Where((_, k) => k % 8 == 0).Select(c => Simulate(deficiency, c)).ToArray();
            for (int k = 1; k < seen.Length; k++)
                seen[k].L.Should().BeLessThan(seen[k - 1].L, $"step {k * 8} from zero");
            MinimumStep(side.Select(c => Simulate(deficiency, c)).ToArray()).Should().BeGreaterThanOrEqualTo(Distinguishable);
        }
        // A rise and a fall of the same size must not look alike, from a fifth of the range on.
        for (int k = sides[0].Length / 5; k < sides[0].Length; k++)
            Distance(Simulate(deficiency, sides[0][k]), Simulate(deficiency, sides[1][k])).Should().BeGreaterThanOrEqualTo(0.05, $"±{k}");
    }

    [Fact]
    public void Diverging_ramp_is_lightest_at_zero_and_equally_light_at_equal_distances()
    {
        double atZero = Oklab.FromSrgb(DivergingRamp.Map(0)).L;
        for (int i = 1; i <= 100; i++)
        {
            double d = i / 100.0;
            DivergingRamp.Design(-d).L.Should().BeApproximately(DivergingRamp.Design(d).L, 1e-12);
            double neg = Oklab.FromSrgb(DivergingRamp.Map(-d)).L;
            double pos = Oklab.FromSrgb(DivergingRamp.Map(d)).L;
            neg.Should().BeApproximately(pos, 0.006, $"±{d} must look equally light");
            neg.Should().BeLessThan(atZero);
        }
        Oklab.FromSrgb(DivergingRamp.Map(-1)).B.Should().BeLessThan(0, "negative differences are blue");
        Oklab.FromSrgb(DivergingRamp.Map(1)).A.Should().BeGreaterThan(0, "positive differences are rust");
        DivergingRamp.MapBar(0.5).Should().Be(DivergingRamp.Map(0));
    }

    [Fact]
    public void The_preview_sky_is_apart_from_every_shaded_material_and_the_first_twelve_materials_from_each_other()
    {
        Oklab sky = Oklab.FromSrgb(MaterialPalette.Sky);
        for (int m = 1; m < 256; m++)
        {
            for (int f = 0; f < MaterialPalette.Faces; f++)
            {
                Oklab c = Oklab.FromSrgb(MaterialPalette.Shade((byte)m, (HitFace)f));
                Distance(sky, c).Should().BeGreaterThanOrEqualTo(0.1, $"material {m}, face {(HitFace)f}");
                c.L.Should().BeLessThan(sky.L, "the sky is lighter than any lit material");
            }
        }
        for (int a = 1; a <= 12; a++)
        {
            for (int b = a + 1; b <= 12; b++)
                Distance(Oklab.FromSrgb(MaterialPalette.Material((byte)a)), Oklab.FromSrgb(MaterialPalette.Material((byte)b))).Should().BeGreaterThanOrEqualTo(0.1, $"{a} against {b}");
        }
    }

    /// <summary>Both halves of the diverging ramp, each from zero out to its end.</summary>
    private static Rgba32[][] DivergingSides()
    {
        Rgba32[] all = DivergingRamp.Colours.ToArray();
        int mid = all.Length / 2;
        return [all[..(mid + 1)].Reverse().ToArray(), all[mid..]];
    }

    /// <summary>Smallest distance between neighbours when the colours are cut into <see cref="Steps"/> equal steps.</summary>
    private static double MinimumStep(Oklab[] colours)
    {
        double min = double.MaxValue;
        for (int s = 1; s <= Steps; s++)
            min = Math.Min(min, Distance(colours[(s - 1) * (colours.Length - 1) / Steps], colours[s * (colours.Length - 1) / Steps]));
        return min;
    }

    private static Oklab Simulate(string deficiency, Rgba32 c)
    {
        double[,] m = Machado[deficiency];
        double r = Srgb.FromByte(c.R), g = Srgb.FromByte(c.G), b = Srgb.FromByte(c.B);
        double Channel(int row) => Math.Clamp(m[row, 0] * r + m[row, 1] * g + m[row, 2] * b, 0, 1);
        return Oklab.FromLinearSrgb(Channel(0), Channel(1), Channel(2));
    }

    private static double Distance(Oklab a, Oklab b) =>
        Math.Sqrt((a.L - b.L) * (a.L - b.L) + (a.A - b.A) * (a.A - b.A) + (a.B - b.B) * (a.B - b.B));
}
