using FluentAssertions;
using VoxProf.Core;
using VoxProf.Core.Traversal;
using Xunit;

namespace VoxProf.Tests.Traversal;

/// <summary>
/// A run of large arrays is as many separate arrays as asked for, each of the length asked for, pinned when asked: how
/// their memory is mapped must not show in what they hold.
/// </summary>
public sealed class LargeArrayRunTests
{
    [Theory]
    [InlineData(5, 921_600, false)] // five counter buffers at 1280×720: 18 MB, advised as one run
    [InlineData(3, 1_000, false)] // too small to advise
    [InlineData(2, 400_000, true)]
    public void A_run_is_separate_arrays_of_the_length_asked_for_each_holding_its_own_values(int count, int length, bool pinned)
    {
        uint[][] run = LargeArrays.Run<uint>(count, length, pinned);

        run.Should().HaveCount(count).And.OnlyContain(a => a.Length == length);
        run.Distinct().Should().HaveCount(count, "no two arrays may share memory");
        for (int i = 0; i < count; i++)
            run[i].AsSpan().Fill((uint)(i + 1));
        for (int i = 0; i < count; i++)
            run[i].Should().OnlyContain(v => v == (uint)(i + 1), $"array {i} keeps its own values");
    }

    [Fact]
    public void Hit_records_in_a_run_keep_every_field()
    {
        PixelHit[][] run = LargeArrays.Run<PixelHit>(2, 500_000, pinned: true);
        var hit = new PixelHit { Hit = true, X = 3, Y = -4, Z = 5, T = 0.25, Material = 7, Face = HitFace.NegY };
        run[0].AsSpan().Fill(hit);
        run[1].AsSpan().Clear();
        run[0].Should().OnlyContain(h => h.Equals(hit));
        run[1].Should().OnlyContain(h => !h.Hit && h.X == 0 && h.T == 0);
    }
}
