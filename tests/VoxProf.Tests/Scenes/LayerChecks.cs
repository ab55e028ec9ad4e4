using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;

namespace VoxProf.Tests.Scenes;

/// <summary>Differential checks of a layer's fast paths (Classify, Fill) against its exact voxel test.</summary>
internal static class LayerChecks
{
    /// <summary>How often each answer came back, so a test can insist the fast path is not always Partial.</summary>
    public sealed record Tally(int Full, int None, int Partial);

    /// <summary>
    /// Classifies many seeded random regions (some grid-aligned like the tree builder's, some arbitrary, some
    /// poking out of the extent) and checks every Full and None answer voxel by voxel with Contains.
    /// </summary>
    public static Tally ClassifyIsConservative(Layer layer, Box3i extent, int seed, int regions = 400, int maxSize = 24)
    {
        var rng = new Random(seed);
        int full = 0, none = 0, partial = 0;
        for (int n = 0; n < regions; n++)
        {
            Box3i region = RandomRegion(rng, extent, maxSize, aligned: n % 2 == 0);
            Coverage c = layer.Classify(region);
            if (c == Coverage.Partial)
            {
                partial++;
                continue;
            }
            bool expected = c == Coverage.Full;
            if (c == Coverage.Full)
                full++;
            else
                none++;
            ForEach(region, (x, y, z) =>
            {
                if (layer.Contains(x, y, z) != expected)
                    throw new Xunit.Sdk.XunitException($"{layer.Kind}: Classify({region}) = {c} but Contains({x},{y},{z}) = {!expected}");
            });
        }
        return new Tally(full, none, partial);
    }

    /// <summary>Fill must write exactly what Contains says, in x, then y, then z order.</summary>
    public static void FillAgreesWithContains(Layer layer, Box3i extent, int seed, int regions = 60, int maxSize = 40)
    {
        var rng = new Random(seed);
        for (int n = 0; n < regions; n++)
        {
            Box3i region = RandomRegion(rng, extent, maxSize, aligned: n % 3 == 0);
            var inside = new bool[region.Volume + 5];
            inside.AsSpan().Fill(true); // stale values must be overwritten
            layer.Fill(region, inside.AsSpan(0, (int)region.Volume));
            int i = 0;
            ForEach(region, (x, y, z) =>
            {
                if (inside[i++] != layer.Contains(x, y, z))
                    throw new Xunit.Sdk.XunitException($"{layer.Kind}: Fill({region}) disagrees with Contains at ({x},{y},{z})");
            });
            inside[^1].Should().BeTrue("Fill must not write past the region");
        }
    }

    public static Box3i RandomRegion(Random rng, Box3i extent, int maxSize, bool aligned)
    {
        if (aligned)
        {
            int size = 1 << rng.Next(0, 1 + (int)Math.Log2(maxSize));
            int x = rng.Next(0, Math.Max(1, extent.SizeX / size)) * size;
            int y = rng.Next(0, Math.Max(1, extent.SizeY / size)) * size;
            int z = rng.Next(0, Math.Max(1, extent.SizeZ / size)) * size;
            return Box3i.Cube(x, y, z, size);
        }
        int sx = rng.Next(1, maxSize + 1), sy = rng.Next(1, maxSize + 1), sz = rng.Next(1, maxSize + 1);
        int x0 = rng.Next(extent.MinX - 4, extent.MaxX + 4 - sx);
        int y0 = rng.Next(extent.MinY - 4, extent.MaxY + 4 - sy);
        int z0 = rng.Next(extent.MinZ - 4, extent.MaxZ + 4 - sz);
        return new Box3i(x0, y0, z0, x0 + sx, y0 + sy, z0 + sz);
    }

    public static void ForEach(Box3i region, Action<int, int, int> action)
    {
        for (int z = region.MinZ; z < region.MaxZ; z++)
            for (int y = region.MinY; y < region.MaxY; y++)
                for (int x = region.MinX; x < region.MaxX; x++)
                    action(x, y, z);
    }

    public static long CountInside(Layer layer, Box3i region)
    {
        long count = 0;
        var inside = new bool[region.SizeX * region.SizeY];
        for (int z = region.MinZ; z < region.MaxZ; z++)
        {
            var slab = new Box3i(region.MinX, region.MinY, z, region.MaxX, region.MaxY, z + 1);
            layer.Fill(slab, inside);
            foreach (bool b in inside)
                count += b ? 1 : 0;
        }
        return count;
    }
}
