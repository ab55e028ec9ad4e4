using System.Buffers.Binary;
using System.Collections;
using VoxProf.Core.Geometry;
using VoxProf.Core.Scenes;
using VoxProf.Core.Scenes.Import;
using VoxProf.Core.Scenes.Layers;

namespace VoxProf.Tests.Scenes;

public class RawLayerTests
{
    private static readonly Box3i Extent = new(0, 0, 0, 64, 48, 64);

    /// <summary>A 30 × 20 × 26 volume: a solid block in one corner, random bytes elsewhere, empty on top.</summary>
    private static byte[] Volume(int sx, int sy, int sz)
    {
        var rng = new Random(23);
        var data = new byte[sx * sy * sz];
        for (int z = 0; z < sz; z++)
            for (int y = 0; y < sy; y++)
                for (int x = 0; x < sx; x++)
                {
                    byte v = x < 17 && y < 9 && z < 16 ? (byte)(1 + rng.Next(255))
                        : y >= 14 ? (byte)0
                        : rng.Next(4) == 0 ? (byte)rng.Next(256) : (byte)0;
                    data[(z * sy + y) * sx + x] = v;
                }
        return data;
    }

    [Theory]
    [InlineData(0, 0, 0)]
    [InlineData(5, 3, 7)]
    [InlineData(-6, 2, 45)]
    public void Classify_is_conservative_and_fill_agrees_with_contains(int ox, int oy, int oz)
    {
        var layer = new RawLayer(LayerOp.Add, 8, Volume(30, 20, 26), 30, 20, 26, ox, oy, oz, Extent);
        var tally = LayerChecks.ClassifyIsConservative(layer, Extent, seed: 18, regions: 600, maxSize: 16);
        LayerChecks.FillAgreesWithContains(layer, Extent, seed: 19);
        tally.None.Should().BeGreaterThan(0);
        tally.Full.Should().BeGreaterThan(0);
    }

    [Fact]
    public void Any_non_zero_byte_is_inside_and_zero_is_outside()
    {
        var data = new byte[8];
        data[1] = 1;
        data[6] = 255;
        var layer = new RawLayer(LayerOp.Add, 8, data, 2, 2, 2, 10, 10, 10, Extent);
        var inside = new List<(int, int, int)>();
        LayerChecks.ForEach(new Box3i(10, 10, 10, 12, 12, 12), (x, y, z) =>
        {
            if (layer.Contains(x, y, z))
                inside.Add((x, y, z));
        });
        // Byte 1 is (x 1, y 0, z 0) and byte 6 is (x 0, y 1, z 1): x fastest, then y, then z.
        inside.Should().Equal((11, 10, 10), (10, 11, 11));
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(0.5)]
    [InlineData(1.0)]
    [InlineData(127.0)]
    [InlineData(254.9)]
    [InlineData(255.0)]
    [InlineData(-3.0)]
    [InlineData(double.NaN)]
    public void Byte_samples_are_inside_exactly_when_above_the_threshold(double threshold)
    {
        // Every byte value, in a length that is no multiple of any vector width, so the tail is read too.
        byte[] samples = Enumerable.Range(0, 1000).Select(i => (byte)(i * 37 % 256)).ToArray();
        ulong[] mask = VolumeFiles.ReadMask(new MemoryStream(samples), samples.Length, VoxelType.U8, false, threshold, "v.raw", 0);
        Words32(mask).Should().Equal(Packed(samples.Select(v => v > threshold)));
    }

    [Theory]
    [InlineData(VoxelType.U8, false)]
    [InlineData(VoxelType.U16, false)]
    [InlineData(VoxelType.U16, true)]
    [InlineData(VoxelType.F32, false)]
    [InlineData(VoxelType.F32, true)]
    public void Samples_over_several_chunks_land_on_the_right_bits(VoxelType type, bool bigEndian)
    {
        // More samples than one read chunk (65,536) and no multiple of 64, so chunk seams and the last partial word
        // are both crossed.
        const int count = 2 * 65536 + 77;
        var rng = new Random(31);
        double[] values = Enumerable.Range(0, count).Select(_ => (double)rng.Next(256)).ToArray();
        int size = VolumeFiles.SizeOf(type);
        var bytes = new byte[count * size];
        for (int i = 0; i < count; i++)
        {
            Span<byte> b = bytes.AsSpan(i * size, size);
            switch (type)
            {
                case VoxelType.U8: b[0] = (byte)values[i]; break;
                case VoxelType.U16:
                    if (bigEndian) BinaryPrimitives.WriteUInt16BigEndian(b, (ushort)(values[i] * 200));
                    else BinaryPrimitives.WriteUInt16LittleEndian(b, (ushort)(values[i] * 200));
                    values[i] *= 200;
                    break;
                default:
                    if (bigEndian) BinaryPrimitives.WriteSingleBigEndian(b, (float)values[i] / 7);
                    else BinaryPrimitives.WriteSingleLittleEndian(b, (float)values[i] / 7);
                    values[i] = (float)values[i] / 7;
                    break;
            }
        }
        double threshold = type == VoxelType.U16 ? 100 * 200 : type == VoxelType.F32 ? 100.0 / 7 : 100;
        ulong[] mask = VolumeFiles.ReadMask(new MemoryStream(bytes), count, type, bigEndian, threshold, "v.raw", 0);
        Words32(mask).Should().Equal(Packed(values.Select(v => v > threshold)));
    }

    /// <summary>
    /// The bits packed by System.Collections.BitArray, the standard library's own bit packing (element i is bit i mod 32
    /// of word i / 32), as the reference for the mask's layout.
    /// </summary>
    private static int[] Packed(IEnumerable<bool> inside)
    {
        var bits = new BitArray(inside.ToArray());
        var words = new int[(bits.Length + 63) / 64 * 2];
        bits.CopyTo(words, 0);
        return words;
    }

    /// <summary>The mask's 64-bit words as 32-bit halves, low half first, to set beside <see cref="Packed"/>.</summary>
    private static int[] Words32(ulong[] mask) => mask.SelectMany(w => new[] { (int)(uint)w, (int)(uint)(w >> 32) }).ToArray();
}
