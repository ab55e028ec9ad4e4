using VoxProf.Core.Statistics;

namespace VoxProf.Tests.Statistics;

public class SubgroupModelTests
{
    // SIMD efficiency as defined by Aila & Laine (2009), "Understanding the efficiency of ray traversal on GPUs": the
    // share of lane slots doing useful work. Worked by hand: 31 lanes × 10 + 40 = 350 lane iterations over
    // 32 lanes × 40 = 1280 slots.
    [Fact]
    public void A_32_lane_tile_with_one_slow_lane_has_efficiency_350_over_1280()
    {
        uint[] costs = Enumerable.Repeat(10u, 32).ToArray();
        costs[13] = 40;

        SubgroupSummary s = SubgroupModel.Summarise(costs, 8, 4, SubgroupShape.Lanes32);

        s.Tiles.Should().Be(1);
        s.MeanTileMax.Should().Be(40);
        s.SimdEfficiency.Should().BeApproximately(350.0 / 1280.0, 1e-12);
        s.SimdEfficiency.Should().BeApproximately(0.2734, 1e-4);
    }

    [Fact]
    public void Mean_tile_max_averages_the_maxima_of_every_tile()
    {
        // 16×4 image: left tile all 2, right tile all 6 with one lane at 10.
        uint[] costs = new uint[16 * 4];
        for (int y = 0; y < 4; y++)
            for (int x = 0; x < 16; x++)
                costs[y * 16 + x] = x < 8 ? 2u : 6u;
        costs[2 * 16 + 12] = 10;

        SubgroupSummary s = SubgroupModel.Summarise(costs, 16, 4, SubgroupShape.Lanes32);

        s.Tiles.Should().Be(2);
        s.MeanTileMax.Should().Be(6);
        s.MaxTileMax.Should().Be(10);
        long work = 32 * 2 + 31 * 6 + 10;
        s.SimdEfficiency.Should().BeApproximately(work / (32.0 * (2 + 10)), 1e-12);
    }

    [Fact]
    public void Partial_edge_tiles_count_their_missing_lanes_as_idle_slots()
    {
        // 9×4: one full tile plus a one-column tile whose 4 real lanes cost 5.
        uint[] costs = Enumerable.Repeat(5u, 9 * 4).ToArray();

        SubgroupSummary s = SubgroupModel.Summarise(costs, 9, 4, SubgroupShape.Lanes32);

        s.Tiles.Should().Be(2);
        s.MeanTileMax.Should().Be(5);
        s.SimdEfficiency.Should().BeApproximately(36 * 5 / (32.0 * 10), 1e-12);
    }

    [Fact]
    public void All_zero_tiles_lower_the_mean_but_not_the_efficiency()
    {
        uint[] costs = new uint[16 * 8];
        for (int y = 0; y < 8; y++)
            for (int x = 0; x < 8; x++)
                costs[y * 16 + x] = 3;

        SubgroupSummary s = SubgroupModel.Summarise(costs, 16, 8, SubgroupShape.Lanes64);

        s.MeanTileMax.Should().Be(1.5);
        s.SimdEfficiency.Should().Be(1.0);
        SubgroupModel.Summarise(new uint[64], 8, 8, SubgroupShape.Lanes64).SimdEfficiency.Should().Be(1.0);
    }

    [Fact]
    public void Expanded_tile_image_gives_every_pixel_its_tile_maximum()
    {
        uint[] costs = new uint[10 * 5];
        costs[0] = 7;
        costs[4 * 10 + 9] = 3;
        var shape = SubgroupShape.Lanes32;
        uint[] tiles = new uint[shape.TilesX(10) * shape.TilesY(5)];
        SubgroupModel.TileMax(costs, 10, 5, shape, tiles);
        tiles.Should().Equal(7u, 0u, 0u, 3u);

        uint[] pixels = new uint[costs.Length];
        SubgroupModel.ExpandTiles(tiles, 10, 5, shape, pixels);
        pixels[3 * 10 + 7].Should().Be(7);
        pixels[3 * 10 + 8].Should().Be(0);
        pixels[4 * 10 + 0].Should().Be(0);
        pixels[4 * 10 + 8].Should().Be(3);
    }

    // The tile maxima by their definition, pixel by pixel: tile (x / TileWidth, y / TileHeight). The model reduces a
    // band of rows a vector at a time; sizes with partial tiles and rows shorter than a vector must agree too.
    [Theory]
    [InlineData(1, 1, 8, 4)]
    [InlineData(7, 3, 8, 4)]
    [InlineData(37, 13, 8, 4)]
    [InlineData(64, 64, 8, 8)]
    [InlineData(101, 29, 8, 8)]
    [InlineData(23, 17, 3, 5)]
    public void Tile_maxima_and_the_expanded_image_match_the_per_pixel_definition(int width, int height, int tileWidth, int tileHeight)
    {
        var random = new Random(width * 1000 + height);
        uint[] costs = [.. Enumerable.Range(0, width * height).Select(_ => random.Next(4) == 0 ? (uint)random.Next() : (uint)random.Next(50))];
        var shape = new SubgroupShape(tileWidth, tileHeight);
        int tilesX = shape.TilesX(width);
        uint[] expected = new uint[tilesX * shape.TilesY(height)];
        for (int y = 0; y < height; y++)
            for (int x = 0; x < width; x++)
                expected[y / tileHeight * tilesX + x / tileWidth] = Math.Max(expected[y / tileHeight * tilesX + x / tileWidth], costs[y * width + x]);

        uint[] tiles = Enumerable.Repeat(123u, expected.Length).ToArray();
        SubgroupModel.TileMax(costs, width, height, shape, tiles);
        uint[] pixels = new uint[costs.Length];
        SubgroupModel.ExpandTiles(tiles, width, height, shape, pixels);

        tiles.Should().Equal(expected);
        pixels.Should().Equal(Enumerable.Range(0, costs.Length).Select(i => expected[i / width / tileHeight * tilesX + i % width / tileWidth]));
    }

    [Fact]
    public void Shapes_are_named_by_their_lane_count()
    {
        SubgroupShape.Standard.Select(s => (s.Name, s.Lanes, s.TileWidth, s.TileHeight))
            .Should().Equal(("subgroup32", 32, 8, 4), ("subgroup64", 64, 8, 8));
    }
}
