using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;

namespace VoxProf.Core.Trees.Building;

internal sealed partial class BuildWorker
{
    // One dense block at a time: materials, and one layer's inside test, x fastest.
    private readonly byte[] _voxels;
    private readonly bool[] _inside;
    private int _side;

    /// <summary>Evaluates a mixed block voxel by voxel with the layers that touch it, then builds it bottom-up.</summary>
    private CellResult BuildDense(int level, int x0, int y0, int z0, byte baseMaterial, ReadOnlySpan<int> layers)
    {
        int side = _plan.SideAt(level);
        var block = Box3i.Cube(x0, y0, z0, side);
        Box3i clip = block.Intersect(_plan.Extent);
        Span<byte> voxels = _voxels.AsSpan(0, side * side * side);
        if (clip == block)
        {
            voxels.Fill(baseMaterial);
        }
        else
        {
            voxels.Clear();
            if (baseMaterial != 0)
                FillBox(voxels, side, block, clip, baseMaterial);
        }

        foreach (int index in layers)
        {
            Layer layer = _plan.Layers[index];
            Box3i sub = clip.Intersect(layer.Bounds);
            if (sub.IsEmpty)
                continue;
            Span<bool> inside = _inside.AsSpan(0, (int)sub.Volume);
            layer.Fill(sub, inside);
            Stamp(voxels, side, block, sub, inside, layer.Material);
        }

        // Classification is conservative: a block called mixed may still be empty or one material.
        if (voxels.IndexOfAnyExcept(voxels[0]) < 0)
            return CellResult.Uniform(voxels[0]);
        _side = side;
        return DenseNode(level, 0, 0, 0);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private CellResult DenseNode(int level, int lx, int ly, int lz)
    {
        int n = _plan.N;
        var acc = new CellAccumulator(level * MaxCells);
        if (level == _plan.Depth - 1)
        {
            // Leaf: its cells are voxels.
            ReadOnlySpan<byte> voxels = _voxels;
            int side = _side;
            if (n == 4 && UniformBrick(voxels, (lz * side + ly) * side + lx, side) is int uniform and >= 0)
                return CellResult.Uniform((byte)uniform);
            int bit = 0;
            for (int cz = 0; cz < n; cz++)
            {
                for (int cy = 0; cy < n; cy++)
                {
                    int row = (((lz + cz) * side) + ly + cy) * side + lx;
                    for (int cx = 0; cx < n; cx++, bit++)
                    {
                        byte m = voxels[row + cx];
                        if (m != 0)
                            AddSolid(ref acc, bit, m);
                    }
                }
            }
            return Finish(ref acc);
        }

        int shift = _plan.CellShift(level);
        int log2N = _plan.Log2N;
        int low = n - 1;
        for (int bit = 0; bit < _plan.CellsPerNode; bit++)
        {
            CellResult r = DenseNode(level + 1,
                lx + ((bit & low) << shift),
                ly + (((bit >> log2N) & low) << shift),
                lz + ((bit >> (2 * log2N)) << shift));
            Add(ref acc, bit, r);
        }
        return Finish(ref acc);
    }

    /// <summary>The material of a 4×4×4 brick that is one material throughout, else -1.</summary>
    /// <remarks>
    /// Most bricks of a block that crosses a surface lie wholly above or below it; reading a row of four voxels as
    /// one 32-bit word settles those with 16 compares instead of 64 byte tests.
    /// </remarks>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static int UniformBrick(ReadOnlySpan<byte> voxels, int start, int side)
    {
        uint first = MemoryMarshal.Read<uint>(voxels[start..]);
        if (first != (first & 0xFF) * 0x01010101u)
            return -1;
        for (int cz = 0; cz < 4; cz++)
        {
            for (int cy = 0; cy < 4; cy++)
            {
                if (MemoryMarshal.Read<uint>(voxels[(start + (cz * side + cy) * side)..]) != first)
                    return -1;
            }
        }
        return (int)(first & 0xFF);
    }

    private static void FillBox(Span<byte> voxels, int side, in Box3i block, in Box3i box, byte material)
    {
        for (int z = box.MinZ; z < box.MaxZ; z++)
        {
            for (int y = box.MinY; y < box.MaxY; y++)
            {
                int row = (((z - block.MinZ) * side) + y - block.MinY) * side + box.MinX - block.MinX;
                voxels.Slice(row, box.SizeX).Fill(material);
            }
        }
    }

    /// <summary>Writes <paramref name="material"/> where the layer's inside test is true.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void Stamp(Span<byte> voxels, int side, in Box3i block, in Box3i sub, ReadOnlySpan<bool> inside, byte material)
    {
        ReadOnlySpan<byte> flags = MemoryMarshal.AsBytes(inside);
        if (sub == block)
        {
            // The layer covers the whole block: one contiguous run.
            Blend(voxels, flags, material);
            return;
        }
        int width = sub.SizeX;
        int i = 0;
        for (int z = sub.MinZ; z < sub.MaxZ; z++)
        {
            for (int y = sub.MinY; y < sub.MaxY; y++, i += width)
            {
                int row = (((z - block.MinZ) * side) + y - block.MinY) * side + sub.MinX - block.MinX;
                Blend(voxels.Slice(row, width), flags.Slice(i, width), material);
            }
        }
    }

    /// <summary>voxels[i] = flags[i] != 0 ? material : voxels[i], a vector at a time.</summary>
    /// <remarks>Branch-free, because rows that cross a surface mix inside and outside voxels unpredictably.</remarks>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void Blend(Span<byte> voxels, ReadOnlySpan<byte> flags, byte material)
    {
        int i = 0;
        if (Vector.IsHardwareAccelerated && voxels.Length >= Vector<byte>.Count)
        {
            var fill = new Vector<byte>(material);
            for (; i <= voxels.Length - Vector<byte>.Count; i += Vector<byte>.Count)
            {
                var inside = Vector.GreaterThan(new Vector<byte>(flags[i..]), Vector<byte>.Zero);
                Vector.ConditionalSelect(inside, fill, new Vector<byte>(voxels[i..])).CopyTo(voxels[i..]);
            }
        }
        for (; i < voxels.Length; i++)
        {
            if (flags[i] != 0)
                voxels[i] = material;
        }
    }
}
