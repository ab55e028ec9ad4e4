using System.Buffers.Binary;
using System.Globalization;
using System.Numerics;

namespace VoxProf.Core.Scenes.Import;

/// <summary>Sample types a volume file may hold.</summary>
public enum VoxelType
{
    U8,
    U16,
    F32,
}

/// <summary>Reads typed volume samples and keeps only "value &gt; threshold" as one byte per voxel.</summary>
public static class VolumeFiles
{
    public static int SizeOf(VoxelType type) => type switch
    {
        VoxelType.U8 => 1,
        VoxelType.U16 => 2,
        _ => 4,
    };

    /// <summary>
    /// Reads <paramref name="voxels"/> samples from <paramref name="data"/> (a chunk at a time, so a float volume never
    /// sits in memory whole) and returns 1 where the value exceeds <paramref name="threshold"/>, else 0. NaN samples
    /// are empty. A stream that ends early is reported at the byte offset where it ended.
    /// </summary>
    public static byte[] ReadMask(Stream data, long voxels, VoxelType type, bool bigEndian, double threshold,
        string file, long dataOffset)
    {
        int size = SizeOf(type);
        // Every element is written below (or the read fails); huge pages where the system offers them (LargeArrays).
        byte[] mask = LargeArrays.Uninitialized<byte>(checked((int)voxels));
        var chunk = new byte[(1 << 16) * size];
        long done = 0;
        while (done < voxels)
        {
            int want = (int)Math.Min(chunk.Length, (voxels - done) * size);
            int got = 0;
            while (got < want)
            {
                int n = data.Read(chunk, got, want - got);
                if (n == 0)
                {
                    long at = dataOffset + done * size + got;
                    throw new SceneFormatException(file, FilePlace.Offset(at), string.Create(CultureInfo.InvariantCulture,
                        $"voxel data ends after {done * size + got} bytes; expected {voxels * size} ({voxels} samples of {size} bytes)"));
                }
                got += n;
            }
            Convert(chunk.AsSpan(0, want), mask.AsSpan((int)done, want / size), type, bigEndian, threshold);
            done += want / size;
        }
        return mask;
    }

    /// <summary>
    /// Bytes against the threshold, a vector at a time: a profile of a 256 MiB raw scene showed the per-byte comparison
    /// with a double at 5% of a whole trace. For a byte v, v &gt; threshold exactly when v &gt; the largest byte
    /// value not above the threshold, so one integer comparison decides (NaN compares false, as the scalar code's
    /// does: nothing is inside).
    /// </summary>
    private static void ConvertBytes(ReadOnlySpan<byte> bytes, Span<byte> mask, double threshold)
    {
        if (double.IsNaN(threshold) || threshold >= byte.MaxValue)
        {
            mask.Clear();
            return;
        }
        if (threshold < 0)
        {
            mask.Fill(1);
            return;
        }
        var limit = new Vector<byte>((byte)Math.Floor(threshold));
        var one = new Vector<byte>(1);
        int i = 0;
        for (; i <= bytes.Length - Vector<byte>.Count; i += Vector<byte>.Count)
            (Vector.GreaterThan(new Vector<byte>(bytes[i..]), limit) & one).CopyTo(mask[i..]);
        for (; i < bytes.Length; i++)
            mask[i] = bytes[i] > threshold ? (byte)1 : (byte)0;
    }

    private static void Convert(ReadOnlySpan<byte> bytes, Span<byte> mask, VoxelType type, bool bigEndian, double threshold)
    {
        switch (type)
        {
            case VoxelType.U8:
                ConvertBytes(bytes[..mask.Length], mask, threshold);
                break;
            case VoxelType.U16:
                for (int i = 0; i < mask.Length; i++)
                {
                    ReadOnlySpan<byte> b = bytes.Slice(2 * i, 2);
                    ushort v = bigEndian ? BinaryPrimitives.ReadUInt16BigEndian(b) : BinaryPrimitives.ReadUInt16LittleEndian(b);
                    mask[i] = v > threshold ? (byte)1 : (byte)0;
                }
                break;
            default:
                for (int i = 0; i < mask.Length; i++)
                {
                    ReadOnlySpan<byte> b = bytes.Slice(4 * i, 4);
                    float v = bigEndian ? BinaryPrimitives.ReadSingleBigEndian(b) : BinaryPrimitives.ReadSingleLittleEndian(b);
                    mask[i] = v > threshold ? (byte)1 : (byte)0;
                }
                break;
        }
    }
}
