using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;

namespace VoxProf.Tests.Scenes;

public class ScatterLayerTests
{
    private static readonly Box3i Extent = new(0, 0, 0, 128, 96, 128);

    [Theory]
    [InlineData(1, 1, 300)]
    [InlineData(1, 4, 200)]
    [InlineData(6, 9, 40)]
    public void Classify_is_conservative_and_fill_agrees_with_contains(int minSize, int maxSize, int count)
    {
        var layer = new ScatterLayer(LayerOp.Add, 5, 21, count, minSize, maxSize, new Box3i(8, 4, 8, 120, 90, 120), Extent);
        var tally = LayerChecks.ClassifyIsConservative(layer, Extent, seed: 15, regions: 600, maxSize: 16);
        LayerChecks.FillAgreesWithContains(layer, Extent, seed: 16);
        tally.None.Should().BeGreaterThan(0);
        if (minSize > 4)
            tally.Full.Should().BeGreaterThan(0, "small regions inside a large clump are Full");
    }

    [Fact]
    public void Regions_touching_no_clump_are_none_even_when_large()
    {
        var extent = new Box3i(0, 0, 0, 4096, 1024, 4096);
        var layer = new ScatterLayer(LayerOp.Add, 5, 3, 5000, 1, 2, extent, extent);
        var rng = new Random(17);
        int checkedRegions = 0;
        for (int i = 0; i < 3000; i++)
        {
            Box3i region = LayerChecks.RandomRegion(rng, extent, 256, aligned: i % 2 == 0);
            bool touches = layer.Clumps.Any(c => c.Intersects(region));
            if (touches)
                layer.Classify(region).Should().NotBe(Coverage.None);
            else
            {
                layer.Classify(region).Should().Be(Coverage.None, $"region {region} touches no clump");
                checkedRegions++;
            }
        }
        checkedRegions.Should().BeGreaterThan(100);
    }

    [Fact]
    public void Clumps_are_seeded_and_lie_inside_the_region()
    {
        var region = new Box3i(10, 20, 30, 60, 70, 80);
        var a = new ScatterLayer(LayerOp.Add, 5, 99, 500, 1, 3, region, Extent);
        var b = new ScatterLayer(LayerOp.Add, 5, 99, 500, 1, 3, region, Extent);
        var c = new ScatterLayer(LayerOp.Add, 5, 100, 500, 1, 3, region, Extent);
        a.Clumps.Should().Equal(b.Clumps);
        a.Clumps.Should().NotEqual(c.Clumps);
        a.Clumps.Should().OnlyContain(k => region.ContainsBox(k) && !k.IsEmpty);
    }
}
