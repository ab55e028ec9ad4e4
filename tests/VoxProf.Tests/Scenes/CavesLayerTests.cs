using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;

namespace VoxProf.Tests.Scenes;

public class CavesLayerTests
{
    private static readonly Box3i Extent = new(0, 0, 0, 96, 64, 96);
    private static readonly Box3i Region = new(10, 5, 10, 80, 50, 70);

    [Theory]
    [InlineData(CaveShape.Tunnels, 0.12)]
    [InlineData(CaveShape.Chambers, 0.2)]
    public void Classify_is_conservative_and_fill_agrees_with_contains(CaveShape shape, double threshold)
    {
        var layer = new CavesLayer(LayerOp.Carve, 0, new CaveSettings(5, shape, threshold, 2, 0.05, 1.5), Region, Extent);
        var tally = LayerChecks.ClassifyIsConservative(layer, Extent, seed: 11);
        LayerChecks.FillAgreesWithContains(layer, Extent, seed: 12);
        tally.None.Should().BeGreaterThan(0, "regions outside the cave region are None");
        long inside = LayerChecks.CountInside(layer, Region);
        inside.Should().BeInRange(1, Region.Volume - 1, "the threshold leaves both solid and open voxels");
    }

    [Fact]
    public void Thresholds_beyond_the_noise_bound_classify_the_whole_region()
    {
        var never = new CavesLayer(LayerOp.Carve, 0, new CaveSettings(5, CaveShape.Chambers, 1.6, 1, 0.05), Region, Extent);
        var always = new CavesLayer(LayerOp.Carve, 0, new CaveSettings(5, CaveShape.Tunnels, 1.6, 1, 0.05), Region, Extent);
        var inner = new Box3i(20, 20, 20, 40, 40, 40);
        never.Classify(inner).Should().Be(Coverage.None);
        always.Classify(inner).Should().Be(Coverage.Full);
        LayerChecks.ClassifyIsConservative(never, Extent, seed: 13);
        LayerChecks.ClassifyIsConservative(always, Extent, seed: 14);
    }
}
