using System.Buffers.Binary;
using System.Globalization;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;

namespace VoxProf.Core.Scenes.Import;

/// <summary>Sample types a volume file may hold.</summary>
public enum VoxelType
{
    U8,
    U16,
    F32,
}

/// <summary>Reads typed volume samples and keeps only "value &gt; threshold", as one bit per voxel.</summary>
public static class VolumeFiles
{
    /// <summary>Samples a chunk holds: a multiple of 64, so every chunk but the last fills whole words of the mask.</summary>
    private const int ChunkSamples = 1 << 16;

    public static int SizeOf(VoxelType type) => type switch
    {
        VoxelType.U8 => 1,
        VoxelType.U16 => 2,
        _ => 4,
    };

    /// <summary>Words of a bit mask of <paramref name="voxels"/> voxels.</summary>
    public static long MaskWords(long voxels) => (voxels + 63) >> 6;

    /// <summary>
    /// Reads <paramref name="voxels"/> samples from <paramref name="data"/> (a chunk at a time, so a float volume never
    /// sits in memory whole) and returns the voxels whose value exceeds <paramref name="threshold"/> as bits: sample i
    /// is bit i mod 64 of word i / 64. One bit a voxel, so a 256 MiB byte volume takes 32 MiB (a byte a voxel made the
    /// first touch of that memory a tenth of a whole trace of such a scene: docs/performance.md). NaN samples are
    /// empty. A stream that ends early is reported at the byte offset where it ended.
    /// </summary>
    public static ulong[] ReadMask(Stream data, long voxels, VoxelType type, bool bigEndian, double threshold,
        string file, long dataOffset)
    {
        int size = SizeOf(type);
        // Every word is written below (or the read fails); huge pages where the system offers them (LargeArrays).
        ulong[] mask = LargeArrays.Uninitialized<ulong>(checked((int)MaskWords(voxels)));
        var chunk = new byte[ChunkSamples * size];
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
            int samples = want / size;
            Convert(chunk.AsSpan(0, want), mask.AsSpan((int)(done >> 6), (int)MaskWords(samples)), samples, type, bigEndian, threshold);
            done += samples;
        }
        return mask;
    }

    /// <summary>The bit mask of a byte per voxel (non-zero is inside), for volumes made in memory.</summary>
    public static ulong[] Pack(ReadOnlySpan<byte> voxels)
    {
        var mask = new ulong[MaskWords(voxels.Length)];
        Convert(voxels, mask, voxels.Length, VoxelType.U8, false, 0);
        return mask;
    }

    /// <summary>
    /// Bytes against the threshold, sixteen at a time, for the whole words of <paramref name="bytes"/>; returns how many
    /// words it wrote. For a byte v, v &gt; threshold exactly when v &gt; the largest byte value not above the
    /// threshold, so one unsigned integer comparison decides, and each comparison's sign bits are the mask's bits.
    /// Thresholds no byte can pass or fail (NaN, 255 and above, below 0) are left to the sample-by-sample loop.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static int ConvertByteWords(ReadOnlySpan<byte> bytes, Span<ulong> words, double threshold)
    {
        if (!Vector128.IsHardwareAccelerated || !(threshold >= 0 && threshold < byte.MaxValue))
            return 0;
        Vector128<byte> limit = Vector128.Create((byte)Math.Floor(threshold));
        ref byte first = ref MemoryMarshal.GetReference(bytes);
        int w = 0;
        for (; (w + 1) * 64 <= bytes.Length; w++)
        {
            nuint at = (nuint)(w * 64);
            words[w] = Vector128.GreaterThan(Vector128.LoadUnsafe(ref first, at), limit).ExtractMostSignificantBits()
                | (ulong)Vector128.GreaterThan(Vector128.LoadUnsafe(ref first, at + 16), limit).ExtractMostSignificantBits() << 16
                | (ulong)Vector128.GreaterThan(Vector128.LoadUnsafe(ref first, at + 32), limit).ExtractMostSignificantBits() << 32
                | (ulong)Vector128.GreaterThan(Vector128.LoadUnsafe(ref first, at + 48), limit).ExtractMostSignificantBits() << 48;
        }
        return w;
    }

    /// <summary>
    /// <paramref name="samples"/> samples of <paramref name="type"/> into the mask's <paramref name="words"/>: the byte
    /// samples' whole words a vector at a time, every other word sample by sample (a NaN sample compares false: empty).
    /// </summary>
    private static void Convert(ReadOnlySpan<byte> bytes, Span<ulong> words, int samples, VoxelType type, bool bigEndian, double threshold)
    {
        int done = type == VoxelType.U8 ? ConvertByteWords(bytes[..samples], words, threshold) : 0;
        for (int w = done; w < words.Length; w++)
        {
            ulong bits = 0;
            int end = Math.Min(64, samples - w * 64);
            for (int j = 0; j < end; j++)
            {
                int i = w * 64 + j;
                bool inside;
                if (type == VoxelType.U8)
                {
                    inside = bytes[i] > threshold;
                }
                else if (type == VoxelType.U16)
                {
                    ReadOnlySpan<byte> b = bytes.Slice(2 * i, 2);
                    inside = (bigEndian ? BinaryPrimitives.ReadUInt16BigEndian(b) : BinaryPrimitives.ReadUInt16LittleEndian(b)) > threshold;
                }
                else
                {
                    ReadOnlySpan<byte> b = bytes.Slice(4 * i, 4);
                    inside = (bigEndian ? BinaryPrimitives.ReadSingleBigEndian(b) : BinaryPrimitives.ReadSingleLittleEndian(b)) > threshold;
                }
                if (inside)
                    bits |= 1UL << j;
            }
            words[w] = bits;
        }
    }
}
