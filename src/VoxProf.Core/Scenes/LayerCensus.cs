using System.Diagnostics;
using VoxProf.Core.Geometry;

namespace VoxProf.Core.Scenes;

/// <summary>What one layer decided in a scene, and what deciding it cost.</summary>
/// <param name="Voxels">
/// Voxels whose final state this layer set (no later layer contains them): solid voxels for an add layer, emptied
/// ones for a carve layer.
/// </param>
/// <param name="Voxelise">Time spent in the layer's Classify and Fill, summed over threads (wall time per call, so a busy machine inflates it).</param>
public sealed record LayerTally(long Voxels, TimeSpan Voxelise);

/// <summary>
/// A second walk over a scene, separate from the tree builder, that follows which layer last set each region:
/// regions a layer covers whole are credited to it at once, mixed blocks of 16³ are filled layer by layer. The add
/// layers' counts sum to the scene's solid voxels.
/// </summary>
public static class LayerCensus
{
    private const int BlockSide = 16;
    private const int TaskSide = 256;

    /// <param name="threads">0 means every processor; counts are the same for any number.</param>
    public static LayerTally[] Run(Scene scene, int threads = 0)
    {
        ArgumentNullException.ThrowIfNull(scene);
        Layer[] layers = [.. scene.Layers];
        Box3i extent = scene.Bounds;
        int side = BlockSide;
        while (side < Math.Max(extent.SizeX, Math.Max(extent.SizeY, extent.SizeZ)))
            side *= 2;
        int task = Math.Min(side, TaskSide);
        var cubes = new List<Box3i>();
        for (int z = 0; z < extent.MaxZ; z += task)
            for (int y = 0; y < extent.MaxY; y += task)
                for (int x = 0; x < extent.MaxX; x += task)
                    cubes.Add(Box3i.Cube(x, y, z, task));

        var voxels = new long[layers.Length];
        var ticks = new long[layers.Length];
        var gate = new object();
        int[] all = [.. Enumerable.Range(0, layers.Length)];
        Parallel.For(0, cubes.Count, new ParallelOptions { MaxDegreeOfParallelism = threads == 0 ? Environment.ProcessorCount : threads },
            () => new Walker(layers, extent),
            (i, _, walker) =>
            {
                walker.Walk(cubes[i], -1, all);
                return walker;
            },
            walker =>
            {
                lock (gate)
                {
                    for (int l = 0; l < layers.Length; l++)
                    {
                        voxels[l] += walker.Voxels[l];
                        ticks[l] += walker.Ticks[l];
                    }
                }
            });
        return [.. Enumerable.Range(0, layers.Length).Select(l => new LayerTally(voxels[l], Stopwatch.GetElapsedTime(0, ticks[l])))];
    }

    private sealed class Walker(Layer[] layers, Box3i extent)
    {
        private readonly int[] _owner = new int[BlockSide * BlockSide * BlockSide];
        private readonly bool[] _inside = new bool[BlockSide * BlockSide * BlockSide];

        public long[] Voxels { get; } = new long[layers.Length];
        public long[] Ticks { get; } = new long[layers.Length];

        public void Walk(in Box3i cube, int owner, ReadOnlySpan<int> active)
        {
            Box3i clip = cube.Intersect(extent);
            if (clip.IsEmpty)
                return;
            Span<int> touching = active.Length <= 256 ? stackalloc int[active.Length] : new int[active.Length];
            int count = 0;
            foreach (int l in active)
            {
                Layer layer = layers[l];
                if (!layer.Bounds.Intersects(clip))
                    continue;
                Box3i sub = clip.Intersect(layer.Bounds);
                long start = Stopwatch.GetTimestamp();
                Coverage c = layer.Classify(sub);
                Ticks[l] += Stopwatch.GetTimestamp() - start;
                if (c == Coverage.None)
                    continue;
                if (c == Coverage.Full && sub == clip)
                {
                    owner = l;
                    count = 0;
                    continue;
                }
                touching[count++] = l;
            }
            if (count == 0)
            {
                if (owner >= 0)
                    Voxels[owner] += clip.Volume;
                return;
            }
            if (cube.SizeX <= BlockSide)
            {
                Dense(clip, owner, touching[..count]);
                return;
            }
            int half = cube.SizeX / 2;
            for (int k = 0; k < 8; k++)
            {
                var child = Box3i.Cube(cube.MinX + (k & 1) * half, cube.MinY + ((k >> 1) & 1) * half, cube.MinZ + (k >> 2) * half, half);
                Walk(child, owner, touching[..count]);
            }
        }

        private void Dense(in Box3i clip, int owner, ReadOnlySpan<int> touching)
        {
            int volume = (int)clip.Volume;
            Span<int> owners = _owner.AsSpan(0, volume);
            owners.Fill(owner);
            int sx = clip.SizeX, sxy = sx * clip.SizeY;
            foreach (int l in touching)
            {
                Layer layer = layers[l];
                Box3i sub = clip.Intersect(layer.Bounds);
                Span<bool> inside = _inside.AsSpan(0, (int)sub.Volume);
                long start = Stopwatch.GetTimestamp();
                layer.Fill(sub, inside);
                Ticks[l] += Stopwatch.GetTimestamp() - start;
                int i = 0;
                for (int z = sub.MinZ; z < sub.MaxZ; z++)
                    for (int y = sub.MinY; y < sub.MaxY; y++)
                        for (int x = sub.MinX; x < sub.MaxX; x++, i++)
                            if (inside[i])
                                owners[(z - clip.MinZ) * sxy + (y - clip.MinY) * sx + (x - clip.MinX)] = l;
            }
            foreach (int o in owners)
            {
                if (o >= 0)
                    Voxels[o]++;
            }
        }
    }
}
