using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;

namespace VoxProf.Tests.Trees;

/// <summary>Seeded scenes made of the test layers.</summary>
internal static class TestScenes
{
    public static Scene Of(int ex, int ey, int ez, params Layer[] layers) => new(ex, ey, ez, layers, [], "test");

    /// <summary>A random stack of boxes, balls, noise and hills, adding and carving, with few materials.</summary>
    public static Scene Random(int seed, int maxExtent)
    {
        var rng = new Random(seed);
        int ex = rng.Next(1, maxExtent + 1), ey = rng.Next(1, maxExtent + 1), ez = rng.Next(1, maxExtent + 1);
        var extent = new Box3i(0, 0, 0, ex, ey, ez);
        var layers = new List<Layer>();
        int count = rng.Next(1, 7);
        for (int i = 0; i < count; i++)
        {
            // Few materials, so "add the same material" and "carve empty space" both happen.
            LayerOp op = rng.Next(3) == 0 ? LayerOp.Carve : LayerOp.Add;
            byte material = (byte)rng.Next(1, 3);
            Layer layer = rng.Next(5) switch
            {
                0 => new BoxLayer(op, material, RandomBox(rng, extent), extent),
                1 => new SphereLayer(op, material, rng.NextDouble() * ex, rng.NextDouble() * ey, rng.NextDouble() * ez,
                    rng.NextDouble() * maxExtent * 0.6, extent),
                2 => new NoiseLayer(op, material, RandomBox(rng, extent), extent, (uint)rng.Next(), rng.NextDouble()),
                3 => new HillsLayer(material, rng.NextDouble() * ey, rng.NextDouble() * 6, 4 + rng.NextDouble() * 40, extent),
                _ => new VagueLayer(new BoxLayer(op, material, RandomBox(rng, extent), extent)),
            };
            layers.Add(layer);
        }
        return new Scene(ex, ey, ez, layers, [], $"random-{seed}");
    }

    private static Box3i RandomBox(Random rng, Box3i extent)
    {
        // Reach a little past the extent so clipping is exercised.
        int x0 = rng.Next(-4, extent.MaxX), y0 = rng.Next(-4, extent.MaxY), z0 = rng.Next(-4, extent.MaxZ);
        return new Box3i(x0, y0, z0,
            x0 + rng.Next(1, extent.MaxX + 8), y0 + rng.Next(1, extent.MaxY + 8), z0 + rng.Next(1, extent.MaxZ + 8));
    }
}
