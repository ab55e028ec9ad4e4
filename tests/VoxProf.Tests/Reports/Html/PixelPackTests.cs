using VoxProf.Core.Traversal;
using VoxProf.Reports.Html;
using VoxProf.Reports.Pixels;

namespace VoxProf.Tests.Reports.Html;

public class PixelPackTests
{
    private static byte[] Varints(params int[][] planes)
    {
        using var stream = new MemoryStream();
        PixelPack.WriteVarints(planes, stream);
        return stream.ToArray();
    }

    // Protocol Buffers encoding guide (protobuf.dev, "Encoding": base 128 varints and ZigZag): 150 is 96 01, and
    // ZigZag maps 0, -1, 1, -2, 2147483647, -2147483648 to 0, 1, 2, 3, 4294967294, 4294967295.
    [Fact]
    public void Varints_and_zigzag_match_the_protocol_buffers_worked_examples()
    {
        Varints([75]).Should().Equal(0x96, 0x01); // zigzag(75) = 150
        // Values 0, -1, 0, -2, 0 are the deltas 0, -1, 1, -2, 2 from the pixel before: ZigZag 0, 1, 2, 3, 4.
        Varints([0, -1, 0, -2, 0]).Should().Equal(0x00, 0x01, 0x02, 0x03, 0x04);
    }

    [Fact]
    public void Zigzag_deltas_match_the_protocol_buffers_table_at_the_extremes()
    {
        // Deltas from the start value 0: 2147483647 → 4294967294 = FE FF FF FF 0F; then -1 - 2147483647 wraps to
        // -2147483648 → 4294967295 = FF FF FF FF 0F.
        Varints([int.MaxValue, -1]).Should().Equal(0xFE, 0xFF, 0xFF, 0xFF, 0x0F, 0xFF, 0xFF, 0xFF, 0xFF, 0x0F);
    }

    // RFC 1950: a zlib stream starts with CMF = 0x78 (deflate, 32 KiB window) and CMF·256 + FLG is a multiple of 31.
    [Fact]
    public void The_packed_stream_is_zlib_as_rfc_1950_defines_it()
    {
        byte[] packed = PixelPack.Encode([[1, 2, 3]]);
        packed[0].Should().Be(0x78);
        ((packed[0] * 256 + packed[1]) % 31).Should().Be(0);
    }

    [Fact]
    public void Planes_read_back_exactly_whatever_their_values()
    {
        var random = new Random(1234);
        int[][] planes = Enumerable.Range(0, 4).Select(p => Enumerable.Range(0, 500).Select(i => p switch
        {
            0 => random.Next(0, 40),
            1 => random.Next(int.MinValue, int.MaxValue),
            2 => unchecked((int)uint.MaxValue) - i,
            _ => i % 7 == 0 ? int.MinValue : int.MaxValue,
        }).ToArray()).ToArray();

        int[][] back = PixelPack.Decode(PixelPack.Encode(planes), planes.Length, 500);

        for (int p = 0; p < planes.Length; p++)
            back[p].Should().Equal(planes[p], $"plane {p}");
    }

    [Fact]
    public void Hit_planes_carry_every_field_with_t_as_float32_bits()
    {
        PixelHit[] hits =
        [
            new() { Hit = true, Face = HitFace.PosY, Material = 7, X = 3, Y = -4, Z = 100000, T = 12.375f },
            default,
        ];

        List<int[]> planes = PixelPack.HitPlaneValues(hits);

        planes.Should().HaveCount(PixelPack.HitPlanes.Count);
        planes.Select(p => p[0]).Should().Equal(1, (int)HitFace.PosY, 7, 3, -4, 100000, BitConverter.SingleToInt32Bits(12.375f));
        planes.Select(p => p[1]).Should().OnlyContain(v => v == 0);
    }

    [Fact]
    public void Identical_hits_are_recognised_and_a_changed_t_is_not()
    {
        var data = PixelData.From(TestRuns.Small().Results[0]);
        PixelHit[] copy = (PixelHit[])data.Hits.Clone();
        PixelPack.SameHits(data.Hits, copy).Should().BeTrue();
        copy[0].T += 0.5f;
        PixelPack.SameHits(data.Hits, copy).Should().BeFalse();
    }
}
