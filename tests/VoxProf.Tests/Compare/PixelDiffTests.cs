using VoxProf.Core.Traversal;
using VoxProf.Reports.Compare;

namespace VoxProf.Tests.Compare;

public class PixelDiffTests
{
    [Fact]
    public void Difference_is_candidate_minus_base_per_pixel_even_across_the_full_uint_range()
    {
        uint[] a = [5, 10, 0, uint.MaxValue, 7];
        uint[] b = [5, 12, uint.MaxValue, 0, 3];
        var diff = new long[5];

        var summary = PixelDiff.Subtract(a, b, diff);

        diff.Should().Equal(0, 2, uint.MaxValue, -(long)uint.MaxValue, -4);
        summary.Should().Be(new PixelDiffSummary(-(long)uint.MaxValue, uint.MaxValue, uint.MaxValue, 4));
    }

    [Fact]
    public void Identical_buffers_give_a_zero_image_that_normalises_to_zero()
    {
        uint[] a = [1, 2, 3];
        var diff = new long[3];

        var summary = PixelDiff.Subtract(a, a, diff);

        summary.ChangedPixels.Should().Be(0);
        summary.MaxAbs.Should().Be(0);
        diff.Select(d => PixelDiff.Normalize(d, summary.MaxAbs)).Should().OnlyContain(t => t == 0);
    }

    [Fact]
    public void The_scale_is_symmetric_about_zero()
    {
        PixelDiff.Normalize(-5, 10).Should().Be(-PixelDiff.Normalize(5, 10));
        PixelDiff.Normalize(10, 10).Should().Be(1);
        PixelDiff.Normalize(-10, 10).Should().Be(-1);
    }

    [Fact]
    public void Buffers_of_different_lengths_are_refused()
    {
        var act = () => PixelDiff.Subtract(new uint[3], new uint[4], new long[3]);

        act.Should().Throw<ArgumentException>();
    }

    [Fact]
    public void A_hit_changes_when_it_becomes_a_miss_or_lands_on_another_voxel()
    {
        PixelHit[] a = [Hit(1, 2, 3), Hit(1, 2, 3), Hit(1, 2, 3), default, default];
        PixelHit[] b = [Hit(1, 2, 3) with { T = 9 }, Hit(1, 2, 4), default, Hit(0, 0, 0), default];
        var changed = new bool[5];

        var count = PixelDiff.HitChanged(a, b, changed);

        changed.Should().Equal(false, true, true, true, false);
        count.Should().Be(3);
    }

    private static PixelHit Hit(int x, int y, int z) => new() { Hit = true, X = x, Y = y, Z = z, T = 1 };
}
