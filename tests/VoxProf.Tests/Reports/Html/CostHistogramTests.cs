using System.Xml.Linq;
using VoxProf.Reports.Html;

namespace VoxProf.Tests.Reports.Html;

public class CostHistogramTests
{
    [Theory]
    [InlineData(0.3, 1)]
    [InlineData(1, 1)]
    [InlineData(2.875, 5)]
    [InlineData(11, 20)]
    [InlineData(200, 200)]
    [InlineData(201, 500)]
    public void Bin_widths_are_whole_round_numbers(double raw, long expected) =>
        CostHistogram.WholeStep(raw).Should().Be(expected);

    [Fact]
    public void Every_pixel_lands_in_exactly_one_bin_and_the_range_top_has_a_bin()
    {
        uint[] values = [.. Enumerable.Range(0, 10).Select(i => (uint)i), 50, 51];

        var h = CostHistogram.Build(values, range: 9, mean: 7, p90: 9, maxBins: 5);

        h.BinWidth.Should().Be(2);
        h.Counts.Should().Equal(2, 2, 2, 2, 2);
        h.Above.Should().Be(2);
        h.Top.Should().Be(10);
        h.Pixels.Should().Be(values.Length);
    }

    [Fact]
    public void Bins_never_exceed_the_limit_and_never_split_a_whole_value()
    {
        var random = new Random(99);
        for (int trial = 0; trial < 50; trial++)
        {
            uint[] values = Enumerable.Range(0, 300).Select(_ => (uint)random.Next(0, 5000)).ToArray();
            double range = random.Next(0, 6000);
            var h = CostHistogram.Build(values, range, 0, 0, maxBins: 40);
            h.Counts.Length.Should().BeInRange(1, 40);
            h.Top.Should().BeGreaterThan((long)range, "the range's top value has a bin");
            h.Pixels.Should().Be(300);
            h.Above.Should().Be(values.Count(v => v >= h.Top));
        }
    }

    [Fact]
    public void The_svg_is_well_formed_with_bar_heights_in_proportion_to_their_counts_and_names_escaped()
    {
        var h = new CostHistogram(10, [10, 40, 20, 0], 5, Mean: 14, P90: 28);

        string svg = HistogramSvg.Render(h, "dda <&> \"x\"", "iterations");
        XElement root = XElement.Parse(svg);

        XNamespace ns = "http://www.w3.org/2000/svg";
        root.Element(ns + "title")!.Value.Should().Be("dda <&> \"x\"");
        var bars = root.Elements(ns + "rect").ToList();
        bars.Should().HaveCount(5, "four bins and the bar set apart for the pixels past the range");
        double Height(XElement r) => double.Parse(r.Attribute("height")!.Value, System.Globalization.CultureInfo.InvariantCulture);
        Height(bars[1]).Should().BeApproximately(2 * Height(bars[2]), 0.02);
        Height(bars[1]).Should().BeApproximately(4 * Height(bars[0]), 0.02);
        Height(bars[4]).Should().BeApproximately(Height(bars[0]) / 2, 0.02);
        bars[1].Element(ns + "title")!.Value.Should().Be("10–19 iterations: 40 pixels (53%)");
        bars[4].Element(ns + "title")!.Value.Should().StartWith("≥ 40 iterations: 5 pixels");
        root.Descendants(ns + "text").Select(t => t.Value).Should().Contain(["mean 14", "p90 28"]);
    }
}
