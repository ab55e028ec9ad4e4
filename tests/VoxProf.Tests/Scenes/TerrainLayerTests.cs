using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Layers;

namespace VoxProf.Tests.Scenes;

public class TerrainLayerTests
{
    private static readonly Box3i Extent = new(0, 0, 0, 160, 96, 144);
    private static readonly TerrainSettings Hills = new(Seed: 11, Octaves: 4, Frequency: 0.02, Amplitude: 30, BaseHeight: 45);

    [Fact]
    public void Classify_is_conservative_and_fill_agrees_with_contains()
    {
        var layer = new TerrainLayer(LayerOp.Add, 1, Hills, Extent, Extent);
        var tally = LayerChecks.ClassifyIsConservative(layer, Extent, seed: 7, regions: 800, maxSize: 32);
        LayerChecks.FillAgreesWithContains(layer, Extent, seed: 8);
        tally.Full.Should().BeGreaterThan(0);
        tally.None.Should().BeGreaterThan(0);
    }

    [Fact]
    public void Aligned_power_of_two_regions_get_an_exact_answer()
    {
        // Pyramid tiles are aligned to multiples of their size, so the builder's regions hit one tile each.
        var layer = new TerrainLayer(LayerOp.Add, 1, Hills, Extent, Extent);
        foreach (int size in new[] { 4, 8, 16 })
        {
            for (int z = 0; z < Extent.MaxZ; z += size)
                for (int y = 0; y < Extent.MaxY; y += size)
                    for (int x = 0; x < Extent.MaxX; x += size)
                    {
                        var region = Box3i.Cube(x, y, z, size);
                        int inside = 0;
                        LayerChecks.ForEach(region, (a, b, c) => inside += layer.Contains(a, b, c) ? 1 : 0);
                        Coverage exact = inside == 0 ? Coverage.None : inside == region.Volume ? Coverage.Full : Coverage.Partial;
                        layer.Classify(region).Should().Be(exact, $"region {region}");
                    }
        }
    }

    [Fact]
    public void Stored_heights_equal_the_heights_computed_from_the_noise()
    {
        var layer = new TerrainLayer(LayerOp.Add, 1, Hills, Extent, Extent);
        var rng = new Random(1);
        for (int i = 0; i < 2000; i++)
        {
            int x = rng.Next(Extent.MaxX), z = rng.Next(Extent.MaxZ);
            layer.HeightAt(x, z).Should().Be(layer.ComputeHeight(x, z));
        }
    }

    [Fact]
    public void Contains_gives_the_same_answer_before_and_after_the_heights_are_built()
    {
        var layer = new TerrainLayer(LayerOp.Add, 1, Hills, Extent, Extent);
        var rng = new Random(2);
        var probes = Enumerable.Range(0, 500).Select(_ => (X: rng.Next(160), Y: rng.Next(96), Z: rng.Next(144))).ToArray();
        bool[] before = probes.Select(p => layer.Contains(p.X, p.Y, p.Z)).ToArray();
        layer.Classify(Extent); // builds the heights
        bool[] after = probes.Select(p => layer.Contains(p.X, p.Y, p.Z)).ToArray();
        after.Should().Equal(before);
        before.Should().Contain(true).And.Contain(false);
    }

    [Fact]
    public void Footprint_limits_the_columns_and_heights_clamp_to_the_extent()
    {
        var tall = new TerrainSettings(3, 3, 0.05, 500, 60);
        var footprint = new Box3i(20, 0, 30, 90, 96, 100);
        var layer = new TerrainLayer(LayerOp.Add, 1, tall, footprint, Extent);
        layer.Bounds.Should().Be(new Box3i(20, 0, 30, 90, 96, 100));
        layer.Contains(10, 0, 40).Should().BeFalse();
        int max = 0, min = int.MaxValue;
        for (int z = 30; z < 100; z++)
            for (int x = 20; x < 90; x++)
            {
                max = Math.Max(max, layer.HeightAt(x, z));
                min = Math.Min(min, layer.HeightAt(x, z));
            }
        max.Should().Be(Extent.MaxY);
        min.Should().Be(0);
        LayerChecks.ClassifyIsConservative(layer, Extent, seed: 9);
        LayerChecks.FillAgreesWithContains(layer, Extent, seed: 10);
    }

    [Fact]
    public void The_same_seed_builds_the_same_terrain_and_another_seed_a_different_one()
    {
        var a = new TerrainLayer(LayerOp.Add, 1, Hills, Extent, Extent);
        var b = new TerrainLayer(LayerOp.Add, 1, Hills, Extent, Extent);
        var c = new TerrainLayer(LayerOp.Add, 1, Hills with { Seed = 12 }, Extent, Extent);
        int differing = 0;
        for (int z = 0; z < Extent.MaxZ; z += 3)
            for (int x = 0; x < Extent.MaxX; x += 3)
            {
                a.HeightAt(x, z).Should().Be(b.HeightAt(x, z));
                differing += a.HeightAt(x, z) != c.HeightAt(x, z) ? 1 : 0;
            }
        differing.Should().BeGreaterThan(1000);
    }
}
